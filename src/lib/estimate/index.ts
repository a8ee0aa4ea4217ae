import { centralPoint } from "./input";
import { resolveSpecimen } from "./possible";
import { evaluateModel } from "./model";
import { searchRange } from "./range";
import type { SpecimenEstimate, SpecimenInput } from "./types";
import { gumUncertainty, monteCarlo, type MonteCarloResult } from "./uncertainty";
import { ENGINE_VERSION } from "./version";
import { collectWarnings } from "./warnings";

export { goldAlloyDensity, karatToFineness, GOLD_DENSITY, SILVER_DENSITY } from "./alloy";
export { EstimateInputError } from "./errors";
export { DEFAULTS, defaultScaleAccuracy, MAX_READING_GRAMS } from "./input";
export { waterDensity } from "./water";
export { ENGINE_VERSION } from "./version";
export * from "./units";
export type { SpecimenInput, SpecimenEstimate, EstimateWarning, EstimateAssumptions, WarningCode, WeighMethod } from "./types";
export type { MonteCarloResult } from "./uncertainty";

/** Gold in a specimen from a hydrostatic weighing, with its range and standard uncertainty. */
export function estimateSpecimen(input: SpecimenInput): SpecimenEstimate {
  const r = resolveSpecimen(input);
  const central = evaluateModel(centralPoint(r), r.settings);
  const ranges = searchRange(r);
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
    warnings: collectWarnings(r, central, ranges, u),
    assumptions: {
      airBuoyancyCorrection: r.settings.airCorrection,
      scaleResolutionGrams: r.resolution,
      scaleAccuracyGrams: r.accuracy,
      waterTempC: r.tempC.value,
      waterTempRangeC: r.tempRange,
      hostDensity: r.host.value,
      hostDensityRange: [r.host.lo, r.host.hi],
      finenessPermille: r.fineness.value,
      finenessRangePermille: [r.fineness.lo, r.fineness.hi],
      goldAlloyDensity: central.alloyDensity,
    },
    engineVersion: ENGINE_VERSION,
  };
}

/** Monte Carlo propagation (JCGM 101:2008) of the same model, seeded for repeatability. */
export function estimateSpecimenMonteCarlo(input: SpecimenInput, samples = 10000, seed = 1): MonteCarloResult {
  return monteCarlo(resolveSpecimen(input), samples, seed);
}
