"use client";
import { useMemo, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import type { Scale, ScaleCheckRef } from "@/lib/entities/scale";
import { defaultScaleAccuracy } from "@/lib/estimate/defaults";
import { measureDensity, type DensityInput } from "@/lib/estimate/setup-check";
import { convertMass, toGrams } from "@/lib/estimate/units";
import { checkRefOf } from "@/lib/figures/scale-standing";
import { parseTyped } from "@/lib/parse-number";
import { toDensityInput, withFieldErrors } from "./density-input";
import { DEFAULT_WEIGH_FORM, emptyReadings, type WeighFormValues } from "./form-model";
import { MethodChoice, PracticeList, ReadingsPair, ScaleSettings, WaterTemperature } from "./rig-fields";
import { FailedCheckNotice, ScalePicker } from "./scale-picker";

const BARREN_PRACTICE = [
  "Choose pieces of the vein with no visible gold or sulphides, each at least the size of a walnut.",
  "Dry the piece before the reading in air.",
  "Wet the line, then tare with it already under water.",
  "Soak a porous piece until the in-water reading stops moving, and use the settled reading.",
  "Measure the water's temperature.",
];

export type BarrenPiece = { input: DensityInput; density: number; scaleId: string | null; scaleCheck: ScaleCheckRef | null };

/** One piece of barren rock weighed as a specimen is, its density by the engine; pieces follow one another. */
export function BarrenRockFlow({
  scales,
  initial,
  onSave,
}: {
  scales: Scale[];
  initial?: Partial<WeighFormValues>;
  onSave: (piece: BarrenPiece) => void | Promise<void>;
}) {
  const { register, control, setValue } = useForm<WeighFormValues>({ defaultValues: { ...DEFAULT_WEIGH_FORM, ...initial } });
  const values = useWatch({ control }) as WeighFormValues;
  const [saving, setSaving] = useState(false);
  const form = useMemo(() => toDensityInput(values), [values]);
  const outcome = useMemo(() => (form.complete ? withFieldErrors(() => measureDensity(form.input), form.errors) : { errors: form.errors }), [form]);
  const scale = scales.find((s) => s.id === values.scaleId);
  const step = parseTyped(values.resolution);
  const accuracyHint =
    step !== undefined && step > 0
      ? `± ${Number(convertMass(defaultScaleAccuracy(toGrams(step, values.readingUnit)), values.readingUnit).toPrecision(2))}`
      : "";
  const e = outcome.errors;
  return (
    <div className="flex flex-col gap-4" data-testid="barren-rock-flow">
      <MethodChoice register={register} method={values.method} />
      <PracticeList items={BARREN_PRACTICE} />
      <div className="sheet flex flex-col gap-4">
        {scales.length > 0 && <ScalePicker scales={scales} register={register} setValue={setValue} scaleId={values.scaleId} unit={values.readingUnit} />}
        <ScaleSettings register={register} errors={e} accuracyHint={accuracyHint} locked={!!scale} />
        <ReadingsPair register={register} control={control} errors={e} hanging={values.method === "hanging"} unit={values.readingUnit} what="piece" />
      </div>
      <WaterTemperature register={register} errors={e} />
      {scale && <FailedCheckNotice scale={scale} />}
      {outcome.value ? (
        <section className="sheet flex flex-col gap-2" aria-live="polite">
          <p className="figure text-lg">
            This piece: <strong data-testid="piece-density">{outcome.value.density.toFixed(3)}</strong> ± {outcome.value.standardUncertainty.toFixed(3)} g/cm³
          </p>
          <button
            type="button"
            className="btn btn-primary self-start"
            disabled={saving}
            onClick={async () => {
              setSaving(true);
              try {
                await onSave({ input: form.input, density: outcome.value!.density, scaleId: scale?.id ?? null, scaleCheck: checkRefOf(scale) });
                setValue("air", emptyReadings());
                setValue("water", emptyReadings());
              } finally {
                setSaving(false);
              }
            }}
          >
            {saving ? "Saving…" : "Save this piece"}
          </button>
        </section>
      ) : (
        <p className="sheet text-ink-soft">Enter the reading in air and the reading in water; the piece&apos;s density appears as you type.</p>
      )}
    </div>
  );
}
