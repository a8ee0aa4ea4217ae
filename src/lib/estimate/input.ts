import { finenessAtDensity, GOLD_DENSITY, goldAlloyDensity, SILVER_DENSITY } from "./alloy";
import { EstimateInputError } from "./errors";
import { weighSpecimen, type ModelPoint, type ModelSettings } from "./model";
import type { SpecimenInput } from "./types";
import { WATER_DENSEST_C, WATER_TEMP_MAX_C, WATER_TEMP_MIN_C, waterDensity } from "./water";
import { DEFAULTS, defaultScaleAccuracy, MAX_READING_GRAMS, MAX_STEP_GRAMS } from "./defaults";

export { DEFAULTS, defaultScaleAccuracy, MAX_READING_GRAMS, MAX_STEP_GRAMS };

/**
 * An uncertain input: its central value, its extremes, and its standard uncertainty (k = 1).
 * Every assumption is rectangular over [lo, hi] and its value is the centre of that range, so
 * the headline, the standard uncertainty and Monte Carlo all stand on one distribution.
 */
export type Quantity = { value: number; lo: number; hi: number; u: number };

/** A reading's mean with its extremes and uncertainty, the scale's part kept apart. */
export type Reading = Quantity & {
  readings: number[];
  /** The most one reading may be off: the stated accuracy, at least half a step. */
  bound: number;
  /** Type B standard uncertainty of the scale (rectangular over ± bound). */
  uScale: number;
  /** Type A: the standard deviation of the mean of the repeats. */
  uRepeat: number;
};

/** A value given off the centre of its range; the engine used the centre. */
export type NotCentred = { quantity: "hostDensity" | "finenessPermille"; given: number; used: number };

/** The fineness range given, and the part of it the readings leave possible. */
export type FinenessNarrowed = { given: [number, number]; used: [number, number]; densityLow: number };

export type ResolvedInput = {
  settings: ModelSettings;
  resolution: number;
  accuracy: number;
  air: Reading;
  water: Reading;
  tempC: Quantity;
  host: Quantity;
  fineness: Quantity;
  /** The lowest and highest specimen density the readings allow (every reading and temperature at either end). */
  density: [number, number];
  /** Every temperature the thermometer allows that the water formula knows (0–40 °C): the worst case's span. */
  tempRange: [number, number];
  /** The temperatures the range search tries: the ends of tempRange, and 3.98 °C where it holds it. */
  temps: number[];
  notCentred: NotCentred[];
  finenessNarrowed: FinenessNarrowed | null;
};

const SQRT3 = Math.sqrt(3);
/** A value this close to its range's centre (relative) is taken as the centre itself. */
const CENTRE_TOLERANCE = 1e-9;

function fail(code: string, field: keyof SpecimenInput, message: string): never {
  throw new EstimateInputError(code, field, message);
}

/** 100000 → "100 000", as the app writes large figures. */
function grouped(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, " ");
}

function checkReadings(values: unknown, field: "airGrams" | "waterGrams", label: string): number[] {
  if (!Array.isArray(values) || values.length === 0) {
    fail("reading_missing", field, `Enter at least one ${label} reading.`);
  }
  for (const v of values) {
    if (typeof v !== "number" || !Number.isFinite(v)) fail("reading_not_finite", field, `Every ${label} reading must be a number.`);
    if (v <= 0) fail("reading_not_positive", field, `Every ${label} reading must be more than zero.`);
    if (v > MAX_READING_GRAMS) {
      fail(
        "reading_implausible",
        field,
        `The ${label} reading ${v} g is more than a specimen scale weighs (at most ${grouped(MAX_READING_GRAMS)} g). Check the number and its unit.`,
      );
    }
  }
  return values as number[];
}

/** Mean, standard deviation of the mean (GUM type A) and spread of repeat readings. */
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

/**
 * A reading's mean, with extremes ± the larger of the scale's bound (its accuracy, at least
 * half a step) and half the repeats' spread. Uncertainty: type B rectangular over ± bound,
 * type A the standard deviation of the mean (JCGM 100:2008, 4.3.7 and 4.2.3).
 */
function readingQuantity(readings: number[], resolution: number, accuracy: number): Reading {
  const { mean, sdMean, spread } = meanAndSpread(readings);
  const bound = Math.max(accuracy, resolution / 2);
  const half = Math.max(bound, spread / 2);
  const uScale = bound / SQRT3;
  return { value: mean, lo: mean - half, hi: mean + half, u: Math.sqrt(uScale * uScale + sdMean * sdMean), readings, bound, uScale, uRepeat: sdMean };
}

