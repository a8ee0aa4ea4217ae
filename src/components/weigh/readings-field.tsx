"use client";
import { useFieldArray, type Control, type UseFormRegister } from "react-hook-form";
import type { WeighFormValues } from "./form-model";

type Props = {
  name: "air" | "water";
  label: string;
  hint: string;
  unit: string;
  error?: string;
  control: Control<WeighFormValues>;
  register: UseFormRegister<WeighFormValues>;
};

/** One or more repeat readings of the same weighing; the engine uses their mean. */
export function ReadingsField({ name, label, hint, unit, error, control, register }: Props) {
  const { fields, append, remove } = useFieldArray({ control, name });
  const errorId = `${name}-error`;
  return (
    <fieldset className="flex flex-col gap-2">
      <legend className="field-label">{label}</legend>
      <p className="text-sm text-ink-soft">{hint}</p>
      {fields.map((field, index) => (
        <div key={field.id} className="flex items-center gap-2">
          <label className="sr-only" htmlFor={`${name}-${index}`}>
            {label}, reading {index + 1}
          </label>
          <input
            id={`${name}-${index}`}
            inputMode="decimal"
            autoComplete="off"
            className="field-input figure text-lg"
            aria-invalid={!!error}
            aria-describedby={error ? errorId : undefined}
            {...register(`${name}.${index}.value` as const)}
          />
          <span className="w-10 shrink-0 font-bold">{unit}</span>
          {fields.length > 1 && (
            <button type="button" className="btn px-3" aria-label={`Remove reading ${index + 1}`} onClick={() => remove(index)}>
              ✕
            </button>
          )}
        </div>
      ))}
      {error && (
        <p id={errorId} className="field-error">
          {error}
        </p>
      )}
      {fields.length < 10 && (
        <button type="button" className="btn self-start" onClick={() => append({ value: "" })}>
          Add a repeat reading
        </button>
      )}
    </fieldset>
  );
}
