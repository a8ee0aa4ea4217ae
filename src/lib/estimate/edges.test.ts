import { describe, expect, it } from "vitest";
import { finenessAtDensity } from "./alloy";
import { estimateSpecimen, EstimateInputError, estimateSpecimenMonteCarlo, goldAlloyDensity, type SpecimenInput } from "./index";
import { composeSpecimen, roundToStep } from "./test-specimen";
import { seededRandom } from "./uncertainty";

const codes = (i: SpecimenInput) => estimateSpecimen(i).warnings.map((w) => w.code);

function refusal(input: SpecimenInput): EstimateInputError | undefined {
  try {
    estimateSpecimen(input);
  } catch (error) {
    if (error instanceof EstimateInputError) return error;
    throw error;
  }
  return undefined;
}

describe("pure gold is not refused because of scale rounding", () => {
  // A 999.9 coin of one troy ounce (31.1034768 g, NIST SP 811 B.8) weighed as a setup check on
  // a 0.01 g pocket scale, hung under water, at 16–24 °C. Coins differ by a few centigrams,
  // so the rounding falls anywhere within a step.
  const rand = seededRandom(11);
  const coins = Array.from({ length: 200 }, () => {
    const tempC = 16 + rand() * 8;
    const s = composeSpecimen({ goldGrams: 31.1034768 + (rand() - 0.5) * 0.06, fineness: 999.9, hostGrams: 0, hostDensity: 2.65, tempC });
    return {
      method: "hanging",
      airGrams: [roundToStep(s.air, 0.01)],
      waterGrams: [roundToStep(s.hangingWater, 0.01)],
      scaleResolutionGrams: 0.01,
      finenessPermille: 999.9,
      waterTempC: tempC,
    } satisfies SpecimenInput;
  });

  it("never refuses a 999.9 coin, and finds nearly all of it gold", () => {
    const refused = coins.filter((c) => refusal(c) !== undefined);
    expect(refused.length).toBe(0);
    for (const c of coins) {
      const e = estimateSpecimen(c);
      expect(e.goldMassPercent).toBeGreaterThan(99);
      expect(e.range.goldAlloyGrams[1] / e.goldAlloyGrams).toBeGreaterThanOrEqual(1);
    }
  });

  it("says so when the readings make it denser than pure gold within their error", () => {
    const over = coins.map((c) => estimateSpecimen(c)).filter((e) => e.specimenDensity > 19.32);
    expect(over.length).toBeGreaterThan(0);
    for (const e of over) {
      expect(e.goldMassPercent).toBe(100);
      const w = e.warnings.find((x) => x.code === "denser_than_gold_within_error");
      expect(w).toBeDefined();
      expect(w!.params).toMatchObject({ goldDensity: 19.32 });
    }
  });

  it("still refuses readings that even at their lowest make the specimen denser than gold", () => {
    // 100.00 g in air and 95.00 g in water: 19.96 g/cm³, and even 100.02/95.02 ± 0.02 g stays above 19.32.
    expect(refusal({ method: "hanging", airGrams: [100], waterGrams: [95] })).toMatchObject({ code: "denser_than_gold", field: "waterGrams" });
    // The same density from a 0.1 g scale cannot be told from gold: accepted, all gold.
    const coarse = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [95], scaleResolutionGrams: 0.1, finenessPermille: 1000 });
    expect(coarse.goldMassPercent).toBe(100);
  });
});

describe("the no-gold clamp", () => {
  // 100.00 g in air, 62.20 g hung in water, 20 °C: 2.641 g/cm³ against quartz 2.62–2.68.
  const clamped: SpecimenInput = { method: "hanging", airGrams: [100], waterGrams: [62.2], hostDensity: 2.65, hostDensityRange: [2.62, 2.68] };

  it("keeps a standard uncertainty that reflects the gold the range allows", () => {
    const e = estimateSpecimen(clamped);
    expect(e.goldAlloyGrams).toBe(0);
    expect(e.range.goldAlloyGrams[1]).toBeGreaterThan(0.3);
    expect(e.standardUncertainty.goldAlloyGrams).toBeGreaterThan(0.2 * e.range.goldAlloyGrams[1]);
    expect(e.standardUncertainty.fineGoldGrams).toBeGreaterThan(0.2 * e.range.fineGoldGrams[1]);
    expect(codes(clamped)).toContain("no_gold_detectable");
  });

  it("says the host assumption is probably wrong when the specimen is lighter than its lowest", () => {
    // 2.55 g/cm³: lighter than any quartz; vugs, feldspar or weathered rock, not "no gold".
    const e = estimateSpecimen({ ...clamped, waterGrams: [60.85] });
    expect(e.specimenDensity).toBeLessThan(2.62);
    const w = e.warnings.find((x) => x.code === "lighter_than_host");
    expect(w?.params).toMatchObject({ hostLow: 2.62 });
    expect(e.warnings.map((x) => x.code)).not.toContain("no_gold_detectable");
  });
});

