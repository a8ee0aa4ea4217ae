import { describe, expect, it } from "vitest";
import { MIN_HOST_HALF_RANGE, proposeHostDensity } from "./host-proposal";

describe("the host density proposed from barren-rock weigh-ins", () => {
  it("is the mean ± 2 sample standard deviations, by hand", () => {
    // Mean 2.66; deviations −0.02, −0.01, 0, +0.01, +0.02: Σd² = 0.001, s = √(0.001/4) = 0.0158114.
    const p = proposeHostDensity([2.64, 2.65, 2.66, 2.67, 2.68])!;
    expect(p.mean).toBeCloseTo(2.66, 12);
    expect(p.sd).toBeCloseTo(0.0158114, 6);
    expect(p.low).toBe(2.628); // 2.66 − 0.0316228, rounded down
    expect(p.high).toBe(2.692); // 2.66 + 0.0316228, rounded up
    expect(p.value).toBeCloseTo(2.66, 12);
    expect(p.pieces).toBe(5);
  });

  it("is never narrower than ± 0.02 g/cm³", () => {
    const p = proposeHostDensity([2.7, 2.7, 2.7, 2.7, 2.701])!;
    expect(p.high - p.low).toBeGreaterThanOrEqual(2 * MIN_HOST_HALF_RANGE - 1e-9);
    expect((p.low + p.high) / 2).toBeCloseTo(p.value, 9);
  });

  it("needs five pieces", () => {
    expect(proposeHostDensity([2.65, 2.66, 2.67, 2.68])).toBeNull();
  });
});