export function rectangular(value: number, lo: number, hi: number): Quantity {
  return { value, lo, hi, u: (hi - lo) / (2 * SQRT3) };
}

/**
 * A value and its optional range. Given a range, the quantity is rectangular over it and
 * centred on it: a value given off the centre is noted and the centre used.
 */
function rangedQuantity(
  given: number | undefined,
  range: [number, number] | undefined,
  quantity: NotCentred["quantity"],
  rangeField: keyof SpecimenInput,
  label: string,
  notCentred: NotCentred[],
): Quantity | undefined {
  if (range === undefined) return undefined;
  const [lo, hi] = range;
  if (typeof lo !== "number" || typeof hi !== "number" || !Number.isFinite(lo) || !Number.isFinite(hi) || lo > hi) {
    fail("range_invalid", rangeField, `The ${label} range must be two numbers, low first.`);
  }
  const centre = (lo + hi) / 2;
  if (given === undefined) return rectangular(centre, lo, hi);
  if (given < lo || given > hi) fail("range_excludes_value", rangeField, `The ${label} range must include the ${label} itself.`);
  if (Math.abs(given - centre) <= CENTRE_TOLERANCE * Math.abs(centre)) return rectangular(given, lo, hi);
  notCentred.push({ quantity, given, used: centre });
  return rectangular(centre, lo, hi);
}

/**
 * No fineness given: with an alloy density given, the fineness of a gold–silver alloy that
 * dense (the engine's own ideal mixing); else natural gold of unknown fineness.
 */
function defaultFineness(goldDensity: number | undefined): Quantity {
  // An unusable density is refused with its own message further on.
  if (goldDensity === undefined || !Number.isFinite(goldDensity) || goldDensity <= 1) {
    return rectangular(DEFAULTS.finenessPermille, ...DEFAULTS.finenessRangePermille);
  }
  const f = Math.min(1000, finenessAtDensity(goldDensity));
  // Below 1 ‰ a gold–silver alloy is silver: no fineness to speak of.
  if (f < 1) {
    fail(
      "fineness_unknown",
      "finenessPermille",
      `A gold–silver alloy of ${goldDensity} g/cm³ holds next to no gold (silver alone is ${SILVER_DENSITY}), so its fineness cannot be worked out from it: give the gold's fineness too.`,
    );
  }
  return rectangular(f, f, f);
}