describe("the host density's bound is physical", () => {
  // Our own worked example after the classical crown of gold and silver: 800 g of pure gold
  // (CRC Handbook 19.32 g/cm³) alloyed by volume with 200 g of silver (10.49–10.50, CRC
  // Handbook [memory]), taken as gold in a silver "host".
  it("separates gold from a silver host (denser than 10 g/cm³)", () => {
    const s = composeSpecimen({ goldGrams: 800, fineness: 1000, hostGrams: 200, hostDensity: 10.495 });
    const e = estimateSpecimen({
      method: "hanging",
      airGrams: [s.air],
      waterGrams: [s.hangingWater],
      hostDensity: 10.495,
      hostDensityRange: [10.49, 10.5],
      finenessPermille: 1000,
      scaleResolutionGrams: 1e-9,
      waterTempToleranceC: 0,
    });
    expect(e.goldAlloyGrams).toBeCloseTo(800, 6);
    expect(e.range.goldAlloyGrams[0]).toBeLessThan(800);
    expect(e.range.goldAlloyGrams[1]).toBeGreaterThan(800);
  });

  it("refuses a host whose highest density reaches the alloy's at the lowest fineness", () => {
    // 100 ‰ gold: 1/(0.1/19.32 + 0.9/10.49) = 10.99 g/cm³, below the host's 11.
    const input: SpecimenInput = {
      method: "hanging",
      airGrams: [100],
      waterGrams: [88],
      hostDensity: 7.5,
      hostDensityRange: [4, 11],
      finenessPermille: 200,
      finenessRangePermille: [100, 300],
    };
    expect(refusal(input)).toMatchObject({ code: "host_not_below_gold", field: "hostDensityRange" });
    expect(refusal({ ...input, hostDensityRange: [4, 10.9], hostDensity: 7.45 })).toBeUndefined();
  });
});

