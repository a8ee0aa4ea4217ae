import { GOLD_DENSITY } from "./alloy";
import type { ResolvedInput } from "./input";
import { displacedGrams, type ModelResult } from "./model";
import type { Ranges } from "./range";
import type { EstimateWarning } from "./types";
import type { Uncertainty } from "./uncertainty";

/** Repeat readings further apart than this many scale steps are called out (common practice)… */
export const DISAGREE_STEPS = 3;
/** …or further apart than two readings each within the scale's accuracy can be. */
const DISAGREE_BOUNDS = 2;
/**
 * The densest common gangue mineral: galena, about 7.6 g/cm³ (REFERENCES.md, [memory]).
 * Pyrite 5.011 (ds62), arsenopyrite about 6.1 [memory], magnetite about 5.2 [memory] and
 * scheelite about 6.1 [memory] are lighter, so a specimen at or below this density could owe
 * all its excess over the host to them.
 */
export const HEAVIEST_GANGUE_DENSITY = 7.6;
/** The scale "matters" when its part of the uncertainty is this share of the variance or more… */
const SCALE_SHARE = 0.25;
/** …and moves the gold figure by more than this fraction of it (one standard uncertainty). */
const SCALE_RELATIVE = 0.1;

export function collectWarnings(r: ResolvedInput, central: ModelResult, ranges: Ranges, u: Uncertainty): EstimateWarning[] {
  const warnings: EstimateWarning[] = [];
  const density = central.density;

  if (density < r.host.lo) {
    warnings.push({ code: "lighter_than_host", params: { density, hostLow: r.host.lo } });
  } else if (central.alloy <= 0) {
    warnings.push({ code: "no_gold_detectable", params: { density, host: r.host.value, highGrams: ranges.alloy[1] } });
  } else if (ranges.alloy[0] <= 0) {
    warnings.push({ code: "gold_not_distinguishable", params: { density, host: r.host.value } });
  }
  if (density > GOLD_DENSITY) {
    warnings.push({ code: "denser_than_gold_within_error", params: { density, densityLow: ranges.density[0], goldDensity: GOLD_DENSITY } });
  } else if (density >= central.alloyDensity) {
    warnings.push({ code: "denser_than_alloy", params: { density, alloyDensity: central.alloyDensity } });
  }
  const [low, high] = ranges.alloy;
  if (high - low > central.alloy && central.alloy > 0) {
    warnings.push({ code: "range_wider_than_estimate", params: { lowGrams: low, highGrams: high, estimateGrams: central.alloy } });
  }
  // The scale's step and accuracy matter to the gold figure when they are a good part of its
  // uncertainty and move it appreciably; a finer scale or a larger piece would then help.
  const scale2 = u.scaleAlloy * u.scaleAlloy;
  const total2 = u.alloy * u.alloy;
  if (scale2 > 0 && scale2 >= SCALE_SHARE * total2 && (central.alloy <= 0 || u.scaleAlloy > SCALE_RELATIVE * central.alloy)) {
    warnings.push({
      code: "specimen_too_small",
      params: {
        displacedGrams: displacedGrams(r.settings.method, r.air.value, r.water.value),
        accuracyGrams: r.air.bound,
        scaleShare: scale2 / total2,
        scaleGrams: u.scaleAlloy,
      },
    });
  }
  for (const [reading, which] of [
    [r.air, "air"],
    [r.water, "water"],
  ] as const) {
    if (reading.readings.length < 2) continue;
    const spread = Math.max(...reading.readings) - Math.min(...reading.readings);
    const limit = Math.max(DISAGREE_STEPS * r.resolution, DISAGREE_BOUNDS * reading.bound);
    if (spread > limit * (1 + 1e-9)) {
      warnings.push({ code: "readings_disagree", params: { readings: which, spreadGrams: spread, limitGrams: limit } });
    }
  }
  const drift = steadyDrift(r.water.readings, r.resolution);
  if (drift !== 0) {
    // Pores taking up water make a hung specimen heavier under water, and push aside less
    // water in the vessel: the in-water reading creeps up when hung, down in the vessel.
    const poresFilling = r.settings.method === "hanging" ? drift > 0 : drift < 0;
    warnings.push({ code: poresFilling ? "water_reading_drifts" : "water_reading_unsteady", params: { driftGrams: drift } });
  }
  if (central.alloy > 0 && density <= HEAVIEST_GANGUE_DENSITY) {
    warnings.push({ code: "heavy_minerals_count_as_gold", params: { density, heaviestGangue: HEAVIEST_GANGUE_DENSITY } });
  }
  const narrowed = r.finenessNarrowed;
  if (narrowed) {
    warnings.push({
      code: "fineness_narrowed",
      params: { givenLow: narrowed.given[0], givenHigh: narrowed.given[1], usedLow: narrowed.used[0], densityLow: narrowed.densityLow },
    });
  }
  for (const n of r.notCentred) warnings.push({ code: "value_not_centred", params: n });
  return warnings;
}

/** Last minus first of three or more readings each moving the same way, by more than a step in all; else 0. */
function steadyDrift(values: number[], resolution: number): number {
  if (values.length < 3) return 0;
  let up = true;
  let down = true;
  for (let i = 1; i < values.length; i++) {
    if (!(values[i] > values[i - 1])) up = false;
    if (!(values[i] < values[i - 1])) down = false;
  }
  const drift = values[values.length - 1] - values[0];
  return (up || down) && Math.abs(drift) > resolution ? drift : 0;
}
