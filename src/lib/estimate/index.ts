import { GOLD_DENSITY } from "./alloy";
import { EstimateInputError } from "./errors";
import { centralPoint, resolveInput } from "./input";
import { evaluateModel } from "./model";
import type { SpecimenEstimate, SpecimenInput } from "./types";
import { cornerRange, gumUncertainty, monteCarlo, type MonteCarloResult } from "./uncertainty";
import { collectWarnings } from "./warnings";

export { goldAlloyDensity, karatToFineness, GOLD_DENSITY, SILVER_DENSITY } from "./alloy";
export { EstimateInputError } from "./errors";
export { waterDensity } from "./water";
export * from "./units";
export type { SpecimenInput, SpecimenEstimate, EstimateWarning, WeighMethod } from "./types";
export type { MonteCarloResult } from "./uncertainty";

/** Bumped whenever a change could move any result; stored with every server recomputation. */
export const ENGINE_VERSION = "1.0.0";

/** Gold in a specimen from a hydrostatic weighing, with its range and standard uncertainty. */
export function estimateSpecimen(input: SpecimenInput): SpecimenEstimate {
  const r = resolveInput(input);
  const central = evaluateModel(centralPoint(r), r.settings);
  if (central.density > GOLD_DENSITY) {
    throw new EstimateInputError(
      "denser_than_gold",
      "waterGrams",
      `These readings make the specimen ${central.density.toFixed(2)} g/cm³, denser than pure gold (${GOLD_DENSITY}). Re-check the readings and the tare.`,
    );
  }
  const ranges = cornerRange(r);
  const u = gumUncertainty(r);
  const goldVolume = central.alloy / central.alloyDensity;
  return {
    specimenDensity: central.density,
    volumeCm3: central.volume,
    goldAlloyGrams: central.alloy,
    fineGoldGrams: central.fine,
    goldMassPercent: (central.alloy / central.mass) * 100,
    goldVolumePercent: (goldVolume / central.volume) * 100,
    range: { goldAlloyGrams: ranges.alloy, fineGoldGrams: ranges.fine },
    standardUncertainty: { goldAlloyGrams: u.alloy, fineGoldGrams: u.fine },
    warnings: collectWarnings(r, central, ranges),
    engineVersion: ENGINE_VERSION,
  };
}

/** Monte Carlo propagation (JCGM 101:2008) of the same model, seeded for repeatability. */
export function estimateSpecimenMonteCarlo(input: SpecimenInput, samples = 10000, seed = 1): MonteCarloResult {
  return monteCarlo(resolveInput(input), samples, seed);
}
