"use client";
import { useEffect, useMemo, useRef, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { DEFAULTS, defaultScaleAccuracy, estimateSpecimen, EstimateInputError, type SpecimenEstimate, type SpecimenInput } from "@/lib/estimate";
import { FINENESS_PRESETS, HOST_PRESETS } from "@/lib/estimate/presets";
import { toGrams, convertMass, type MassUnit } from "@/lib/estimate/units";
import type { Scale, ScaleCheckRef } from "@/lib/entities/scale";
import { checkRefOf } from "@/lib/figures/scale-standing";
import { formatGrams, heldAtAnEnd, spreadText } from "@/lib/format";
import { EstimatePanel } from "./estimate-panel";
import { DEFAULT_WEIGH_FORM, emptyReadings, ENGINE_FIELD_TO_FORM, parseTyped, toSpecimenInput, type WeighField, type WeighFormValues } from "./form-model";
import { MethodChoice, PracticeList, ReadingsPair, ScaleSettings, WaterTemperature } from "./rig-fields";
import { FailedCheckNotice, ScalePicker } from "./scale-picker";
import { CLAIM_PRESET, type ClaimGold } from "@/lib/figures/claim-gold";

type Props = {
  initial?: Partial<WeighFormValues>;
  /** The find's claim's gold profile, offered (and chosen first) as the host rock and the fineness. */
  claim?: ClaimGold | null;
  /** The member's scale profiles to weigh on (none on the open weigh page). */
  scales?: Scale[];
  /** Where the flow is part of a find, the finished weigh-in is handed here, with the scale it was made on. */
  onSave?: (input: SpecimenInput, estimate: SpecimenEstimate, scale: { scaleId: string | null; scaleCheck: ScaleCheckRef | null }) => void | Promise<void>;
  /** Where the flow is part of a find: leave it without saving. */
  onCancel?: () => void;
};

type Outcome = {
  input: SpecimenInput;
  estimate?: SpecimenEstimate;
  /** Fine gold for these readings with and without the air-buoyancy correction. */
  airEffect?: AirEffect;
  errors: Partial<Record<WeighField, string>>;
};

function compute(values: WeighFormValues, claim: ClaimGold | null): Outcome {
  const { input, errors, complete } = toSpecimenInput(values, claim);
  if (!complete) return { input, errors };
  try {
    const estimate = estimateSpecimen(input);
    return { input, errors, estimate, airEffect: airBuoyancyEffect(input, estimate) };
  } catch (error) {
    if (error instanceof EstimateInputError) return { input, errors: { ...errors, [ENGINE_FIELD_TO_FORM[error.field] ?? "water"]: error.message } };
    throw error;
  }
}

type AirEffect = { correctedGrams: number; textbookGrams: number };

/** What the air-buoyancy correction changes for these readings: fine gold with it and without it. */
function airBuoyancyEffect(input: SpecimenInput, estimate: SpecimenEstimate): AirEffect | undefined {
  const on = estimate.assumptions.airBuoyancyCorrection;
  let other: SpecimenEstimate;
  try {
    other = estimateSpecimen({ ...input, airBuoyancyCorrection: !on });
  } catch (error) {
    // The other figure can be refused at an edge (denser than gold one way only): then say nothing.
    if (error instanceof EstimateInputError) return undefined;
    throw error;
  }
  const [corrected, textbook] = on ? [estimate, other] : [other, estimate];
  return { correctedGrams: corrected.fineGoldGrams, textbookGrams: textbook.fineGoldGrams };
}

/** The bar's second line: the ± alone, as room allows; the worst case where a ± means nothing (see spreadText). */
function barSpread(e: SpecimenEstimate, unit: MassUnit): string {
  const u = e.standardUncertainty.fineGoldGrams;
  const show = (g: number) => formatGrams(g, unit, u);
  const held = heldAtAnEnd(e);
  return held || e.range.fineGoldGrams[1] <= 0 ? spreadText(u, e.range.fineGoldGrams, show, held) : `± ${show(u)}`;
}

function airEffectText({ correctedGrams, textbookGrams }: AirEffect, unit: MassUnit): string {
  const effectGrams = correctedGrams - textbookGrams;
  const sign = effectGrams > 0 ? "+" : effectGrams < 0 ? "−" : "±";
  const percent = textbookGrams > 0 ? ` (${sign}${Math.abs((effectGrams / textbookGrams) * 100).toFixed(1)} %)` : "";
  return `For these readings it changes the fine gold by ${sign}${formatGrams(Math.abs(effectGrams), unit, Math.abs(effectGrams) / 10)}${percent}.`;
}

/** The weigh-in: readings in, the estimate out, recomputed as each number is typed. */
export function WeighInFlow({ initial, claim = null, scales = [], onSave, onCancel }: Props) {
  const fromClaim = claim ? { hostPreset: CLAIM_PRESET, finenessPreset: CLAIM_PRESET } : {};
  const { register, control, setValue } = useForm<WeighFormValues>({ defaultValues: { ...DEFAULT_WEIGH_FORM, ...initial, ...fromClaim } });
  const values = useWatch({ control }) as WeighFormValues;
  const outcome = useMemo(() => compute(values, claim), [values, claim]);
  const [resultUnit, setResultUnit] = useState<MassUnit>("g");
  const [saving, setSaving] = useState(false);
  const [confirmClear, setConfirmClear] = useState(false);
  const readingsRef = useRef<HTMLDivElement>(null);
  // Inside a find, the flow opens at its readings: the method and practice are above them.
  useEffect(() => {
    if (onSave) readingsRef.current?.scrollIntoView?.({ block: "start" });
  }, []); // eslint-disable-line react-hooks/exhaustive-deps
  const typed = [...(values.air ?? []), ...(values.water ?? [])].some((r) => (r?.value ?? "").trim() !== "");
  const save = async () => {
    if (!onSave || !outcome.estimate) return;
    setSaving(true);
    try {
      await onSave(outcome.input, outcome.estimate, { scaleId: scale?.id ?? null, scaleCheck: checkRefOf(scale) });
    } finally {
      setSaving(false);
    }
  };

  const hanging = values.method === "hanging";
  const scale = scales.find((x) => x.id === values.scaleId);
  const unit = values.readingUnit;
  const e = outcome.errors;
  const step = parseTyped(values.resolution);
  const accuracyHint = step !== undefined && step > 0 ? `± ${Number(convertMass(defaultScaleAccuracy(toGrams(step, unit)), unit).toPrecision(2))}` : "";

  return (
    <div className="grid gap-4 lg:grid-cols-[1fr_minmax(320px,420px)]">
      <form className="flex flex-col gap-5" onSubmit={(ev) => ev.preventDefault()} noValidate aria-label="Weigh-in">
        <MethodChoice register={register} method={values.method} />
        <PracticeList />

        <div ref={readingsRef} className="sheet flex scroll-mt-4 flex-col gap-4">
          {scales.length > 0 && <ScalePicker scales={scales} register={register} setValue={setValue} scaleId={values.scaleId} unit={unit} />}
          <ScaleSettings register={register} errors={e} accuracyHint={accuracyHint} locked={!!scale} />
          <ReadingsPair register={register} control={control} errors={e} hanging={hanging} unit={unit} />
        </div>

        <WaterTemperature register={register} errors={e} />

        <div className="sheet flex flex-col gap-3">
          <label className="flex flex-col">
            <span className="field-label">Host rock</span>
            <select className="field-input" aria-invalid={!!e.hostDensity} {...register("hostPreset")}>
              {claim && (
                <option value={CLAIM_PRESET}>
                  {claim.name}&apos;s rock — {claim.hostDensity} ({claim.hostRange[0]}–{claim.hostRange[1]}) g/cm³
                </option>
              )}
              {HOST_PRESETS.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.label} — {p.density} ({p.range[0]}–{p.range[1]}) g/cm³
                </option>
              ))}
              <option value="custom">My own density…</option>
            </select>
          </label>
          {values.hostPreset === "custom" && (
            <div className="grid grid-cols-2 gap-2">
              <label className="flex flex-col text-sm">
                <span className="font-bold">Density g/cm³</span>
                <input inputMode="decimal" className="field-input figure" {...register("hostDensity")} />
              </label>
              <label className="flex flex-col text-sm">
                <span className="font-bold">give or take</span>
                <input inputMode="decimal" className="field-input figure" placeholder={`± ${DEFAULTS.hostRelativeSpan * 100} %`} {...register("hostSpread")} />
              </label>
            </div>
          )}
          {e.hostDensity && <p className="field-error">{e.hostDensity}</p>}

          <label className="flex flex-col">
            <span className="field-label">Gold fineness</span>
            <select className="field-input" aria-invalid={!!e.fineness} {...register("finenessPreset")}>
              {claim && (
                <option value={CLAIM_PRESET}>
                  {claim.name}&apos;s gold — {claim.fineness} ‰ ({claim.finenessRange[0]}–{claim.finenessRange[1]})
                </option>
              )}
              {FINENESS_PRESETS.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.label} — {p.fineness} ‰ ({p.range[0]}–{p.range[1]})
                </option>
              ))}
              <option value="assayed">Assayed value…</option>
              <option value="custom">My own range…</option>
            </select>
          </label>
          {(values.finenessPreset === "assayed" || values.finenessPreset === "custom") && (
            <div className="grid grid-cols-2 gap-2">
              <label className="flex flex-col text-sm">
                <span className="font-bold">Fineness ‰</span>
                <input inputMode="decimal" className="field-input figure" {...register("fineness")} />
              </label>
              {values.finenessPreset === "custom" && (
                <label className="flex flex-col text-sm">
                  <span className="font-bold">give or take ‰</span>
                  <input inputMode="decimal" className="field-input figure" {...register("finenessSpread")} />
                </label>
              )}
            </div>
          )}
          {e.fineness && <p className="field-error">{e.fineness}</p>}
          <label className="flex min-h-touch items-center gap-2 text-sm">
            <input type="checkbox" className="h-5 w-5" aria-describedby="air-buoyancy-hint" {...register("airBuoyancy")} />
            Correct for the air&apos;s buoyancy (OIML D 28)
          </label>
          <p id="air-buoyancy-hint" className="text-sm text-ink-soft" data-testid="air-buoyancy-hint">
            In air the scale reads a little light, by the weight of the air the specimen pushes aside, while the host densities are true densities. Left off,
            you get the textbook figure, which always makes the specimen look denser and so flatters the gold: a fraction of a per cent on a rich piece, several
            per cent at low grade.
            {outcome.airEffect && ` ${airEffectText(outcome.airEffect, resultUnit)}`}
          </p>
        </div>
      </form>

      {outcome.estimate && (
        <div
          className="sheet held-at-bottom sticky bottom-[calc(var(--tab-bar-room,0px)_+_0.5rem)] z-10 flex items-center justify-between gap-2 shadow-lg lg:hidden"
          data-testid="estimate-bar"
        >
          {/* Named by its words (the figure a member reads, or says to voice control), with where it goes added for a screen reader. */}
          <a href="#estimate-title" className="figure flex flex-col font-bold no-underline">
            <span>Fine gold ≈ {formatGrams(outcome.estimate.fineGoldGrams, resultUnit, outcome.estimate.standardUncertainty.fineGoldGrams)}</span>
            <span className="text-sm text-ink-soft" data-testid="estimate-bar-spread">
              {barSpread(outcome.estimate, resultUnit)}
            </span>
            <span className="sr-only">: the whole estimate</span>
          </a>
          {onSave && (
            <button type="button" className="btn btn-primary shrink-0" disabled={saving} onClick={save}>
              {saving ? "Saving…" : "Save"}
            </button>
          )}
        </div>
      )}
      <div id="estimate" className="flex flex-col gap-3 lg:sticky lg:top-4 lg:self-start">
        {scale && <FailedCheckNotice scale={scale} />}
        {outcome.estimate ? (
          <EstimatePanel estimate={outcome.estimate} unit={resultUnit} onUnitChange={setResultUnit} />
        ) : (
          <section className="sheet" aria-live="polite" data-testid="estimate-waiting">
            <h2 className="heading-bar mb-2 text-lg">Estimate</h2>
            <p>Enter the reading in air and the reading in water; the estimate appears as you type.</p>
          </section>
        )}
        {onSave && outcome.estimate && (
          <button type="button" className="btn btn-primary" disabled={saving} onClick={save}>
            {saving ? "Saving…" : "Save this weigh-in to the find"}
          </button>
        )}
        {confirmClear ? (
          <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Clear the readings?">
            <span className="font-bold">Clear every reading typed?</span>
            <button
              type="button"
              className="btn"
              onClick={() => {
                setValue("air", emptyReadings());
                setValue("water", emptyReadings());
                setConfirmClear(false);
              }}
            >
              Yes, clear them
            </button>
            <button type="button" className="btn" onClick={() => setConfirmClear(false)}>
              Keep them
            </button>
          </div>
        ) : (
          <button type="button" className="btn" disabled={!typed} onClick={() => setConfirmClear(true)}>
            Clear the readings
          </button>
        )}
        {onCancel && (
          <button type="button" className="btn" onClick={onCancel}>
            Cancel this weigh-in
          </button>
        )}
      </div>
    </div>
  );
}
