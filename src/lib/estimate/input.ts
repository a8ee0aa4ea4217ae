import { GOLD_DENSITY } from "./alloy";
import { EstimateInputError } from "./errors";
import type { ModelPoint, ModelSettings } from "./model";
import type { SpecimenInput } from "./types";
import { WATER_TEMP_MAX_C, WATER_TEMP_MIN_C } from "./water";

export const DEFAULTS = {
  scaleResolutionGrams: 0.01,
  waterTempC: 20,
  waterTempToleranceC: 2,
  hostDensity: 2.65,
  /** Default host span: ±2 % around the chosen density (our choice; quartz with a little
   *  iron oxide or mica spans about this much, Holland & Powell ds62 quartz 2.648). */
  hostRelativeSpan: 0.02,
  finenessPermille: 1000,
} as const;

/** An uncertain input: its central value, its extremes, and its standard uncertainty (k = 1). */
export type Quantity = { value: number; lo: number; hi: number; u: number };

export type ResolvedInput = {
  settings: ModelSettings;
  resolution: number;
  air: Quantity;
  water: Quantity;
  tempC: Quantity;
  host: Quantity;
  fineness: Quantity;
  airReadings: number[];
  waterReadings: number[];
};

const SQRT3 = Math.sqrt(3);

function fail(code: string, field: keyof SpecimenInput, message: string): never {
  throw new EstimateInputError(code, field, message);
}

function checkReadings(values: unknown, field: "airGrams" | "waterGrams", label: string): number[] {
  if (!Array.isArray(values) || values.length === 0) {
    fail("reading_missing", field, `Enter at least one ${label} reading.`);
  }
  for (const v of values) {
    if (typeof v !== "number" || !Number.isFinite(v)) fail("reading_not_finite", field, `Every ${label} reading must be a number.`);
    if (v <= 0) fail("reading_not_positive", field, `Every ${label} reading must be more than zero.`);
  }
  return values as number[];
}

