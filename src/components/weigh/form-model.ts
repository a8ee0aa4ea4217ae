import { DEFAULTS } from "@/lib/estimate/defaults";
import { ASSAY_HALF_RANGE, FINENESS_PRESETS, HOST_PRESETS } from "@/lib/estimate/presets";
import type { SpecimenInput } from "@/lib/estimate/types";
import { CLAIM_PRESET, type ClaimGold } from "@/lib/figures/claim-gold";
import { fahrenheitToCelsius, toGrams, type MassUnit } from "@/lib/estimate/units";
import { parseTyped } from "@/lib/parse-number";

export { parseTyped };

/** The weigh-in form as typed: strings, so half-typed numbers never jump about. */
export type WeighFormValues = {
  method: "hanging" | "buoyancy";
  /** The member's scale profile the readings are taken on ("" when none is named). */
  scaleId: string;
  readingUnit: MassUnit;
  air: { value: string }[];
  water: { value: string }[];
  resolution: string;
  /** The scale's stated accuracy (± a reading); blank takes the engine's default for the step. */
  accuracy: string;
  temp: string;
  tempUnit: "C" | "F";
  tempTolerance: string;
  hostPreset: string;
  hostDensity: string;
  /** Give or take, g/cm³: ranges are entered as a centre and a half-width, as the engine takes them. */
  hostSpread: string;
  finenessPreset: string;
  fineness: string;
  finenessSpread: string;
  airBuoyancy: boolean;
};

export type WeighField = "air" | "water" | "resolution" | "accuracy" | "temp" | "tempTolerance" | "hostDensity" | "fineness" | "method";

/** Three repeat readings to start with: their spread is part of the estimate's honesty. */
export const DEFAULT_REPEATS = 3;
const blankReadings = () => Array.from({ length: DEFAULT_REPEATS }, () => ({ value: "" }));

export const DEFAULT_WEIGH_FORM: WeighFormValues = {
  method: "hanging",
  scaleId: "",
  readingUnit: "g",
  air: blankReadings(),
  water: blankReadings(),
  resolution: String(DEFAULTS.scaleResolutionGrams),
  accuracy: "",
  temp: String(DEFAULTS.waterTempC),
  tempUnit: "C",
  tempTolerance: String(DEFAULTS.waterTempToleranceC),
  hostPreset: "quartz",
  hostDensity: "",
  hostSpread: "",
  finenessPreset: "natural",
  fineness: "",
  finenessSpread: "",
  airBuoyancy: true,
};

/** Fresh blank readings, for clearing the form. */
export function emptyReadings(): { value: string }[] {
  return blankReadings();
}

/** Maps the engine's field names back to the form's. */
export const ENGINE_FIELD_TO_FORM: Record<string, WeighField> = {
  method: "method",
  airGrams: "air",
  waterGrams: "water",
  scaleResolutionGrams: "resolution",
  scaleAccuracyGrams: "accuracy",
  waterTempC: "temp",
  waterTempToleranceC: "tempTolerance",
  hostDensity: "hostDensity",
  hostDensityRange: "hostDensity",
  finenessPermille: "fineness",
  finenessRangePermille: "fineness",
  goldDensity: "fineness",
};

export type FormResult = { input: SpecimenInput; errors: Partial<Record<WeighField, string>>; complete: boolean };

/** Turns what was typed into the engine's input, with a message per field that cannot be read. */
export function toSpecimenInput(v: WeighFormValues, claim: ClaimGold | null = null): FormResult {
  const errors: FormResult["errors"] = {};
  const unit = v.readingUnit;
  const readings = (list: { value: string }[], field: "air" | "water") => {
    const out: number[] = [];
    for (const r of list) {
      const n = parseTyped(r.value);
      if (n === undefined) continue;
      if (Number.isNaN(n)) errors[field] = "Type a number, like 12.34.";
      else out.push(toGrams(n, unit));
    }
    return out;
  };
  const airGrams = readings(v.air, "air");
  const waterGrams = readings(v.water, "water");

  const num = (text: string, field: WeighField, label: string) => {
    const n = parseTyped(text);
    if (n !== undefined && Number.isNaN(n)) errors[field] = `${label}: type a number.`;
    return n !== undefined && !Number.isNaN(n) ? n : undefined;
  };

  const resolution = num(v.resolution, "resolution", "Scale step");
  const accuracy = num(v.accuracy, "accuracy", "Scale accuracy");
  const tempRaw = num(v.temp, "temp", "Temperature");
  const tolRaw = num(v.tempTolerance, "tempTolerance", "Tolerance");
  const input: SpecimenInput = {
    method: v.method,
    airGrams,
    waterGrams,
    scaleResolutionGrams: resolution !== undefined ? toGrams(resolution, unit) : undefined,
    scaleAccuracyGrams: accuracy !== undefined ? toGrams(accuracy, unit) : undefined,
    waterTempC: tempRaw === undefined ? undefined : v.tempUnit === "F" ? fahrenheitToCelsius(tempRaw) : tempRaw,
    waterTempToleranceC: tolRaw === undefined ? undefined : v.tempUnit === "F" ? (tolRaw * 5) / 9 : tolRaw,
    airBuoyancyCorrection: v.airBuoyancy,
  };

  const host = HOST_PRESETS.find((p) => p.id === v.hostPreset);
  if (v.hostPreset === CLAIM_PRESET && claim) {
    input.hostDensity = claim.hostDensity;
    input.hostDensityRange = claim.hostRange;
  } else if (host) {
    input.hostDensity = host.density;
    input.hostDensityRange = host.range;
  } else {
    const d = num(v.hostDensity, "hostDensity", "Host density");
    const spread = num(v.hostSpread, "hostDensity", "Host density, give or take");
    if (d === undefined) errors.hostDensity ??= "Enter the host rock's density in g/cm³.";
    input.hostDensity = d;
    if (d !== undefined && spread !== undefined) input.hostDensityRange = [d - spread, d + spread];
  }

  const preset = FINENESS_PRESETS.find((p) => p.id === v.finenessPreset);
  if (v.finenessPreset === CLAIM_PRESET && claim) {
    input.finenessPermille = claim.fineness;
    input.finenessRangePermille = claim.finenessRange;
  } else if (preset) {
    input.finenessPermille = preset.fineness;
    input.finenessRangePermille = preset.range;
  } else {
    const f = num(v.fineness, "fineness", "Fineness");
    if (f === undefined) errors.fineness ??= "Enter the fineness in parts per thousand (‰).";
    input.finenessPermille = f;
    if (v.finenessPreset === "assayed" && f !== undefined) {
      // ± the assay's half-range, narrowed alike on both sides at 1000 ‰ so the assay stays the centre.
      const half = Math.max(0, Math.min(ASSAY_HALF_RANGE, 1000 - f, f - 1));
      input.finenessRangePermille = [f - half, f + half];
    } else {
      const spread = num(v.finenessSpread, "fineness", "Fineness, give or take");
      if (f !== undefined && spread !== undefined) {
        if (f + spread > 1000 || f - spread <= 0) errors.fineness ??= `${f} ‰ give or take ${spread} goes past 0–1000 ‰: narrow it.`;
        else input.finenessRangePermille = [f - spread, f + spread];
      }
    }
  }

  const complete = airGrams.length > 0 && waterGrams.length > 0 && Object.keys(errors).length === 0;
  return { input, errors, complete };
}
