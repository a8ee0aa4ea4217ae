import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { estimateSpecimen, EstimateInputError, type SpecimenInput } from "./index";
import { resolveInput } from "./input";
import { evaluateModel, type ModelPoint } from "./model";
import { composeSpecimen, roundToStep } from "./test-specimen";

const KEYS = ["air", "water", "tempC", "host", "fineness"] as const;

/**
 * The model's lowest and highest gold over a dense grid of the input box as given (every
 * reading, the water temperature, host and fineness from low to high), evaluated point by
 * point with no search at all. A point where the specimen is denser than its gold alloy is no
 * specimen at all (nothing is denser than its densest part), and is left out.
 */
function gridExtremes(input: SpecimenInput, readingSteps: number, otherSteps: number) {
  const r = resolveInput(input);
  const axes = KEYS.map((k) => {
    const { lo, hi } = r[k];
    const steps = k === "air" || k === "water" ? readingSteps : otherSteps;
    return lo === hi ? [lo] : Array.from({ length: steps }, (_, i) => lo + ((hi - lo) * i) / (steps - 1));
  });
  const alloy = [Infinity, -Infinity];
  const fine = [Infinity, -Infinity];
  const p: ModelPoint = { air: 0, water: 0, tempC: 0, host: 0, fineness: 0 };
  const walk = (depth: number) => {
    if (depth === KEYS.length) {
      const m = evaluateModel({ ...p }, r.settings);
      if (m.density > m.alloyDensity) return;
      alloy[0] = Math.min(alloy[0], m.alloy);
      alloy[1] = Math.max(alloy[1], m.alloy);
      fine[0] = Math.min(fine[0], m.fine);
      fine[1] = Math.max(fine[1], m.fine);
      return;
    }
    for (const v of axes[depth]) {
      p[KEYS[depth]] = v;
      walk(depth + 1);
    }
  };
  walk(0);
  return { alloy, fine };
}

function expectRangeHoldsGrid(input: SpecimenInput, readingSteps: number, otherSteps: number) {
  const e = estimateSpecimen(input);
  const g = gridExtremes(input, readingSteps, otherSteps);
  const slack = (x: number) => 1e-12 * (1 + Math.abs(x));
  expect(e.range.goldAlloyGrams[0]).toBeLessThanOrEqual(g.alloy[0] + slack(g.alloy[0]));
  expect(e.range.goldAlloyGrams[1]).toBeGreaterThanOrEqual(g.alloy[1] - slack(g.alloy[1]));
  expect(e.range.fineGoldGrams[0]).toBeLessThanOrEqual(g.fine[0] + slack(g.fine[0]));
  expect(e.range.fineGoldGrams[1]).toBeGreaterThanOrEqual(g.fine[1] - slack(g.fine[1]));
}

describe("the range contains every point of the input box", () => {
  it("for a nugget on a 1 g scale, where capping at the specimen's mass peaks inside the box", () => {
    // 30 g of 900 ‰ gold with 1 g of quartz, read to the gram: the capped gold is highest
    // where the specimen's density meets the alloy's, between the corners of the readings.
    const s = composeSpecimen({ goldGrams: 30, fineness: 900, hostGrams: 1, hostDensity: 2.65 });
    const input: SpecimenInput = {
      method: "hanging",
      airGrams: [roundToStep(s.air, 1)],
      waterGrams: [roundToStep(s.hangingWater, 1)],
      scaleResolutionGrams: 1,
      finenessPermille: 900,
      finenessRangePermille: [850, 950],
    };
    expectRangeHoldsGrid(input, 81, 5);
  });

  // Specimens from a bare nugget to low-grade rock, on scales from 1 mg to 1 g, with repeats,
  // host and fineness ranges, and water temperatures on both sides of its densest point.
  const caseArb = fc.record({
    goldGrams: fc.double({ min: 0.2, max: 80, noNaN: true }),
    hostGrams: fc.oneof(fc.constant(0), fc.double({ min: 0.1, max: 300, noNaN: true })),
    fineness: fc.integer({ min: 600, max: 1000 }),
    finenessHalf: fc.integer({ min: 0, max: 150 }),
    hostDensity: fc.double({ min: 2.5, max: 3.2, noNaN: true }),
    hostHalf: fc.double({ min: 0, max: 0.2, noNaN: true }),
    tempC: fc.double({ min: 0.5, max: 39.5, noNaN: true }),
    tolerance: fc.constantFrom(0, 0.5, 2, 5),
    step: fc.constantFrom(0.001, 0.01, 0.1, 1),
    method: fc.constantFrom("hanging" as const, "buoyancy" as const),
    jitter: fc.array(fc.integer({ min: -2, max: 2 }), { minLength: 4, maxLength: 4 }),
    airCorrection: fc.boolean(),
  });

  it("for generated specimens, against a grid of 9 points on every axis", () => {
    fc.assert(
      fc.property(caseArb, (c) => {
        const s = composeSpecimen({ goldGrams: c.goldGrams, fineness: c.fineness, hostGrams: c.hostGrams, hostDensity: c.hostDensity, tempC: c.tempC });
        const reading = c.method === "hanging" ? s.hangingWater : s.buoyancyReading;
        const lo = Math.max(1, c.fineness - c.finenessHalf);
        const hi = Math.min(1000, c.fineness + c.finenessHalf);
        const input: SpecimenInput = {
          method: c.method,
          airGrams: [roundToStep(s.air + c.jitter[0] * c.step, c.step), roundToStep(s.air + c.jitter[1] * c.step, c.step)],
          waterGrams: [roundToStep(reading + c.jitter[2] * c.step, c.step), roundToStep(reading + c.jitter[3] * c.step, c.step)],
          scaleResolutionGrams: c.step,
          waterTempC: c.tempC,
          waterTempToleranceC: c.tolerance,
          hostDensity: c.hostDensity,
          hostDensityRange: [c.hostDensity - c.hostHalf, c.hostDensity + c.hostHalf],
          finenessPermille: (lo + hi) / 2,
          finenessRangePermille: [lo, hi],
          airBuoyancyCorrection: c.airCorrection,
        };
        try {
          estimateSpecimen(input);
        } catch (error) {
          // Readings the engine refuses (a reading rounded to nothing, denser than gold) have no
          // range. Readings only rounded (no jitter) lie within the scale's bound of a real
          // specimen's, so they never make it denser than gold.
          if (error instanceof EstimateInputError) return !(error.code.startsWith("denser") && c.jitter.every((j) => j === 0));
          throw error;
        }
        expectRangeHoldsGrid(input, 9, 9);
        return true;
      }),
      { numRuns: 60, seed: 20261203 },
    );
  });
});
