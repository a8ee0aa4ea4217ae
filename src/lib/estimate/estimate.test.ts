import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ENGINE_VERSION, estimateSpecimen, goldAlloyDensity, estimateSpecimenMonteCarlo, EstimateInputError, type SpecimenInput } from "./index";
import { composeSpecimen } from "./test-specimen";

const exact = { scaleResolutionGrams: 1e-9, waterTempToleranceC: 0, hostDensityRange: [2.65, 2.65] as [number, number] };

describe("estimateSpecimen — worked example of our own", () => {
  // 10 g of 850 ‰ gold set in 90 g of quartz (2.65 g/cm³), weighed at 20 °C on a perfect scale.
  const s = composeSpecimen({ goldGrams: 10, fineness: 850, hostGrams: 90, hostDensity: 2.65 });

  it("gives back the gold it was composed from (hanging)", () => {
    const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater], finenessPermille: 850, ...exact });
    expect(e.goldAlloyGrams).toBeCloseTo(10, 9);
    expect(e.fineGoldGrams).toBeCloseTo(8.5, 9);
    expect(e.goldMassPercent).toBeCloseTo(10, 9);
    expect(e.engineVersion).toBe(ENGINE_VERSION);
  });

  it("gives back the gold it was composed from (buoyancy)", () => {
    const e = estimateSpecimen({ method: "buoyancy", airGrams: [s.air], waterGrams: [s.buoyancyReading], finenessPermille: 850, ...exact });
    expect(e.goldAlloyGrams).toBeCloseTo(10, 9);
    expect(e.volumeCm3).toBeCloseTo(10 / goldAlloyDensity(850) + 90 / 2.65, 9);
  });

  it("matches the hand calculation at 0.01 g readings: 100.00 g in air, 62.72 g in water", () => {
    // By hand: ρw(20 °C) = 0.9982067 (Tanaka 2001 check value); V = 37.28/0.9982067 = 37.34697 cm³;
    // ρs = 2.677593; ρg(850 ‰) = 1/(0.85/19.32 + 0.15/10.49) = 17.15407;
    // m_g = 100·ρg·(ρs − 2.65)/(ρs·(ρg − 2.65)) = 1.2188 g.
    // The textbook figure: no air-buoyancy correction (air-buoyancy.test.ts checks that one).
    const e = estimateSpecimen({
      method: "hanging",
      airGrams: [100],
      waterGrams: [62.72],
      finenessPermille: 850,
      hostDensity: 2.65,
      airBuoyancyCorrection: false,
    });
    expect(e.volumeCm3).toBeCloseTo(37.34697, 4);
    expect(e.specimenDensity).toBeCloseTo(2.677593, 5);
    expect(e.goldAlloyGrams).toBeCloseTo(1.2188, 3);
    expect(e.range.goldAlloyGrams[0]).toBeLessThan(e.goldAlloyGrams);
    expect(e.range.goldAlloyGrams[1]).toBeGreaterThan(e.goldAlloyGrams);
  });
});

describe("estimateSpecimen — the host rock dominates at low grade", () => {
  // REFERENCES.md, "Sensitivity": 100 g specimen holding 1 g gold; assuming host 2.62 / 2.65 / 2.70
  // gives about 2.2 / 0.9 / −1.3 g (value from the method's literature as summarised there).
  it("moves the estimate by grams for a few hundredths of host density", () => {
    const s = composeSpecimen({ goldGrams: 1, fineness: 1000, hostGrams: 99, hostDensity: 2.65 });
    const at = (host: number) =>
      estimateSpecimen({
        method: "hanging",
        airGrams: [s.air],
        waterGrams: [s.hangingWater],
        hostDensity: host,
        hostDensityRange: [host, host],
        finenessPermille: 1000,
      }).goldAlloyGrams;
    expect(at(2.62)).toBeCloseTo(2.2, 0);
    expect(at(2.65)).toBeCloseTo(1, 6);
    expect(at(2.7)).toBe(0); // clamped: the formula's −1.3 g means "no gold detectable"
  });
});

