"use client";
import { useMemo, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { v7 as uuidv7 } from "uuid";
import type { Scale, SetupCheck } from "@/lib/entities/scale";
import { REFERENCE_OBJECTS, OWN_REFERENCE } from "@/lib/estimate/reference-objects";
import { CHECK_COVERAGE, judgeSetupCheck, type SetupCheckResult } from "@/lib/estimate/setup-check";
import { defaultScaleAccuracy } from "@/lib/estimate/defaults";
import { parseTyped } from "@/lib/parse-number";
import { toDensityInput, withFieldErrors } from "./density-input";
import { DEFAULT_WEIGH_FORM, type WeighFormValues } from "./form-model";
import { MethodChoice, PracticeList, ReadingsPair, WaterTemperature } from "./rig-fields";

type CheckForm = WeighFormValues & { reference: string; ownDensity: string; ownUncertainty: string };

const CHECK_PRACTICE = [
  "Use a solid, clean object: a machined or drawn metal slug, a coin, a clear crystal. Cast metal can hold pores.",
  "Wet the line, then tare with it already under water; weigh exactly as you weigh specimens.",
  "Hang the object free of the walls and the bottom, and brush off bubbles.",
  "Measure the water's temperature.",
];

const g3 = (v: number) => v.toFixed(3);
const signed = (v: number, digits: number) => `${v >= 0 ? "+" : "−"}${Math.abs(v).toFixed(digits)}`;

/** The verdict in the member's words: whether the rig reads true, and how far off it is. */
export function CheckVerdict({ result }: { result: SetupCheckResult }) {
  return (
    <section
      className={`sheet flex flex-col gap-2 border-2 ${result.passed ? "border-moss" : "border-rust"}`}
      aria-live="polite"
      data-testid="check-verdict"
      data-passed={result.passed}
    >
      <h2 className={`text-lg font-bold ${result.passed ? "text-moss" : "text-rust"}`}>{result.passed ? "The rig reads true" : "The rig is off"}</h2>
      <p>
        Measured{" "}
        <span className="figure">
          <strong data-testid="check-measured">{g3(result.measuredDensity)}</strong> ± {g3(result.measuredUncertainty)} g/cm³
        </span>{" "}
        against the reference&apos;s{" "}
        <span className="figure">
          {g3(result.referenceDensity)} ± {g3(result.referenceUncertainty)}
        </span>
        .
      </p>
      <p className="font-bold" data-testid="check-off">
        Off by <span className="figure">{signed(result.difference, 3)} g/cm³</span> <span className="figure">({signed(result.differencePercent, 2)} %)</span>;
        expected error <span className="figure">± {g3(result.allowedDifference)} g/cm³</span>.
      </p>
      <p className="text-xs text-ink-soft">
        Expected error: {CHECK_COVERAGE} × the combined standard uncertainty of the measured density (from the readings, the scale&apos;s accuracy and the water
        temperature) and of the reference&apos;s density. A sound rig lands inside it about 19 times in 20.
      </p>
      {!result.passed && (
        <p className="text-sm">
          {result.difference > 0 ? "It reads dense: the in-water reading is heavy" : "It reads light: the in-water reading is light"} — look for the basket or
          line touching the cup, a line tared dry, bubbles, a drifting scale or a draft, then check again.
        </p>
      )}
      {result.coarse && (
        <p className="text-sm font-bold" data-testid="check-coarse">
          This check is coarse: its expected error is more than 2 % of the reference. A larger object or a finer scale proves more.
        </p>
      )}
    </section>
  );
}

/** A setup check of one scale: a reference object of known density weighed on the rig, judged by the engine. */
export function SetupCheckFlow({ scale, onSave }: { scale: Scale; onSave: (check: SetupCheck) => void | Promise<void> }) {
  const accuracy = scale.accuracyGrams ?? defaultScaleAccuracy(scale.stepGrams);
  const { register, control } = useForm<CheckForm>({
    defaultValues: {
      ...DEFAULT_WEIGH_FORM,
      resolution: String(scale.stepGrams),
      accuracy: String(accuracy),
      reference: REFERENCE_OBJECTS[0].id,
      ownDensity: "",
      ownUncertainty: "",
    },
  });
  const values = useWatch({ control }) as CheckForm;
  const [saving, setSaving] = useState(false);
  const preset = REFERENCE_OBJECTS.find((r) => r.id === values.reference);
  const reference = useMemo(() => {
    if (preset) return { kind: preset.id, label: preset.label, density: preset.density, uncertainty: preset.uncertainty };
    const density = parseTyped(values.ownDensity);
    const u = parseTyped(values.ownUncertainty);
    if (density === undefined || Number.isNaN(density)) return null;
    return { kind: OWN_REFERENCE as "own", label: "My own reference object", density, uncertainty: u !== undefined && !Number.isNaN(u) ? u : 0 };
  }, [preset, values.ownDensity, values.ownUncertainty]);
  const form = useMemo(() => toDensityInput({ ...values, readingUnit: "g", airBuoyancy: true }), [values]);
  const outcome = useMemo(() => {
    if (!form.complete || !reference) return { errors: form.errors };
    return withFieldErrors(() => judgeSetupCheck(form.input, reference), form.errors);
  }, [form, reference]);
  const e = outcome.errors;
  // The form's fields are WeighFormValues' own plus three; the shared parts take the form as that.
  const reg = register as unknown as Parameters<typeof MethodChoice>[0]["register"];
  const ctl = control as unknown as Parameters<typeof ReadingsPair>[0]["control"];

  return (
    <div className="flex flex-col gap-4" data-testid="setup-check">
      <p>
        Weigh an object whose density is known, exactly as you weigh specimens, on <strong>{scale.name}</strong> (step {scale.stepGrams} g, ± {accuracy} g a
        reading). Lodebook says whether the rig reads true within its expected error.
      </p>
      <label className="flex flex-col">
        <span className="field-label">Reference object</span>
        <select className="field-input" {...register("reference")}>
          {REFERENCE_OBJECTS.map((r) => (
            <option key={r.id} value={r.id}>
              {r.label} — {r.density} ± {r.uncertainty} g/cm³
            </option>
          ))}
          <option value={OWN_REFERENCE}>My own object, measured once…</option>
        </select>
      </label>
      {preset && <p className="text-xs text-ink-soft">{preset.source}</p>}
      {values.reference === OWN_REFERENCE && (
        <div className="grid grid-cols-2 gap-2">
          <label className="flex flex-col text-sm">
            <span className="font-bold">Its density g/cm³</span>
            <input inputMode="decimal" className="field-input figure" {...register("ownDensity")} />
          </label>
          <label className="flex flex-col text-sm">
            <span className="font-bold">± (one standard uncertainty)</span>
            <input inputMode="decimal" className="field-input figure" {...register("ownUncertainty")} />
          </label>
        </div>
      )}
      <MethodChoice register={reg} method={values.method} />
      <PracticeList items={CHECK_PRACTICE} />
      <div className="sheet flex flex-col gap-4">
        <ReadingsPair register={reg} control={ctl} errors={e} hanging={values.method === "hanging"} unit="g" what="object" />
      </div>
      <WaterTemperature register={reg} errors={e} />
      {outcome.value ? (
        <>
          <CheckVerdict result={outcome.value} />
          <button
            type="button"
            className="btn btn-primary self-start"
            disabled={saving}
            onClick={async () => {
              setSaving(true);
              try {
                await onSave({ id: uuidv7(), checkedAt: Date.now(), reference: reference!, input: form.input, result: outcome.value! });
              } finally {
                setSaving(false);
              }
            }}
          >
            {saving ? "Saving…" : `Save this check to ${scale.name}`}
          </button>
        </>
      ) : (
        <p className="sheet text-ink-soft" data-testid="check-waiting">
          Enter the reading in air and the reading in water{reference ? "" : ", and the object's density"}; the verdict appears as you type.
        </p>
      )}
    </div>
  );
}
