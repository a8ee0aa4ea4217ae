"use client";
import type { Control, FieldErrors, UseFormRegister } from "react-hook-form";
import { MASS_UNIT_LABELS, MASS_UNITS } from "@/lib/estimate/units";
import type { WeighField, WeighFormValues } from "./form-model";
import { ReadingsField } from "./readings-field";

// The parts of a hydrostatic weighing every flow shares: the specimen's weigh-in, the setup
// check of a scale and a barren-rock piece are read on the same rig in the same way.

type Errors = Partial<Record<WeighField, string>>;
type Reg = UseFormRegister<WeighFormValues>;

export const PRACTICE = [
  "Dry the specimen before the reading in air.",
  "Wet the line, then tare with it already under water.",
  "Hang the specimen free of the walls and the bottom.",
  "Brush off air bubbles clinging to it.",
  "Soak a porous or vuggy specimen until the in-water reading stops moving, and use the settled reading.",
  "Take three readings of each weighing: their spread shows in the estimate.",
  "Measure the water's temperature.",
];

export function MethodChoice({ register, method }: { register: Reg; method: WeighFormValues["method"] }) {
  return (
    <fieldset className="sheet flex flex-col gap-2">
      <legend className="sr-only">How is it weighed?</legend>
      <p className="field-label">How is it weighed?</p>
      <div className="grid gap-2 sm:grid-cols-2">
        {(
          [
            ["hanging", "Hung from the scale", "The scale carries the line; the reading with the specimen under water is its weight in water."],
            [
              "buoyancy",
              "Vessel on the scale",
              "The water vessel sits on the tared scale and the specimen hangs into it from a stand; the reading is the water it pushes aside.",
            ],
          ] as const
        ).map(([value, title, text]) => (
          <label key={value} className={`flex cursor-pointer gap-3 rounded-md border-2 p-3 ${method === value ? "border-ochre" : "border-rule"}`}>
            <input type="radio" value={value} className="mt-1 h-5 w-5 accent-[var(--ochre)]" {...register("method")} />
            <span>
              <span className="block font-bold">{title}</span>
              <span className="block text-sm text-ink-soft">{text}</span>
            </span>
          </label>
        ))}
      </div>
    </fieldset>
  );
}

export function PracticeList({ items = PRACTICE }: { items?: string[] }) {
  return (
    <details className="sheet" open>
      <summary className="cursor-pointer font-bold">Good practice before you read the scale</summary>
      <ul className="mt-2 list-disc pl-5 text-sm">
        {items.map((p) => (
          <li key={p}>{p}</li>
        ))}
      </ul>
    </details>
  );
}

/** The unit the scale reads in, and its step and accuracy (left out where a scale profile gives them). */
export function ScaleSettings({ register, errors, accuracyHint, locked }: { register: Reg; errors: Errors; accuracyHint: string; locked?: boolean }) {
  return (
    <>
      <div className="flex flex-wrap gap-3">
        <label className="flex flex-col">
          <span className="field-label">Scale reads in</span>
          <select className="field-input w-auto" {...register("readingUnit")}>
            {MASS_UNITS.map((u) => (
              <option key={u} value={u}>
                {MASS_UNIT_LABELS[u]}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col">
          <span className="field-label">Scale step</span>
          <input inputMode="decimal" className="field-input figure w-28" readOnly={locked} aria-invalid={!!errors.resolution} {...register("resolution")} />
        </label>
        <label className="flex flex-col">
          <span className="field-label">Accuracy ±</span>
          <input
            inputMode="decimal"
            className="field-input figure w-28"
            readOnly={locked}
            placeholder={accuracyHint}
            aria-invalid={!!errors.accuracy}
            aria-describedby="accuracy-hint"
            {...register("accuracy")}
          />
        </label>
      </div>
      <p id="accuracy-hint" className="text-sm text-ink-soft">
        How far one reading may be off, from your scale&apos;s specification (repeatability and linearity). Left blank: {accuracyHint || "a default"} for this
        step.
      </p>
      {(errors.resolution || errors.accuracy) && <p className="field-error">{errors.resolution ?? errors.accuracy}</p>}
    </>
  );
}

export function ReadingsPair({
  register,
  control,
  errors,
  hanging,
  unit,
  what = "specimen",
}: {
  register: Reg;
  control: Control<WeighFormValues>;
  errors: Errors;
  hanging: boolean;
  unit: string;
  what?: string;
}) {
  return (
    <>
      <ReadingsField
        name="air"
        label="Dry, in air"
        hint={`The ${what} alone on the scale.`}
        unit={unit}
        error={errors.air}
        control={control}
        register={register}
      />
      <ReadingsField
        name="water"
        label={hanging ? "Hung under water" : "Vessel reading with it hung inside"}
        hint={
          hanging
            ? `Tare with the wet line under water first, then hang the ${what} from it.`
            : `Tare the vessel with the line already in the water, then lower the ${what} in.`
        }
        unit={unit}
        error={errors.water}
        control={control}
        register={register}
      />
    </>
  );
}

export function WaterTemperature({ register, errors }: { register: Reg; errors: Errors }) {
  return (
    <div className="sheet flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col">
          <span className="field-label">Water temperature</span>
          <input inputMode="decimal" className="field-input figure w-28" aria-invalid={!!errors.temp} {...register("temp")} />
        </label>
        <label className="flex flex-col">
          <span className="sr-only">Temperature unit</span>
          <select className="field-input w-auto" {...register("tempUnit")}>
            <option value="C">°C</option>
            <option value="F">°F</option>
          </select>
        </label>
        <label className="flex flex-col">
          <span className="field-label">give or take</span>
          <input inputMode="decimal" className="field-input figure w-24" {...register("tempTolerance")} />
        </label>
      </div>
      {(errors.temp || errors.tempTolerance) && <p className="field-error">{errors.temp ?? errors.tempTolerance}</p>}
    </div>
  );
}

export type { FieldErrors };
