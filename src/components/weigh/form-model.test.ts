import { describe, expect, it } from "vitest";
import { PENNYWEIGHT_GRAMS } from "@/lib/estimate/units";
import { CLAIM_PRESET } from "@/lib/figures/claim-gold";
import { DEFAULT_WEIGH_FORM, DEFAULT_REPEATS, parseTyped as parseNumber, toSpecimenInput } from "./form-model";

describe("weigh-in form model", () => {
  it("reads decimal points and decimal commas, and refuses junk", () => {
    expect(parseNumber("12.5")).toBe(12.5);
    expect(parseNumber(" 12,5 ")).toBe(12.5);
    expect(parseNumber("")).toBeUndefined();
    expect(parseNumber("12g")).toBeNaN();
  });

  it("builds the engine input from presets, converting readings and °F", () => {
    const { input, complete, errors } = toSpecimenInput({
      ...DEFAULT_WEIGH_FORM,
      readingUnit: "dwt",
      air: [{ value: "10" }, { value: "" }],
      water: [{ value: "6" }],
      temp: "68",
      tempUnit: "F",
      tempTolerance: "3.6",
    });
    expect(errors).toEqual({});
    expect(complete).toBe(true);
    expect(input.airGrams).toEqual([10 * PENNYWEIGHT_GRAMS]);
    expect(input.waterTempC).toBeCloseTo(20, 12);
    expect(input.waterTempToleranceC).toBeCloseTo(2, 12);
    expect(input.hostDensity).toBe(2.65);
    expect(input.finenessRangePermille).toEqual([700, 950]);
  });

  it("names the field that cannot be read", () => {
    const r = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, air: [{ value: "abc" }], water: [{ value: "1" }], hostPreset: "custom" });
    expect(r.complete).toBe(false);
    expect(r.errors.air).toMatch(/number/);
    expect(r.errors.hostDensity).toMatch(/density/);
  });

  it("gives an assayed fineness its ±5 ‰", () => {
    const r = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, finenessPreset: "assayed", fineness: "912" });
    expect(r.input.finenessRangePermille).toEqual([907, 917]);
  });

  it("starts with three repeat readings and the air-buoyancy correction on", () => {
    expect(DEFAULT_REPEATS).toBe(3);
    expect(DEFAULT_WEIGH_FORM.air).toHaveLength(3);
    expect(DEFAULT_WEIGH_FORM.water).toHaveLength(3);
    const r = toSpecimenInput({
      ...DEFAULT_WEIGH_FORM,
      air: [{ value: "10" }, { value: "10.01" }, { value: "" }],
      water: [{ value: "6" }, { value: "" }, { value: "" }],
    });
    expect(r.input.airGrams).toEqual([10, 10.01]);
    expect(r.input.airBuoyancyCorrection).toBe(true);
    // Blank accuracy leaves the engine's default for the step.
    expect(r.input.scaleAccuracyGrams).toBeUndefined();
  });

  it("carries the scale's stated accuracy in the reading unit", () => {
    const r = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, readingUnit: "dwt", accuracy: "0.02", air: [{ value: "10" }], water: [{ value: "6" }] });
    expect(r.input.scaleAccuracyGrams).toBeCloseTo(0.02 * PENNYWEIGHT_GRAMS, 12);
  });

  it("enters ranges as a centre give or take, so the value is the centre", () => {
    const host = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, hostPreset: "custom", hostDensity: "2.8", hostSpread: "0.1" });
    expect(host.input.hostDensityRange).toEqual([2.8 - 0.1, 2.8 + 0.1]);
    const assay = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, finenessPreset: "assayed", fineness: "998" });
    expect(assay.input.finenessRangePermille).toEqual([996, 1000]);
    const past = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, finenessPreset: "custom", fineness: "980", finenessSpread: "30" });
    expect(past.errors.fineness).toMatch(/1000/);
  });
});

describe("a find's claim gold profile", () => {
  const claim = {
    name: "Larkspur Bench",
    hostDensity: 2.7,
    hostRange: [2.66, 2.74] as [number, number],
    fineness: 890,
    finenessRange: [860, 920] as [number, number],
  };
  it("is what the weigh-in takes as host rock and fineness when chosen", () => {
    const { input } = toSpecimenInput(
      { ...DEFAULT_WEIGH_FORM, hostPreset: CLAIM_PRESET, finenessPreset: CLAIM_PRESET, air: [{ value: "50" }], water: [{ value: "31" }] },
      claim,
    );
    expect([input.hostDensity, input.hostDensityRange, input.finenessPermille, input.finenessRangePermille]).toEqual([2.7, [2.66, 2.74], 890, [860, 920]]);
  });
  it("without a profile, a preset is still a preset", () => {
    const { input } = toSpecimenInput({ ...DEFAULT_WEIGH_FORM, air: [{ value: "50" }], water: [{ value: "31" }] }, claim);
    expect(input.hostDensity).toBe(2.65);
  });
});
