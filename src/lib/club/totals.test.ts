import { describe, expect, it } from "vitest";
import { deviceTotals } from "./totals";

describe("the phone's tally, from the server's figures", () => {
  it("adds what was figured, counts what was not, and never adds a weight as fine gold", () => {
    const t = deviceTotals([
      { weightGrams: 10, figure: { basis: "claim_fineness", fineGrams: 8.25, low: 7, high: 9.5, weighMismatch: false } },
      { weightGrams: 80, figure: { basis: "weighed", fineGrams: 2.1, low: 1.6, high: 2.6, weighMismatch: true } },
      { weightGrams: 3, figure: null },
      { weightGrams: null },
    ]);
    expect(t).toEqual({
      finds: 4,
      weightGrams: 93,
      fineGrams: 10.35,
      fineLow: 8.6,
      fineHigh: 12.1,
      figured: 2,
      mismatched: 1,
      byBasis: { claim_fineness: 1, weighed: 1 },
    });
  });
});