describe("a specimen is never denser than its gold", () => {
  // Natural gold of unknown fineness: 700–950 ‰ (the "natural" preset), in clean quartz.
  const natural: Pick<SpecimenInput, "finenessPermille" | "finenessRangePermille" | "hostDensity" | "hostDensityRange"> = {
    finenessPermille: 825,
    finenessRangePermille: [700, 950],
    hostDensity: 2.65,
    hostDensityRange: [2.62, 2.68],
  };

  it("turns the alloy's density round exactly", () => {
    for (const f of [100, 700, 825, 950, 1000]) expect(finenessAtDensity(goldAlloyDensity(f))).toBeCloseTo(f, 9);
    expect(finenessAtDensity(10)).toBe(0); // lighter than silver: no alloy at all
  });

  it("keeps only the finenesses dense enough for a dense specimen, and says so", () => {
    // A piece of 920 ‰ gold and no rock (about 18.2 g/cm³): gold of 880 ‰ (17.7 g/cm³) or
    // less is lighter than the piece itself, so its fine gold cannot be 700 ‰ of its weight.
    const s = composeSpecimen({ goldGrams: 40, fineness: 920, hostGrams: 0, hostDensity: 2.65 });
    const e = estimateSpecimen({ method: "hanging", airGrams: [roundToStep(s.air, 0.01)], waterGrams: [roundToStep(s.hangingWater, 0.01)], ...natural });
    const floor = e.assumptions.finenessRangePermille[0];
    expect(floor).toBeGreaterThan(880);
    expect(floor).toBeLessThan(920); // the true fineness stays inside
    expect(e.assumptions.finenessRangePermille[1]).toBe(950);
    expect(e.range.fineGoldGrams[0]).toBeGreaterThan((s.mass * 880) / 1000);
    expect(e.range.fineGoldGrams[0]).toBeLessThanOrEqual((s.mass * 920) / 1000);
    expect(e.range.fineGoldGrams[1]).toBeGreaterThanOrEqual((s.mass * 920) / 1000);
    expect(e.fineGoldGrams).toBeGreaterThanOrEqual(e.range.fineGoldGrams[0]);
    expect(e.fineGoldGrams).toBeLessThanOrEqual(e.range.fineGoldGrams[1]);
    const w = e.warnings.find((x) => x.code === "fineness_narrowed");
    expect(w?.params).toMatchObject({ givenLow: 700, givenHigh: 950, usedLow: floor });
  });

  it("leaves the range whole for a specimen lighter than its lightest gold", () => {
    const s = composeSpecimen({ goldGrams: 20, fineness: 850, hostGrams: 80, hostDensity: 2.65 });
    const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater], ...natural });
    expect(e.assumptions.finenessRangePermille).toEqual([700, 950]);
    expect(e.warnings.map((w) => w.code)).not.toContain("fineness_narrowed");
  });

  it("sets no lowest density when a reading's bound reaches below nothing, and narrows nothing", () => {
    // 0.01 g in air on a 0.01 g scale (± 0.02 g): the specimen could weigh nothing at all.
    for (const input of [
      { method: "hanging", airGrams: [0.01], waterGrams: [0.005] },
      { method: "hanging", airGrams: [1], waterGrams: [0.4], scaleResolutionGrams: 0.1, scaleAccuracyGrams: 2 },
      { method: "buoyancy", airGrams: [1], waterGrams: [0.4], scaleResolutionGrams: 0.1, scaleAccuracyGrams: 2 },
      { method: "hanging", airGrams: [5], waterGrams: [3], scaleResolutionGrams: 10, finenessPermille: 900 },
    ] satisfies SpecimenInput[]) {
      expect(refusal(input), JSON.stringify(input)).toBeUndefined();
      expect(estimateSpecimen(input).warnings.map((w) => w.code)).not.toContain("fineness_narrowed");
    }
  });

  it("holds readings denser than the finest gold allowed at that finest gold, and says so", () => {
    // About 19.0 g/cm³ read to 0.01 g: at least 18.85, above 950 ‰ gold's 18.54.
    const water = 100 - 99.7007 / (19 - 0.0012);
    const e = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [water], ...natural });
    expect(e.assumptions.finenessRangePermille).toEqual([950, 950]);
    expect(e.goldMassPercent).toBe(100);
    expect(e.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["denser_than_alloy"]));
    expect(e.warnings.map((w) => w.code)).not.toContain("fineness_narrowed");
    expect(e.warnings.map((w) => w.code)).not.toContain("value_not_centred");
    // A finer gold takes it as it stands.
    const finer = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [water], finenessRangePermille: [950, 1000] });
    expect(finer.warnings.map((w) => w.code)).toContain("fineness_narrowed");
  });

  it("drops the off-centre note once the narrowing moves the centre", () => {
    // 40 g of 930 ‰ gold given as 850 in 700–950: figured at the narrowed range's middle, and
    // only the narrowing says so (the note "uses the middle, 825 ‰" would no longer be true).
    const s = composeSpecimen({ goldGrams: 40, fineness: 930, hostGrams: 0, hostDensity: 2.65 });
    const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater], ...natural, finenessPermille: 850 });
    const codes = e.warnings.map((w) => w.code);
    expect(codes).toContain("fineness_narrowed");
    expect(codes).not.toContain("value_not_centred");
    const [lo, hi] = e.assumptions.finenessRangePermille;
    expect(e.assumptions.finenessPermille).toBeCloseTo((lo + hi) / 2, 9);
  });

  it("writes the lowest density and pure gold's apart, never the same figure twice", () => {
    // The in-water reading where refusal begins (bisection), for a large pure-gold piece on a
    // milligram scale with no air correction: there the lowest density equals 19.32.
    const at = (water: number) =>
      refusal({ method: "hanging", airGrams: [200], waterGrams: [water], scaleResolutionGrams: 0.001, finenessPermille: 1000, airBuoyancyCorrection: false });
    let [accepted, refused] = [189, 191];
    for (let i = 0; i < 60; i++) {
      const mid = (accepted + refused) / 2;
      if (at(mid)) refused = mid;
      else accepted = mid;
    }
    // 0.0003 g past it: about 0.0005 g/cm³ denser than gold, apart at four places.
    const error = at(refused + 0.0003);
    expect(error?.code).toBe("denser_than_gold");
    const [, atLeast, gold] = /at least ([\d.]+) within.*\(([\d.]+)\)/.exec(error!.message) ?? [];
    expect(atLeast).not.toBe(gold);
    expect(Number(atLeast)).toBeGreaterThan(Number(gold));
  });
});

