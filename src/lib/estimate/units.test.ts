import { describe, expect, it } from "vitest";
import { convertMass, gramsToGrains, gramsToPennyweights, gramsToTroyOunces, GRAIN_GRAMS, PENNYWEIGHT_GRAMS, toGrams, TROY_OUNCE_GRAMS } from "./units";

describe("troy units", () => {
  // Grain = 64.79891 mg exactly (international yard and pound agreement, 1959; NIST Handbook 44, App. C).
  it("derive from the exact grain", () => {
    expect(GRAIN_GRAMS).toBe(0.06479891);
    expect(PENNYWEIGHT_GRAMS).toBeCloseTo(1.55517384, 12); // 24 grains
    expect(TROY_OUNCE_GRAMS).toBeCloseTo(31.1034768, 12); // 480 grains
  });
  it("match NIST SP 811 B.8 (troy ounce 3.110348 E−02 kg)", () => {
    expect(TROY_OUNCE_GRAMS / 1000).toBeCloseTo(3.110348e-2, 8);
  });
  it("convert both ways", () => {
    expect(gramsToTroyOunces(31.1034768)).toBeCloseTo(1, 12);
    expect(gramsToPennyweights(31.1034768)).toBeCloseTo(20, 12);
    expect(gramsToGrains(1.55517384)).toBeCloseTo(24, 12);
    expect(toGrams(convertMass(12.345, "dwt"), "dwt")).toBeCloseTo(12.345, 12);
  });
});