export function resolveInput(input: SpecimenInput): ResolvedInput {
  if (input.method !== "hanging" && input.method !== "buoyancy") {
    fail("method_unknown", "method", "Choose how the specimen was weighed: hanging or buoyancy.");
  }
  const airReadings = checkReadings(input.airGrams, "airGrams", "in-air");
  const waterReadings = checkReadings(input.waterGrams, "waterGrams", "in-water");

  const resolution = input.scaleResolutionGrams ?? DEFAULTS.scaleResolutionGrams;
  if (!Number.isFinite(resolution) || resolution <= 0 || resolution > MAX_STEP_GRAMS) {
    fail("resolution_invalid", "scaleResolutionGrams", `Scale step must be more than 0 and at most ${MAX_STEP_GRAMS} g.`);
  }
  const accuracy = input.scaleAccuracyGrams ?? defaultScaleAccuracy(resolution);
  if (!Number.isFinite(accuracy) || accuracy < 0 || accuracy > MAX_STEP_GRAMS) {
    fail("accuracy_invalid", "scaleAccuracyGrams", `Scale accuracy must be between 0 and ${MAX_STEP_GRAMS} g.`);
  }

  const air = readingQuantity(airReadings, resolution, accuracy);
  const water = readingQuantity(waterReadings, resolution, accuracy);
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
  // The headline, the standard uncertainty and Monte Carlo take the temperature rectangular
  // and centred on the reading, narrowed alike on both sides where the water-density formula
  // ends (0 and 40 °C). The worst case takes every temperature the thermometer allows that the
  // formula knows: 39 ± 5 °C is 34–40 °C there.
  const tolInDomain = Math.min(tol, t - WATER_TEMP_MIN_C, WATER_TEMP_MAX_C - t);
  const tempC = rectangular(t, t - tolInDomain, t + tolInDomain);
  const tempRange: [number, number] = [Math.max(WATER_TEMP_MIN_C, t - tol), Math.min(WATER_TEMP_MAX_C, t + tol)];

  const notCentred: NotCentred[] = [];
  const f = input.finenessPermille;
  if (f !== undefined && (!Number.isFinite(f) || f <= 0 || f > 1000)) {
    fail("fineness_out_of_range", "finenessPermille", "Gold fineness must be more than 0 and at most 1000 parts per thousand.");
  }
  const fineness =
    rangedQuantity(f, input.finenessRangePermille, "finenessPermille", "finenessRangePermille", "fineness", notCentred) ??
    (f !== undefined ? rectangular(f, f, f) : defaultFineness(input.goldDensity));
  if (fineness.lo <= 0 || fineness.hi > 1000) {
    fail("fineness_out_of_range", "finenessRangePermille", "The fineness range must lie above 0 and at most 1000.");
  }

  const goldDensity = input.goldDensity;
  if (goldDensity !== undefined && (!Number.isFinite(goldDensity) || goldDensity <= 1 || goldDensity > GOLD_DENSITY)) {
    fail("gold_density_invalid", "goldDensity", `Gold density must be above 1 and at most ${GOLD_DENSITY} g/cm³ (pure gold).`);
  }

  const h = input.hostDensity;
  if (h !== undefined && (!Number.isFinite(h) || h <= 1)) {
    fail("host_density_invalid", "hostDensity", "Host rock density must be above 1 g/cm³.");
  }
  const hostField = input.hostDensityRange ? "hostDensityRange" : "hostDensity";
  const hValue = h ?? DEFAULTS.hostDensity;
  const host =
    rangedQuantity(h, input.hostDensityRange, "hostDensity", "hostDensityRange", "host density", notCentred) ??
    rectangular(hValue, hValue * (1 - DEFAULTS.hostRelativeSpan), hValue * (1 + DEFAULTS.hostRelativeSpan));
  if (host.lo <= 1) fail("host_density_invalid", hostField, "Host rock density must be above 1 g/cm³.");
  // Two materials of one density cannot be told apart by weighing: the host's highest must stay
  // below the alloy's lowest (at the lowest fineness).
  const alloyLowest = goldDensity ?? goldAlloyDensity(fineness.lo);
  if (host.hi >= alloyLowest) {
    fail(
      "host_not_below_gold",
      hostField,
      `The host rock's highest density (${Number(host.hi.toPrecision(6))} g/cm³) must be below the gold alloy's lowest (${alloyLowest.toFixed(2)} g/cm³): the weighing cannot tell two materials of the same density apart.`,
    );
  }

  const settings: ModelSettings = { method: input.method, goldDensity, airCorrection: input.airBuoyancyCorrection !== false };
  const temps = [...tempRange];
  if (tempRange[0] < WATER_DENSEST_C && WATER_DENSEST_C < tempRange[1]) temps.push(WATER_DENSEST_C);

  return {
    settings,
    resolution,
    accuracy,
    air,
    water,
    tempC,
    host,
    fineness,
    density: densityRange(air, water, temps, settings),
    tempRange,
    temps,
    notCentred,
    finenessNarrowed: null,
  };
}

/** The lightest and densest the specimen can be: its density at every corner of readings and temperature. */
function densityRange(air: Reading, water: Reading, temps: number[], s: ModelSettings): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const tempC of temps) {
    const rhoW = waterDensity(tempC);
    for (const a of [air.lo, air.hi]) {
      for (const w of [water.lo, water.hi]) {
        const specimen = weighSpecimen(a, w, s, rhoW);
        // A reading whose bound reaches below nothing: the specimen could be as light as any,
        // and the readings set no lowest density at all.
        if (specimen.mass <= 0) {
          lo = 0;
          continue;
        }
        if (specimen.density < lo) lo = specimen.density;
        if (specimen.density > hi) hi = specimen.density;
      }
    }
  }
  return [lo, hi];
}

export const QUANTITY_KEYS = ["air", "water", "tempC", "host", "fineness"] as const satisfies readonly (keyof ModelPoint)[];

export function centralPoint(r: ResolvedInput): ModelPoint {
  return { air: r.air.value, water: r.water.value, tempC: r.tempC.value, host: r.host.value, fineness: r.fineness.value };
}