describe("what the engine assumes when the input is silent", () => {
  it("takes natural gold of unknown fineness, not pure gold", () => {
    const e = estimateSpecimen({ method: "hanging", airGrams: [49.99], waterGrams: [40.67] });
    expect(e.assumptions.finenessPermille).toBe(825);
    expect(e.assumptions.finenessRangePermille).toEqual([700, 950]);
    expect(e.range.fineGoldGrams[1]).toBeLessThan(e.range.goldAlloyGrams[1]);
  });

  it("takes the fineness of a gold–silver alloy as dense as the one given", () => {
    const e = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [62.5], goldDensity: goldAlloyDensity(800) });
    expect(e.assumptions.finenessPermille).toBeCloseTo(800, 9);
    expect(e.fineGoldGrams).toBeCloseTo(e.goldAlloyGrams * 0.8, 9);
  });

  it("refuses an alloy density given with no fineness that no gold–silver alloy with gold in it has", () => {
    for (const goldDensity of [8.96, 10, 10.49, 10.4900001]) {
      expect(refusal({ method: "hanging", airGrams: [50], waterGrams: [40], goldDensity })).toMatchObject({
        code: "fineness_unknown",
        field: "finenessPermille",
      });
      // With its fineness given, such an alloy (gold with copper, say) is worked with as it stands.
      expect(refusal({ method: "hanging", airGrams: [50], waterGrams: [40], goldDensity, finenessPermille: 417 })).toBeUndefined();
    }
  });

  it("keeps every temperature the thermometer allows that the water formula knows in the worst case", () => {
    // Only the temperature uncertain: exact readings, one host density, one fineness; about 2.72 g/cm³.
    const input: SpecimenInput = {
      method: "hanging",
      airGrams: [100],
      waterGrams: [63.5],
      waterTempC: 39,
      waterTempToleranceC: 5,
      scaleResolutionGrams: 1e-9,
      scaleAccuracyGrams: 0,
      hostDensity: 2.65,
      hostDensityRange: [2.65, 2.65],
      finenessPermille: 1000,
    };
    const e = estimateSpecimen(input);
    expect(e.assumptions.waterTempC).toBe(39);
    expect(e.assumptions.waterTempRangeC).toEqual([34, 40]);
    // The worst case reaches 34 °C (water denser than at 38, so less volume, less gold)…
    const at34 = estimateSpecimen({ ...input, waterTempC: 34, waterTempToleranceC: 0 });
    expect(e.range.goldAlloyGrams[0]).toBeLessThanOrEqual(at34.range.goldAlloyGrams[0]);
    // …while the headline, the ± and Monte Carlo rest on one distribution centred on 39 (38–40).
    const mc = estimateSpecimenMonteCarlo(input, 20000, 3);
    expect(e.goldAlloyGrams).toBeGreaterThan(0);
    expect(Math.abs(mc.alloy.mean - e.goldAlloyGrams)).toBeLessThan(0.1 * e.standardUncertainty.goldAlloyGrams);
    expect(mc.alloy.sd / e.standardUncertainty.goldAlloyGrams).toBeCloseTo(1, 1);
    const low = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [62.5], waterTempC: 1, waterTempToleranceC: 2 });
    expect(low.assumptions.waterTempRangeC).toEqual([0, 3]);
  });

  it("counts a specimen exactly at the host's density as holding no gold", () => {
    const s = composeSpecimen({ goldGrams: 0, fineness: 825, hostGrams: 100, hostDensity: 2.65 });
    const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater], hostDensity: 2.65, hostDensityRange: [2.65, 2.65] });
    expect(e.goldAlloyGrams).toBe(0);
    expect(e.warnings.map((w) => w.code)).toContain("no_gold_detectable");
  });

  it("writes the host's bound in a refusal without binary noise", () => {
    const error = refusal({ method: "hanging", airGrams: [100], waterGrams: [62.5], hostDensity: 19.31, goldDensity: 19.32 });
    expect(error?.message).toContain("(19.6962 g/cm³)");
  });
});
