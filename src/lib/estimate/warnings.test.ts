import { describe, expect, it } from "vitest";
import { estimateSpecimen, type SpecimenInput } from "./index";
import { composeSpecimen, roundToStep } from "./test-specimen";

const codes = (i: SpecimenInput) => estimateSpecimen(i).warnings.map((w) => w.code);
const base: SpecimenInput = { method: "hanging", airGrams: [100], waterGrams: [62.5] };

describe("warnings carry codes and numbers, not sentences", () => {
  it("each is { code, params } with numbers or codes only", () => {
    const inputs: SpecimenInput[] = [
      { ...base, waterGrams: [61] },
      { ...base, airGrams: [100, 100.2], waterGrams: [62.5, 62.6, 62.71] },
      { ...base, waterGrams: [62.72], hostDensityRange: [2.55, 2.75] },
      { method: "hanging", airGrams: [5.01], waterGrams: [3.2] },
    ];
    for (const input of inputs) {
      const warnings = estimateSpecimen(input).warnings;
      expect(warnings.length).toBeGreaterThan(0);
      for (const w of warnings) {
        expect(Object.keys(w).sort()).toEqual(["code", "params"]);
        for (const v of Object.values(w.params)) {
          if (typeof v === "number") expect(Number.isFinite(v)).toBe(true);
          else expect(v).toMatch(/^[a-zA-Z_]+$/);
        }
      }
    }
  });
});

describe("warnings that point the right way", () => {
  it("a hanging reading creeping up is pores filling: it gives the drift", () => {
    const w = estimateSpecimen({ ...base, waterGrams: [62.5, 62.55, 62.61] }).warnings.find((x) => x.code === "water_reading_drifts");
    expect(w?.params.driftGrams).toBeCloseTo(0.11, 9);
  });

  it("a vessel reading creeping down is pores filling too (less water pushed aside)", () => {
    expect(codes({ method: "buoyancy", airGrams: [100], waterGrams: [37.5, 37.45, 37.39] })).toContain("water_reading_drifts");
  });

  it("a drift the other way is not blamed on pores", () => {
    const c = codes({ ...base, waterGrams: [62.61, 62.55, 62.5] });
    expect(c).not.toContain("water_reading_drifts");
    expect(c).toContain("water_reading_unsteady");
  });

  it("the small-specimen warning fires when the scale matters to the gold figure, not for every small nugget", () => {
    // 3 g of 900 ‰ gold with 0.1 g of quartz on a 0.01 g scale: the fineness dominates.
    const nugget = composeSpecimen({ goldGrams: 3, fineness: 900, hostGrams: 0.1, hostDensity: 2.65 });
    const n: SpecimenInput = {
      method: "hanging",
      airGrams: [roundToStep(nugget.air, 0.01)],
      waterGrams: [roundToStep(nugget.hangingWater, 0.01)],
      finenessPermille: 900,
      finenessRangePermille: [850, 950],
    };
    expect(codes(n)).not.toContain("specimen_too_small");
    // 5 g of rock holding 0.25 g of gold on the same scale: the readings dominate.
    const rock = composeSpecimen({ goldGrams: 0.25, fineness: 900, hostGrams: 4.75, hostDensity: 2.65 });
    const r = estimateSpecimen({
      method: "hanging",
      airGrams: [roundToStep(rock.air, 0.01)],
      waterGrams: [roundToStep(rock.hangingWater, 0.01)],
      finenessPermille: 900,
    });
    const w = r.warnings.find((x) => x.code === "specimen_too_small");
    expect(w).toBeDefined();
    expect(w!.params.scaleShare).toBeGreaterThan(0.25);
  });

  it("says heavy minerals count as gold when they could explain the density", () => {
    const low = estimateSpecimen({ ...base, waterGrams: [62.9] });
    expect(low.goldAlloyGrams).toBeGreaterThan(0);
    expect(low.warnings.find((w) => w.code === "heavy_minerals_count_as_gold")?.params).toMatchObject({ heaviestGangue: 7.6 });
    // 10 g/cm³: no mix of quartz with pyrite, arsenopyrite, galena, magnetite or scheelite gets there.
    expect(codes({ ...base, waterGrams: [90] })).not.toContain("heavy_minerals_count_as_gold");
  });
});
