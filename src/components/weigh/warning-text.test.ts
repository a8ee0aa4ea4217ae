import { describe, expect, it } from "vitest";
import type { EstimateWarning, WarningCode } from "@/lib/estimate/types";
import { warningText } from "./warning-text";

// One warning of every code the engine gives; the mapped type fails to compile when a code is added without one.
const SAMPLES: { [K in WarningCode]: Extract<EstimateWarning, { code: K }> } = {
  lighter_than_host: { code: "lighter_than_host", params: { density: 2.55, hostLow: 2.62 } },
  no_gold_detectable: { code: "no_gold_detectable", params: { density: 2.64, host: 2.65, highGrams: 0.41 } },
  gold_not_distinguishable: { code: "gold_not_distinguishable", params: { density: 2.66, host: 2.65 } },
  denser_than_gold_within_error: { code: "denser_than_gold_within_error", params: { density: 19.41, densityLow: 18.9, goldDensity: 19.32 } },
  denser_than_alloy: { code: "denser_than_alloy", params: { density: 17.9, alloyDensity: 16.7 } },
  range_wider_than_estimate: { code: "range_wider_than_estimate", params: { lowGrams: 0, highGrams: 2.1, estimateGrams: 0.9 } },
  specimen_too_small: { code: "specimen_too_small", params: { displacedGrams: 1.81, accuracyGrams: 0.02, scaleShare: 0.6, scaleGrams: 0.04 } },
  readings_disagree: { code: "readings_disagree", params: { readings: "air", spreadGrams: 0.2, limitGrams: 0.04 } },
  water_reading_drifts: { code: "water_reading_drifts", params: { driftGrams: 0.11 } },
  water_reading_unsteady: { code: "water_reading_unsteady", params: { driftGrams: -0.11 } },
  heavy_minerals_count_as_gold: { code: "heavy_minerals_count_as_gold", params: { density: 2.69, heaviestGangue: 7.6 } },
  fineness_narrowed: { code: "fineness_narrowed", params: { givenLow: 700, givenHigh: 950, usedLow: 912.6, densityLow: 17.98 } },
  value_not_centred: { code: "value_not_centred", params: { quantity: "finenessPermille", given: 850, used: 825 } },
};
const mass = (g: number) => `${g.toFixed(1)} g`;

describe("the wording of the engine's warnings", () => {
  it.each(Object.values(SAMPLES).map((w) => [w.code, w] as const))("%s reads as a sentence with its numbers", (_code, w) => {
    const text = warningText(w, mass);
    expect(text.length).toBeGreaterThan(40);
    expect(text).not.toMatch(/undefined|NaN|\[object/);
    expect(text).not.toMatch(/s\.u\.|ASTM/);
  });

  it("tells a drifting in-water reading as pores filling: soak and use the settled reading", () => {
    const text = warningText(SAMPLES.water_reading_drifts, mass);
    expect(text).toMatch(/pores/);
    expect(text).toMatch(/soak/);
    expect(text).toMatch(/settled reading/);
  });

  it("doubts the host, not the gold, in a specimen lighter than the host allows", () => {
    const text = warningText(SAMPLES.lighter_than_host, mass);
    expect(text).toMatch(/host assumption is probably wrong/);
    expect(text).toMatch(/vugs, feldspar or weathered rock/);
    expect(text).not.toMatch(/no gold/);
  });

  it("names the heavy minerals that count as gold", () => {
    expect(warningText(SAMPLES.heavy_minerals_count_as_gold, mass)).toMatch(/Pyrite, arsenopyrite, galena, magnetite and scheelite/);
  });

  it("says which finenesses a dense specimen leaves, of those allowed", () => {
    const text = warningText(SAMPLES.fineness_narrowed, mass);
    expect(text).toContain("17.98 g/cm³");
    expect(text).toContain("913–950 ‰ of the 700–950 ‰ allowed");
  });

  it("says how much gold the readings still allow at the no-gold clamp", () => {
    expect(warningText(SAMPLES.no_gold_detectable, mass)).toContain("0.4 g");
  });
});
