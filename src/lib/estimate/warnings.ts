import type { ResolvedInput } from "./input";
import { displacedGrams, type ModelResult } from "./model";
import type { EstimateWarning } from "./types";

/** Repeat readings further apart than this many scale steps are called out (common practice). */
export const DISAGREE_STEPS = 3;
/** Below this many scale steps of displaced water, one step moves the volume by over 1 %. */
export const SMALL_SPECIMEN_STEPS = 100;

type Ranges = { alloy: [number, number]; density: [number, number] };

export function collectWarnings(r: ResolvedInput, central: ModelResult, ranges: Ranges): EstimateWarning[] {
  const warnings: EstimateWarning[] = [];

  if (central.density <= r.host.value) {
    warn(
      warnings,
      "no_gold_detectable",
      `The specimen (${central.density.toFixed(2)} g/cm³) is no denser than the host rock you chose (${r.host.value.toFixed(2)}): the weighing finds no gold. Estimate set to 0.`,
    );
  } else if (ranges.alloy[0] <= 0) {
    warn(
      warnings,
      "gold_not_distinguishable",
      "The specimen is only a little denser than the host rock — less than the uncertainty — so the weighing cannot tell gold from none. The low end of the range is 0.",
    );
  }
  if (central.density >= central.alloyDensity) {
    warn(
      warnings,
      "denser_than_alloy",
      `The specimen (${central.density.toFixed(2)} g/cm³) is denser than the gold alloy you chose (${central.alloyDensity.toFixed(2)}). The gold is probably finer than that; the estimate is capped at the whole specimen's weight.`,
    );
  }
  const width = ranges.alloy[1] - ranges.alloy[0];
  if (width > central.alloy && central.alloy > 0) {
    warn(warnings, "range_wider_than_estimate", "The range is wider than the estimate itself: treat this number as a rough guess.");
  }
  const displaced = displacedGrams(r.settings.method, r.air.value, r.water.value);
  if (displaced < SMALL_SPECIMEN_STEPS * r.resolution) {
    warn(
      warnings,
      "specimen_too_small",
      `The specimen pushes aside only ${displaced.toFixed(2)} g of water; one step of your scale (${r.resolution} g) is over 1 % of that. Use a finer scale or a larger piece.`,
    );
  }
  for (const [readings, label] of [
    [r.airReadings, "in-air"],
    [r.waterReadings, "in-water"],
  ] as const) {
    if (readings.length < 2) continue;
    const spread = Math.max(...readings) - Math.min(...readings);
    if (spread > DISAGREE_STEPS * r.resolution + 1e-12) {
      warn(
        warnings,
        "readings_disagree",
        `Your ${label} readings differ by ${spread.toFixed(3)} g, more than ${DISAGREE_STEPS} scale steps. Re-check: drafts, a line touching the vessel, bubbles, a wet specimen.`,
      );
    }
  }
  if (isDrifting(r.waterReadings, r.resolution)) {
    warn(
      warnings,
      "water_reading_drifts",
      "The in-water readings drift one way: a porous or vuggy specimen may be soaking up water and reading denser than it is (ASTM B311, note 1).",
    );
  }
  return warnings;
}

function warn(list: EstimateWarning[], code: string, message: string) {
  list.push({ code, message });
}

/** Three or more readings each moving the same way, by more than a scale step in all. */
function isDrifting(values: number[], resolution: number): boolean {
  if (values.length < 3) return false;
  let up = true;
  let down = true;
  for (let i = 1; i < values.length; i++) {
    if (!(values[i] > values[i - 1])) up = false;
    if (!(values[i] < values[i - 1])) down = false;
  }
  return (up || down) && Math.abs(values[values.length - 1] - values[0]) > resolution;
}
