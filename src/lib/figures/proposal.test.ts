import { describe, expect, it } from "vitest";
import { MIN_HALF_RANGE, proposeFineness, recoveryRatios } from "./proposal";

const melt = (weight: number, fine: number, estimated = 0) => ({
  kind: "melt" as const,
  fineGrams: fine,
  fineness: null,
  estimatedGrams: estimated,
  grossGrams: weight,
  placerGrams: weight,
});

describe("a claim's fineness proposed from the club's melts and assays", () => {
  it("two melts, checked by hand", () => {
    // 100 g melted → 88 g fine (880 ‰); 50 g → 46 g (920 ‰).
    // mean = (100·880 + 50·920) / 150 = 893.33 ‰
    // sd = √((100·13.33² + 50·26.67²) / 150) = 18.86 ‰; ± 2 sd = ± 37.71 ‰ → 855.6–931.0 ‰
    const p = proposeFineness([melt(100, 88), melt(50, 46)])!;
    expect(p.low).toBeCloseTo(855.6, 1);
    expect(p.high).toBeCloseTo(931.0, 1);
    expect(p.value).toBeCloseTo(893.3, 1);
    expect(p.recoveries).toBe(2);
  });

  it("one assay: its fineness, never narrower than the minimum half-range", () => {
    const p = proposeFineness([{ kind: "assay", fineGrams: 9.1, fineness: 910, estimatedGrams: 8.2, grossGrams: 10, placerGrams: 10 }])!;
    expect([p.low, p.value, p.high]).toEqual([910 - MIN_HALF_RANGE, 910, 910 + MIN_HALF_RANGE]);
  });

  it("a melt with specimen rock in it says nothing about fineness; nothing at all gives no proposal", () => {
    expect(proposeFineness([{ kind: "melt", fineGrams: 5, fineness: null, estimatedGrams: 4, grossGrams: 300, placerGrams: 20 }])).toBeNull();
    expect(proposeFineness([])).toBeNull();
  });

  it("stays within 1–1000 ‰, centred", () => {
    const p = proposeFineness([melt(10, 9.95), melt(10, 9.9)])!;
    expect(p.high).toBe(1000);
    expect(p.value).toBeCloseTo((p.low + p.high) / 2, 1);
  });

  it("compares recovered with estimated", () => {
    const r = recoveryRatios([melt(100, 88, 80), melt(50, 46, 50), melt(10, 9, 0)]);
    expect(r.ratios).toEqual([1.1, 0.92]);
    expect(r.mean).toBeCloseTo(1.01, 10);
    expect(r.sd).toBeCloseTo(Math.sqrt(((1.1 - 1.01) ** 2 + (0.92 - 1.01) ** 2) / 1), 10);
  });
});
