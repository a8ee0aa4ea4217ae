import { ASSAY_HALF_RANGE, FINENESS_PRESETS, HOST_PRESETS } from "@/lib/estimate/presets";
import type { SpecimenInput } from "@/lib/estimate/types";
import { fahrenheitToCelsius, toGrams, type MassUnit } from "@/lib/estimate/units";
import { parseNumber } from "@/lib/parse-number";

export { parseNumber };

/** The weigh-in form as typed: strings, so half-typed numbers never jump about. */
export type WeighFormValues = {
  method: "hanging" | "buoyancy";
  readingUnit: MassUnit;
  air: { value: string }[];
  water: { value: string }[];
  resolution: string;
  temp: string;
  tempUnit: "C" | "F";
  tempTolerance: string;
  hostPreset: string;
  hostDensity: string;
  hostLow: string;
  hostHigh: string;
  finenessPreset: string;
  fineness: string;
  finenessLow: string;
  finenessHigh: string;
  airBuoyancy: boolean;
};

export type WeighField = "air" | "water" | "resolution" | "temp" | "tempTolerance" | "hostDensity" | "fineness" | "method";

export const DEFAULT_WEIGH_FORM: WeighFormValues = {
  method: "hanging",
  readingUnit: "g",
  air: [{ value: "" }],
  water: [{ value: "" }],
  resolution: "0.01",
  temp: "20",
  tempUnit: "C",
  tempTolerance: "2",
  hostPreset: "quartz",
  hostDensity: "",
  hostLow: "",
  hostHigh: "",
  finenessPreset: "natural",
  fineness: "",
  finenessLow: "",
  finenessHigh: "",
  airBuoyancy: false,
};


/** Maps the engine's field names back to the form's. */
export const ENGINE_FIELD_TO_FORM: Record<string, WeighField> = {
  method: "method",
  airGrams: "air",
  waterGrams: "water",
  scaleResolutionGrams: "resolution",
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
export function toSpecimenInput(v: WeighFormValues): FormResult {
  const errors: FormResult["errors"] = {};
  const unit = v.readingUnit;
  const readings = (list: { value: string }[], field: "air" | "water") => {
    const out: number[] = [];
    for (const r of list) {
      const n = parseNumber(r.value);
      if (n === undefined) continue;
      if (Number.isNaN(n)) errors[field] = "Type a number, like 12.34.";
      else out.push(toGrams(n, unit));
    }
    return out;
  };
  const airGrams = readings(v.air, "air");
  const waterGrams = readings(v.water, "water");

  const num = (text: string, field: WeighField, label: string) => {
    const n = parseNumber(text);
    if (n !== undefined && Number.isNaN(n)) errors[field] = `${label}: type a number.`;
    return n !== undefined && !Number.isNaN(n) ? n : undefined;
  };

  const resolution = num(v.resolution, "resolution", "Scale step");
  const tempRaw = num(v.temp, "temp", "Temperature");
  const tolRaw = num(v.tempTolerance, "tempTolerance", "Tolerance");
  const input: SpecimenInput = {
    method: v.method,
    airGrams,
    waterGrams,
    scaleResolutionGrams: resolution !== undefined ? toGrams(resolution, unit) : undefined,
    waterTempC: tempRaw === undefined ? undefined : v.tempUnit === "F" ? fahrenheitToCelsius(tempRaw) : tempRaw,
    waterTempToleranceC: tolRaw === undefined ? undefined : v.tempUnit === "F" ? (tolRaw * 5) / 9 : tolRaw,
    airBuoyancyCorrection: v.airBuoyancy,
  };

  const host = HOST_PRESETS.find((p) => p.id === v.hostPreset);
  if (host) {
    input.hostDensity = host.density;
    input.hostDensityRange = host.range;
  } else {
    const d = num(v.hostDensity, "hostDensity", "Host density");
    const lo = num(v.hostLow, "hostDensity", "Host density, low");
    const hi = num(v.hostHigh, "hostDensity", "Host density, high");
    if (d === undefined) errors.hostDensity ??= "Enter the host rock's density in g/cm³.";
    input.hostDensity = d;
    if (lo !== undefined && hi !== undefined) input.hostDensityRange = [lo, hi];
  }

  const preset = FINENESS_PRESETS.find((p) => p.id === v.finenessPreset);
  if (preset) {
    input.finenessPermille = preset.fineness;
    input.finenessRangePermille = preset.range;
  } else {
    const f = num(v.fineness, "fineness", "Fineness");
    if (f === undefined) errors.fineness ??= "Enter the fineness in parts per thousand (‰).";
    input.finenessPermille = f;
    if (v.finenessPreset === "assayed" && f !== undefined) {
      input.finenessRangePermille = [Math.max(1, f - ASSAY_HALF_RANGE), Math.min(1000, f + ASSAY_HALF_RANGE)];
    } else {
      const lo = num(v.finenessLow, "fineness", "Fineness, low");
      const hi = num(v.finenessHigh, "fineness", "Fineness, high");
      if (lo !== undefined && hi !== undefined) input.finenessRangePermille = [lo, hi];
    }
  }

  const complete = airGrams.length > 0 && waterGrams.length > 0 && Object.keys(errors).length === 0;
  return { input, errors, complete };
}
