import { describe, expect, it } from "vitest";
import { estimateSpecimen, estimateSpecimenMonteCarlo, type SpecimenInput } from "./index";
import { FINENESS_PRESETS, HOST_PRESETS } from "./presets";

// Centre and spread from one distribution: each assumption is rectangular over its range
// and its value is the centre of that range, for the headline, the standard uncertainty
// (JCGM 100:2008, GUM) and Monte Carlo (JCGM 101:2008) alike.

describe("presets", () => {
  it.each([...HOST_PRESETS.map((p) => [p.id, p.density, p.range] as const), ...FINENESS_PRESETS.map((p) => [p.id, p.fineness, p.range] as const)])(
    "%s: the value is the centre of its range",
    (_id, value, [lo, hi]) => {
      expect(Math.abs(value - (lo + hi) / 2)).toBeLessThan(1e-9 * value);
    },
  );
});

describe("the headline agrees with the uncertainty and with Monte Carlo", () => {
  // 300 g of vein rock holding some 30 g of gold, weighed on a 0.01 g scale with repeats.
  const base: SpecimenInput = { method: "hanging", airGrams: [300.02, 300.03, 300.02], waterGrams: [212.5, 212.51, 212.5], waterTempC: 18 };
  const cases: [string, SpecimenInput][] = [
    ...HOST_PRESETS.map(
      (h) =>
        [
          `host ${h.id}, natural gold`,
          {
            ...base,
            hostDensity: h.density,
            hostDensityRange: h.range,
            finenessPermille: FINENESS_PRESETS[0].fineness,
            finenessRangePermille: FINENESS_PRESETS[0].range,
          },
        ] as [string, SpecimenInput],
    ),
    // As older devices sent them: the value off the centre of its range.
    ["an off-centre host and fineness", { ...base, hostDensity: 2.7, hostDensityRange: [2.39, 2.8], finenessPermille: 850, finenessRangePermille: [700, 950] }],
  ];

  it.each(cases)("%s", (_name, input) => {
    const e = estimateSpecimen(input);
    const mc = estimateSpecimenMonteCarlo(input, 40000, 5);
    expect(e.fineGoldGrams).toBeGreaterThan(0);
    // The Monte Carlo mean sits on the headline, within a tenth of its standard uncertainty.
    expect(Math.abs(mc.fine.mean - e.fineGoldGrams)).toBeLessThan(0.1 * e.standardUncertainty.fineGoldGrams);
    expect(Math.abs(mc.alloy.mean - e.goldAlloyGrams)).toBeLessThan(0.1 * e.standardUncertainty.goldAlloyGrams);
    expect(Math.abs(e.standardUncertainty.fineGoldGrams - mc.fine.sd) / mc.fine.sd).toBeLessThan(0.1);
  });

  it("uses the centre of a range given off-centre, and says so", () => {
    const e = estimateSpecimen(cases[cases.length - 1][1]);
    expect(e.assumptions.hostDensity).toBeCloseTo(2.595, 12);
    expect(e.assumptions.finenessPermille).toBe(825);
    const notes = e.warnings.filter((w) => w.code === "value_not_centred").map((w) => w.params);
    expect(notes).toEqual([
      { quantity: "finenessPermille", given: 850, used: 825 },
      { quantity: "hostDensity", given: 2.7, used: e.assumptions.hostDensity },
    ]);
  });
});