describe("estimateSpecimen — honest about what it cannot tell", () => {
  const base: SpecimenInput = { method: "hanging", airGrams: [100], waterGrams: [62.5] };
  const codes = (i: SpecimenInput) => estimateSpecimen(i).warnings.map((w) => w.code);

  it("finds no gold in a specimen no denser than its host", () => {
    const e = estimateSpecimen({ ...base, waterGrams: [62.25] });
    expect(e.goldAlloyGrams).toBe(0);
    expect(e.warnings.map((w) => w.code)).toContain("no_gold_detectable");
  });
  it("doubts the host rather than the gold in a specimen lighter than its host's lowest", () => {
    const e = estimateSpecimen({ ...base, waterGrams: [61] });
    expect(e.goldAlloyGrams).toBe(0);
    expect(e.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["lighter_than_host"]));
  });
  it("says when gold cannot be told from none", () => {
    expect(codes({ ...base, waterGrams: [62.4] })).toContain("gold_not_distinguishable");
  });
  it("holds a specimen denser than the finest gold allowed at all gold of that fineness, and says so", () => {
    // Pure gold with a little quartz (about 18.8 g/cm³) against gold of 700 ‰ (15.42 g/cm³): the
    // fineness assumption is wrong, as a host lighter than the specimen makes the host's wrong.
    const s = composeSpecimen({ goldGrams: 50, fineness: 1000, hostGrams: 0.5, hostDensity: 2.65 });
    for (const given of [{ finenessPermille: 700 }, { finenessRangePermille: [700, 900] as [number, number] }, { goldDensity: 15.5 }]) {
      const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater], ...given });
      expect(e.goldMassPercent, JSON.stringify(given)).toBe(100);
      expect(e.warnings.map((w) => w.code)).toContain("denser_than_alloy");
    }
    const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater], finenessRangePermille: [700, 900] });
    expect(e.assumptions.finenessRangePermille).toEqual([900, 900]);
    expect(e.fineGoldGrams).toBeCloseTo(e.goldAlloyGrams * 0.9, 9);
  });
  it("caps a specimen denser than the chosen alloy within the scale's accuracy, and says so", () => {
    // All gold of 700 ‰, read 0.01 g heavy under water: a little denser than the alloy, within ± 0.02 g.
    const s = composeSpecimen({ goldGrams: 50, fineness: 700, hostGrams: 0, hostDensity: 2.65 });
    const e = estimateSpecimen({ method: "hanging", airGrams: [s.air], waterGrams: [s.hangingWater + 0.01], finenessPermille: 700 });
    expect(e.goldMassPercent).toBe(100);
    expect(e.warnings.map((w) => w.code)).toContain("denser_than_alloy");
  });
  it("flags a specimen too small for the scale", () => {
    expect(codes({ method: "hanging", airGrams: [1.2], waterGrams: [0.7] })).toContain("specimen_too_small");
  });
  it("flags repeat readings that disagree", () => {
    expect(codes({ ...base, airGrams: [100, 100.2] })).toContain("readings_disagree");
    expect(codes({ ...base, airGrams: [100, 100.01] })).not.toContain("readings_disagree");
  });
  it("flags a water reading that drifts (pores filling: REFERENCES.md, porous specimens)", () => {
    expect(codes({ ...base, waterGrams: [62.5, 62.55, 62.61] })).toContain("water_reading_drifts");
  });
  it("flags a range wider than the estimate", () => {
    expect(codes({ ...base, waterGrams: [62.72], hostDensityRange: [2.55, 2.75] })).toContain("range_wider_than_estimate");
  });
});

