import { EstimateInputError } from "@/lib/estimate/errors";
import type { DensityInput } from "@/lib/estimate/setup-check";
import { ENGINE_FIELD_TO_FORM, toSpecimenInput, type WeighField, type WeighFormValues } from "./form-model";

export type DensityForm = { input: DensityInput; errors: Partial<Record<WeighField, string>>; complete: boolean };

/** The rig and readings of the form, for a density of its own (a setup check, a barren-rock piece): no host or gold. */
export function toDensityInput(values: WeighFormValues): DensityForm {
  const { input, errors } = toSpecimenInput(values);
  const { method, airGrams, waterGrams, scaleResolutionGrams, scaleAccuracyGrams, waterTempC, waterTempToleranceC, airBuoyancyCorrection } = input;
  const density: DensityInput = {
    method,
    airGrams,
    waterGrams,
    scaleResolutionGrams,
    scaleAccuracyGrams,
    waterTempC,
    waterTempToleranceC,
    airBuoyancyCorrection,
  };
  // Host and fineness play no part here.
  const { hostDensity: _h, fineness: _f, ...rigErrors } = errors;
  for (const k of Object.keys(density) as (keyof DensityInput)[]) if (density[k] === undefined) delete density[k];
  return { input: density, errors: rigErrors, complete: airGrams.length > 0 && waterGrams.length > 0 && Object.keys(rigErrors).length === 0 };
}

/** Runs an engine step, turning its refusal into a message on the form's field. */
export function withFieldErrors<T>(run: () => T, errors: Partial<Record<WeighField, string>>): { value?: T; errors: Partial<Record<WeighField, string>> } {
  try {
    return { value: run(), errors };
  } catch (error) {
    if (error instanceof EstimateInputError) return { errors: { ...errors, [ENGINE_FIELD_TO_FORM[error.field] ?? "water"]: error.message } };
    throw error;
  }
}
