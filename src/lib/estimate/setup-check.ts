import { EstimateInputError } from "./errors";
import { resolveInput, type ResolvedInput } from "./input";
import { weighSpecimen } from "./model";
import { searchRange } from "./range";
import type { SpecimenInput } from "./types";
import { ENGINE_VERSION } from "./version";
import { waterDensity, WATER_TEMP_MAX_C, WATER_TEMP_MIN_C } from "./water";

/** What a density measurement needs: the rig and the readings, no host rock or gold. */
export type DensityInput = Pick<
  SpecimenInput,
  "method" | "airGrams" | "waterGrams" | "scaleResolutionGrams" | "scaleAccuracyGrams" | "waterTempC" | "waterTempToleranceC" | "airBuoyancyCorrection"
>;

export type MeasuredDensity = {
  /** g/cm³, with the air's buoyancy corrected unless the input turns it off (OIML D 28). */
  density: number;
  /** One standard uncertainty (JCGM 100:2008) from the readings, the scale and the water temperature. */
  standardUncertainty: number;
  /** The lowest and highest density the readings, the scale and the temperature allow at once. */
  range: [number, number];
  massGrams: number;
  volumeCm3: number;
};

const DENSITY_KEYS = [
  "method",
  "airGrams",
  "waterGrams",
  "scaleResolutionGrams",
  "scaleAccuracyGrams",
  "waterTempC",
  "waterTempToleranceC",
  "airBuoyancyCorrection",
] as const;

/** The input's density fields only: a host rock or fineness it carries plays no part. */
function densityOnly(input: DensityInput): DensityInput {
  const out: Record<string, unknown> = {};
  for (const k of DENSITY_KEYS) if (input[k] !== undefined) out[k] = input[k];
  return out as DensityInput;
}

function densityAt(r: ResolvedInput, air: number, water: number, tempC: number): number {
  return weighSpecimen(air, water, r.settings, waterDensity(tempC)).density;
}

/**
 * An object's density from one hydrostatic weighing, by the specimen engine's own steps
 * (resolveInput, weighSpecimen, the Tanaka water density), with its standard uncertainty by
 * linear propagation (JCGM 100:2008, eq. 10) over the two readings and the water temperature,
 * taken as uncorrelated, sensitivities by central differences as in the gold estimate.
 */
export function measureDensity(input: DensityInput): MeasuredDensity {
  const r = resolveInput(densityOnly(input) as SpecimenInput);
  const w = weighSpecimen(r.air.value, r.water.value, r.settings, waterDensity(r.tempC.value));
  const at = { air: r.air.value, water: r.water.value, tempC: r.tempC.value };
  let u2 = 0;
  for (const key of ["air", "water", "tempC"] as const) {
    const u = r[key].u;
    if (u === 0) continue;
    const h = u / 1000;
    // One-sided where the water-density formula ends (0 and 40 °C).
    const up = key === "tempC" ? Math.min(at.tempC + h, WATER_TEMP_MAX_C) : at[key] + h;
    const down = key === "tempC" ? Math.max(at.tempC - h, WATER_TEMP_MIN_C) : at[key] - h;
    const dUp = densityAt(r, key === "air" ? up : at.air, key === "water" ? up : at.water, key === "tempC" ? up : at.tempC);
    const dDown = densityAt(r, key === "air" ? down : at.air, key === "water" ? down : at.water, key === "tempC" ? down : at.tempC);
    const c = (dUp - dDown) / (up - down);
    u2 += c * u * (c * u);
  }
  return { density: w.density, standardUncertainty: Math.sqrt(u2), range: searchRange(r).density, massGrams: w.mass, volumeCm3: w.volume };
}

/** A reference object's density (g/cm³) and its standard uncertainty (k = 1). */
export type ReferenceDensity = { density: number; uncertainty: number };

/**
 * The verdict's rule: the rig reads true when the measured density lies within CHECK_COVERAGE
 * combined standard uncertainties of the reference's (the measurement's and the reference's,
 * uncorrelated): |ρ_measured − ρ_reference| ≤ 2·√(u_measured² + u_reference²). About 95 % of
 * checks of a sound rig pass (JCGM 100:2008, 6.2–6.3, k = 2); a miss is a fault to look for.
 */
export const CHECK_COVERAGE = 2;
/** A check whose expected error exceeds 2 % of the reference's density proves little (our choice). */
export const COARSE_CHECK_SHARE = 0.02;

export type SetupCheckResult = {
  measuredDensity: number;
  /** The measurement's standard uncertainty (readings, scale, water temperature). */
  measuredUncertainty: number;
  referenceDensity: number;
  referenceUncertainty: number;
  /** √(u_measured² + u_reference²). */
  combinedUncertainty: number;
  /** The expected error: CHECK_COVERAGE × the combined uncertainty (g/cm³). */
  allowedDifference: number;
  /** Measured − reference, g/cm³ and as a percentage of the reference. */
  difference: number;
  differencePercent: number;
  passed: boolean;
  /** The expected error is more than COARSE_CHECK_SHARE of the reference: a pass proves little. */
  coarse: boolean;
  engineVersion: string;
};

export function judgeSetupCheck(input: DensityInput, reference: ReferenceDensity): SetupCheckResult {
  const { density: ref, uncertainty: uRef } = reference;
  if (typeof ref !== "number" || !Number.isFinite(ref) || ref <= 1 || ref > 25) {
    throw new EstimateInputError("reference_invalid", "referenceDensity", "The reference object's density must be above 1 and at most 25 g/cm³.");
  }
  if (typeof uRef !== "number" || !Number.isFinite(uRef) || uRef < 0 || uRef > ref / 2) {
    throw new EstimateInputError("reference_invalid", "referenceUncertainty", "The reference's uncertainty must be 0 or more, and less than half its density.");
  }
  const m = measureDensity(input);
  const combined = Math.sqrt(m.standardUncertainty * m.standardUncertainty + uRef * uRef);
  const allowed = CHECK_COVERAGE * combined;
  const difference = m.density - ref;
  return {
    measuredDensity: m.density,
    measuredUncertainty: m.standardUncertainty,
    referenceDensity: ref,
    referenceUncertainty: uRef,
    combinedUncertainty: combined,
    allowedDifference: allowed,
    difference,
    differencePercent: (difference / ref) * 100,
    passed: Math.abs(difference) <= allowed,
    coarse: allowed > COARSE_CHECK_SHARE * ref,
    engineVersion: ENGINE_VERSION,
  };
}