describe("estimateSpecimen — impossible input names its field", () => {
  const bad: [string, SpecimenInput, string, string][] = [
    ["no reading", { method: "hanging", airGrams: [], waterGrams: [1] }, "airGrams", "reading_missing"],
    ["NaN", { method: "hanging", airGrams: [Number.NaN], waterGrams: [1] }, "airGrams", "reading_not_finite"],
    ["zero", { method: "hanging", airGrams: [10], waterGrams: [0] }, "waterGrams", "reading_not_positive"],
    ["water ≥ air (hanging)", { method: "hanging", airGrams: [10], waterGrams: [10] }, "waterGrams", "water_not_below_air"],
    ["water ≥ air (buoyancy)", { method: "buoyancy", airGrams: [10], waterGrams: [12] }, "waterGrams", "water_not_below_air"],
    ["cold", { method: "hanging", airGrams: [10], waterGrams: [6], waterTempC: -3 }, "waterTempC", "temperature_out_of_range"],
    ["hot", { method: "hanging", airGrams: [10], waterGrams: [6], waterTempC: 45 }, "waterTempC", "temperature_out_of_range"],
    ["denser than gold", { method: "hanging", airGrams: [100], waterGrams: [95] }, "waterGrams", "denser_than_gold"],
    ["fineness", { method: "hanging", airGrams: [10], waterGrams: [6], finenessPermille: 1200 }, "finenessPermille", "fineness_out_of_range"],
    [
      "host range",
      { method: "hanging", airGrams: [10], waterGrams: [6], hostDensity: 2.65, hostDensityRange: [2.7, 2.8] },
      "hostDensityRange",
      "range_excludes_value",
    ],
  ];
  it.each(bad)("%s", (_label, input, field, code) => {
    let caught: unknown;
    try {
      estimateSpecimen(input);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(EstimateInputError);
    expect(caught).toMatchObject({ field, code });
  });
});

// Random specimens a pocket scale could weigh: 0.5–60 g gold of 600–1000 ‰ in 5–400 g of host rock.
const specimenArb = fc.record({
  goldGrams: fc.double({ min: 0.5, max: 60, noNaN: true }),
  fineness: fc.integer({ min: 600, max: 1000 }),
  hostGrams: fc.double({ min: 5, max: 400, noNaN: true }),
  hostDensity: fc.double({ min: 2.55, max: 3.2, noNaN: true }),
  tempC: fc.double({ min: 5, max: 35, noNaN: true }),
});

type Specimen = Parameters<typeof composeSpecimen>[0] & { tempC: number };

function inputFor(s: Specimen, method: "hanging" | "buoyancy" = "hanging"): SpecimenInput {
  const w = composeSpecimen(s);
  return {
    method,
    airGrams: [w.air],
    waterGrams: [method === "hanging" ? w.hangingWater : w.buoyancyReading],
    waterTempC: s.tempC,
    hostDensity: s.hostDensity,
    finenessPermille: s.fineness,
    // Centred on the fineness, as every range is taken to be.
    finenessRangePermille: [s.fineness - Math.min(50, 1000 - s.fineness), s.fineness + Math.min(50, 1000 - s.fineness)],
  };
}

describe("estimateSpecimen — properties", () => {
  it("recovers the composed gold and the range contains the estimate", () => {
    fc.assert(
      fc.property(specimenArb, (s) => {
        const e = estimateSpecimen({ ...inputFor(s), scaleResolutionGrams: 0.01 });
        expect(e.goldAlloyGrams).toBeCloseTo(s.goldGrams, 6);
        expect(e.range.goldAlloyGrams[0]).toBeLessThanOrEqual(e.goldAlloyGrams);
        expect(e.range.goldAlloyGrams[1]).toBeGreaterThanOrEqual(e.goldAlloyGrams);
        expect(e.range.fineGoldGrams[0]).toBeLessThanOrEqual(e.fineGoldGrams);
        expect(e.range.fineGoldGrams[1]).toBeGreaterThanOrEqual(e.fineGoldGrams);
      }),
    );
  });

  it("hanging and buoyancy give the same answer for the same specimen", () => {
    fc.assert(
      fc.property(specimenArb, (s) => {
        const a = estimateSpecimen(inputFor(s, "hanging"));
        const b = estimateSpecimen(inputFor(s, "buoyancy"));
        // Central figures agree; the ranges differ by design, since a hanging loss of weight
        // carries two readings' resolution and a buoyancy reading one.
        expect(Math.abs(a.goldAlloyGrams - b.goldAlloyGrams)).toBeLessThan(1e-9 * (1 + a.goldAlloyGrams));
        expect(Math.abs(a.fineGoldGrams - b.fineGoldGrams)).toBeLessThan(1e-9 * (1 + a.fineGoldGrams));
        expect(Math.abs(a.specimenDensity - b.specimenDensity)).toBeLessThan(1e-12 * a.specimenDensity);
      }),
    );
  });

  // Directions: more in-air weight at the same water reading means a lighter specimen (less gold);
  // a higher water reading (hanging) means a denser one; warmer water above 4 °C, denser host or
  // finer (denser) alloy mean less alloy; finer gold means more fine gold.
  const steps: [string, (i: SpecimenInput) => SpecimenInput, "alloy" | "fine", 1 | -1][] = [
    ["air reading", (i) => ({ ...i, airGrams: [i.airGrams[0] + 0.05] }), "alloy", -1],
    ["water reading", (i) => ({ ...i, waterGrams: [i.waterGrams[0] + 0.05] }), "alloy", 1],
    ["temperature", (i) => ({ ...i, waterTempC: (i.waterTempC ?? 20) + 1 }), "alloy", -1],
    ["host density", (i) => ({ ...i, hostDensity: (i.hostDensity ?? 2.65) + 0.02 }), "alloy", -1],
    ["fineness (alloy)", (i) => ({ ...i, finenessPermille: (i.finenessPermille ?? 1000) - 20, finenessRangePermille: undefined }), "alloy", 1],
    ["fineness (fine gold)", (i) => ({ ...i, finenessPermille: (i.finenessPermille ?? 1000) - 20, finenessRangePermille: undefined }), "fine", -1],
  ];
  it.each(steps)("is monotonic in the %s", (_name, step, output, direction) => {
    fc.assert(
      fc.property(specimenArb, (s) => {
        const input = { ...inputFor(s), finenessRangePermille: undefined };
        const before = estimateSpecimen(input);
        const after = estimateSpecimen(step(input));
        const pick = (e: typeof before) => (output === "alloy" ? e.goldAlloyGrams : e.fineGoldGrams);
        expect(direction * (pick(after) - pick(before))).toBeGreaterThanOrEqual(-1e-12);
      }),
    );
  });
});

describe("standard uncertainty", () => {
  // JCGM 100:2008 (GUM) linear propagation against JCGM 101:2008 Monte Carlo propagation.
  const cases: [string, SpecimenInput][] = [
    [
      "rich lode piece",
      { method: "hanging", airGrams: [152.31], waterGrams: [96.8], finenessPermille: 820, finenessRangePermille: [760, 880], waterTempC: 18 },
    ],
    [
      "modest specimen, repeats",
      { method: "buoyancy", airGrams: [48.62, 48.63, 48.62], waterGrams: [17.21, 17.2, 17.22], finenessPermille: 880, finenessRangePermille: [850, 910] },
    ],
    ["low grade, coarse scale", { method: "hanging", airGrams: [310.4], waterGrams: [196.3], scaleResolutionGrams: 0.1, hostDensity: 2.66 }],
  ];
  it.each(cases)("GUM agrees with a seeded Monte Carlo within 10 %% (%s)", (_name, input) => {
    const e = estimateSpecimen(input);
    const mc = estimateSpecimenMonteCarlo(input, 20000, 7);
    expect(e.goldAlloyGrams).toBeGreaterThan(0);
    expect(Math.abs(e.standardUncertainty.goldAlloyGrams - mc.alloy.sd) / mc.alloy.sd).toBeLessThan(0.1);
    expect(Math.abs(e.standardUncertainty.fineGoldGrams - mc.fine.sd) / mc.fine.sd).toBeLessThan(0.1);
  });

  it("Monte Carlo with one seed repeats exactly", () => {
    const input = cases[0][1];
    expect(estimateSpecimenMonteCarlo(input, 2000, 3)).toEqual(estimateSpecimenMonteCarlo(input, 2000, 3));
  });
});
