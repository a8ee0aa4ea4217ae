import { describe, expect, it } from "vitest";
import { PENNYWEIGHT_GRAMS } from "@/lib/estimate/units";
import { DEFAULT_WEIGH_FORM, parseNumber, toSpecimenInput } from "./form-model";

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
});
