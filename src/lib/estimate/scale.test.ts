import { describe, expect, it } from "vitest";
import { defaultScaleAccuracy, estimateSpecimen, EstimateInputError, MAX_READING_GRAMS, type SpecimenInput } from "./index";

function refusal(input: SpecimenInput): EstimateInputError | undefined {
  try {
    estimateSpecimen(input);
  } catch (error) {
    if (error instanceof EstimateInputError) return error;
    throw error;
  }
  return undefined;
}

// A rich specimen weighed once on a 0.01 g scale: its range comes mostly from the readings.
const rich: SpecimenInput = {
  method: "hanging",
  airGrams: [52.31],
  waterGrams: [44.06],
  finenessPermille: 900,
  hostDensity: 2.65,
  hostDensityRange: [2.65, 2.65],
  waterTempToleranceC: 0,
};

describe("the scale's accuracy beyond its display step", () => {
  it("has a default per step size, reported with the result", () => {
    expect(defaultScaleAccuracy(0.001)).toBeCloseTo(0.003, 12);
    expect(defaultScaleAccuracy(0.01)).toBeCloseTo(0.02, 12);
    expect(defaultScaleAccuracy(0.1)).toBeCloseTo(0.1, 12);
    expect(estimateSpecimen(rich).assumptions.scaleAccuracyGrams).toBeCloseTo(0.02, 12);
  });

  it("never takes a coarser scale as more accurate than a finer one", () => {
    // Where the rule changes (3 steps below 0.005 g, 2 below 0.05 g, then 1), a step just
    // coarser was once allowed less than one just finer: 0.05 g ± 0.05 against 0.049 g ± 0.098.
    const steps = Array.from({ length: 4000 }, (_, i) => 0.0001 * 1.003 ** i).filter((s) => s <= 10);
    for (let i = 1; i < steps.length; i++) expect(defaultScaleAccuracy(steps[i])).toBeGreaterThanOrEqual(defaultScaleAccuracy(steps[i - 1]));
    expect(defaultScaleAccuracy(0.05)).toBeGreaterThanOrEqual(defaultScaleAccuracy(0.049));
    expect(defaultScaleAccuracy(0.005)).toBeGreaterThanOrEqual(defaultScaleAccuracy(0.0049));
    expect(defaultScaleAccuracy(0.05)).toBeCloseTo(0.1, 12);
    expect(defaultScaleAccuracy(1)).toBeCloseTo(1, 12);
  });

  it("is carried into the range and the standard uncertainty", () => {
    const tight = estimateSpecimen({ ...rich, scaleAccuracyGrams: 0.005 });
    const loose = estimateSpecimen({ ...rich, scaleAccuracyGrams: 0.05 });
    expect(loose.goldAlloyGrams).toBe(tight.goldAlloyGrams);
    const width = (e: typeof tight) => e.range.goldAlloyGrams[1] - e.range.goldAlloyGrams[0];
    expect(width(loose)).toBeGreaterThan(5 * width(tight));
    expect(loose.standardUncertainty.goldAlloyGrams).toBeGreaterThan(5 * tight.standardUncertainty.goldAlloyGrams);
  });

  it("bounds each reading: every reading within ± the accuracy lands inside the range", () => {
    const withAccuracy = estimateSpecimen({ ...rich, scaleAccuracyGrams: 0.03 });
    for (const da of [-0.03, 0, 0.03]) {
      for (const dw of [-0.03, 0, 0.03]) {
        const e = estimateSpecimen({ ...rich, airGrams: [52.31 + da], waterGrams: [44.06 + dw], scaleResolutionGrams: 1e-9, scaleAccuracyGrams: 1e-9 });
        expect(e.goldAlloyGrams).toBeGreaterThanOrEqual(withAccuracy.range.goldAlloyGrams[0] - 1e-12);
        expect(e.goldAlloyGrams).toBeLessThanOrEqual(withAccuracy.range.goldAlloyGrams[1] + 1e-12);
      }
    }
  });

  it("refuses an accuracy that is not a plausible number, naming the field", () => {
    for (const bad of [-0.01, Number.NaN, 11]) {
      expect(refusal({ ...rich, scaleAccuracyGrams: bad })).toMatchObject({ field: "scaleAccuracyGrams", code: "accuracy_invalid" });
    }
  });
});

describe("plausibility limits on readings", () => {
  it("refuses a 1e30 g reading with a message naming the field and the limit", () => {
    const e = refusal({ method: "hanging", airGrams: [1e30], waterGrams: [5] });
    expect(e).toMatchObject({ field: "airGrams", code: "reading_implausible" });
    expect(e!.message).toMatch(/in-air/);
    expect(e!.message).toContain("100 000 g");
    const w = refusal({ method: "buoyancy", airGrams: [10], waterGrams: [1e30] });
    expect(w).toMatchObject({ field: "waterGrams", code: "reading_implausible" });
  });

  it("accepts a reading at the limit", () => {
    expect(MAX_READING_GRAMS).toBe(100_000);
    expect(refusal({ method: "hanging", airGrams: [MAX_READING_GRAMS], waterGrams: [62_000] })).toBeUndefined();
  });
});
