import { describe, expect, it } from "vitest";
import { royaltyDue } from "./royalty";

// Troy ounce = 31.1034768 g (NIST SP 811, Appendix B.8).
const season = { value: 10_000, valueLow: 8_000, valueHigh: 12_000, currency: "USD", fineGrams: 311.034768, fineLow: 155.517384, fineHigh: 466.552152 };

describe("the royalty a landowner's agreement sets", () => {
  it("a share of the value, with its worst cases", () => {
    expect(royaltyDue({ royaltyKind: "percent_of_value", royaltyRate: 5 }, season)).toEqual({ text: "500.00 USD", low: "400.00 USD", high: "600.00 USD" });
  });
  it("grams per troy ounce of fine gold: 10 ozt at 1.5 g an ounce is 15 g", () => {
    expect(royaltyDue({ royaltyKind: "grams_per_troy_ounce", royaltyRate: 1.5 }, season)).toEqual({ text: "15.00 g", low: "7.50 g", high: "22.50 g" });
  });
  it("none when the agreement sets none", () => {
    expect(royaltyDue({ royaltyKind: null, royaltyRate: null }, season)).toBeNull();
  });
});
