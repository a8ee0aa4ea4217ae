import { describe, expect, it } from "vitest";
import { countOf, decimalsForUncertainty, formatGrams } from "./format";

describe("figures shown to the precision their uncertainty allows", () => {
  // JCGM 100:2008, 7.2.6: the uncertainty with at most two significant digits, the figure to match.
  it.each([
    [0.3, 1],
    [0.25, 2],
    [0.012, 3],
    [0.0004, 3],
    [3, 0],
    [14, 0],
    [0, 3],
  ])("± %f g gives %i decimals in grams", (u, decimals) => {
    expect(decimalsForUncertainty(u, "g")).toBe(decimals);
  });

  it("no three decimals on a ± 0.3 g result", () => {
    expect(formatGrams(1.21877, "g", 0.3)).toBe("1.2 g");
    expect(formatGrams(1.21877, "g", 0.02)).toBe("1.219 g");
    expect(formatGrams(1.21877, "g")).toBe("1.22 g");
  });

  it("works in the member's unit", () => {
    // ± 0.3 g is ± 0.0096 ozt (troy ounce 31.1034768 g, NIST SP 811 B.8): one digit, shown as 0.010.
    expect(formatGrams(31.1034768, "ozt", 0.3)).toBe("1.000 ozt");
    expect(decimalsForUncertainty(0.3, "gr")).toBe(0);
  });
});

describe("countOf", () => {
  it("counts in English: one find, otherwise finds (zero included)", () => {
    expect([0, 1, 2, 21].map((n) => countOf(n, "find", "finds"))).toEqual(["0 finds", "1 find", "2 finds", "21 finds"]);
  });
});