/** Mean, and standard deviation of the mean (GUM type A), of repeat readings. */
export function meanAndSpread(values: number[]): { mean: number; sdMean: number; spread: number } {
  let sum = 0;
  for (const v of values) sum += v;
  const mean = sum / values.length;
  if (values.length < 2) return { mean, sdMean: 0, spread: 0 };
  let ss = 0;
  let min = values[0];
  let max = values[0];
  for (const v of values) {
    ss += (v - mean) * (v - mean);
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const sd = Math.sqrt(ss / (values.length - 1));
  return { mean, sdMean: sd / Math.sqrt(values.length), spread: max - min };
}

/** A reading's mean with extremes ± the larger of half a scale step and half the spread. */
function readingQuantity(values: number[], resolution: number): Quantity {
  const { mean, sdMean, spread } = meanAndSpread(values);
  const half = Math.max(resolution / 2, spread / 2);
  // Type B: rectangular over one scale step (u = r/√12); type A: sd of the mean.
  const u = Math.sqrt((resolution * resolution) / 12 + sdMean * sdMean);
  return { value: mean, lo: mean - half, hi: mean + half, u };
}

function rectangular(value: number, lo: number, hi: number): Quantity {
  return { value, lo, hi, u: (hi - lo) / (2 * SQRT3) };
}

function checkRange(
  range: [number, number] | undefined,
  value: number,
  field: keyof SpecimenInput,
  label: string,
): [number, number] | undefined {
  if (range === undefined) return undefined;
  const [lo, hi] = range;
  if (!Number.isFinite(lo) || !Number.isFinite(hi) || lo > hi) {
    fail("range_invalid", field, `The ${label} range must be two numbers, low first.`);
  }
  if (value < lo || value > hi) fail("range_excludes_value", field, `The ${label} range must include the ${label} itself.`);
  return [lo, hi];
}

export function resolveInput(input: SpecimenInput): ResolvedInput {
  if (input.method !== "hanging" && input.method !== "buoyancy") {
    fail("method_unknown", "method", "Choose how the specimen was weighed: hanging or buoyancy.");
  }
  const airReadings = checkReadings(input.airGrams, "airGrams", "in-air");
  const waterReadings = checkReadings(input.waterGrams, "waterGrams", "in-water");

  const resolution = input.scaleResolutionGrams ?? DEFAULTS.scaleResolutionGrams;
  if (!Number.isFinite(resolution) || resolution <= 0 || resolution > 10) {
    fail("resolution_invalid", "scaleResolutionGrams", "Scale resolution must be more than 0 and at most 10 g.");
  }

  const air = readingQuantity(airReadings, resolution);
  const water = readingQuantity(waterReadings, resolution);
  if (water.value >= air.value) {
    fail(
      "water_not_below_air",
      "waterGrams",
      input.method === "hanging"
        ? "The in-water reading must be lower than the in-air reading. Check the tare and that the specimen hangs free."
        : "The vessel reading must be lower than the in-air reading. Check that the vessel was tared with the line in the water.",
    );
  }

  const t = input.waterTempC ?? DEFAULTS.waterTempC;
  if (!Number.isFinite(t) || t < WATER_TEMP_MIN_C || t > WATER_TEMP_MAX_C) {
    fail("temperature_out_of_range", "waterTempC", `Water temperature must be between ${WATER_TEMP_MIN_C} and ${WATER_TEMP_MAX_C} °C.`);
  }
  const tol = input.waterTempToleranceC ?? DEFAULTS.waterTempToleranceC;
  if (!Number.isFinite(tol) || tol < 0 || tol > 20) {
    fail("tolerance_invalid", "waterTempToleranceC", "Temperature tolerance must be between 0 and 20 °C.");
  }
  const tempC = rectangular(t, Math.max(WATER_TEMP_MIN_C, t - tol), Math.min(WATER_TEMP_MAX_C, t + tol));

  const f = input.finenessPermille ?? DEFAULTS.finenessPermille;
  if (!Number.isFinite(f) || f <= 0 || f > 1000) {
    fail("fineness_out_of_range", "finenessPermille", "Gold fineness must be more than 0 and at most 1000 parts per thousand.");
  }
  const fRange = checkRange(input.finenessRangePermille, f, "finenessRangePermille", "fineness") ?? [f, f];
  if (fRange[0] <= 0 || fRange[1] > 1000) {
    fail("fineness_out_of_range", "finenessRangePermille", "The fineness range must lie above 0 and at most 1000.");
  }

  const h = input.hostDensity ?? DEFAULTS.hostDensity;
  if (!Number.isFinite(h) || h <= 1 || h >= 10) {
    fail("host_density_invalid", "hostDensity", "Host rock density must be above 1 and below 10 g/cm³.");
  }
  const hRange = checkRange(input.hostDensityRange, h, "hostDensityRange", "host density") ?? [
    h * (1 - DEFAULTS.hostRelativeSpan),
    h * (1 + DEFAULTS.hostRelativeSpan),
  ];
  if (hRange[0] <= 1) fail("host_density_invalid", "hostDensityRange", "Host rock density must be above 1 g/cm³.");

  const goldDensity = input.goldDensity;
  if (goldDensity !== undefined) {
    if (!Number.isFinite(goldDensity) || goldDensity <= hRange[1] || goldDensity > GOLD_DENSITY) {
      fail("gold_density_invalid", "goldDensity", `Gold density must be above the host rock's and at most ${GOLD_DENSITY} g/cm³.`);
    }
  }

  return {
    settings: { method: input.method, goldDensity, airCorrection: input.airBuoyancyCorrection === true },
    resolution,
    air,
    water,
    tempC,
    host: rectangular(h, hRange[0], hRange[1]),
    fineness: rectangular(f, fRange[0], fRange[1]),
    airReadings,
    waterReadings,
  };
}

export const QUANTITY_KEYS = ["air", "water", "tempC", "host", "fineness"] as const satisfies readonly (keyof ModelPoint)[];

export function centralPoint(r: ResolvedInput): ModelPoint {
  return { air: r.air.value, water: r.water.value, tempC: r.tempC.value, host: r.host.value, fineness: r.fineness.value };
}
