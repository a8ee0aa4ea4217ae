import { describe, expect, it } from "vitest";
import { estimateSpecimen } from "./estimate";
import { countOf, decimalsForUncertainty, formatDay, formatGrams, formatMonth, formatWhen, heldAtAnEnd, spreadText } from "./format";

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

describe("an estimate's spread in words", () => {
  const show = (g: number) => formatGrams(g, "g", 0.05);
  const spread = (waterGrams: number) => {
    // 100 g in quartz of 2.62–2.68 g/cm³: 62.5 g hung in water is 2.67 g/cm³, 62.2 g 2.64, 61.0 g 2.56.
    const e = estimateSpecimen({ method: "hanging", airGrams: [100], waterGrams: [waterGrams], hostDensity: 2.65, hostDensityRange: [2.62, 2.68] });
    return { e, text: spreadText(e.standardUncertainty.fineGoldGrams, e.range.fineGoldGrams, show, heldAtAnEnd(e)) };
  };

  it("gives the ± and the worst case around some gold, even where the ± reaches past the worst case's low end", () => {
    const { e, text } = spread(63.2);
    expect(e.fineGoldGrams).toBeGreaterThan(0);
    expect(text).toMatch(/^± \d+\.\d+ g · at worst \d+\.\d+ g – \d+\.\d+ g$/);
    // Low grade: 0.3 % gold, whose ± reaches below the worst case's 0.
    const low = spread(62.56);
    expect(low.e.fineGoldGrams).toBeGreaterThan(0);
    expect(low.e.fineGoldGrams - low.e.standardUncertainty.fineGoldGrams).toBeLessThan(low.e.range.fineGoldGrams[0]);
    expect(low.text).toMatch(/^± /);
  });

  it("gives no ± around a figure held at 0: only how much the worst case allows", () => {
    const { e, text } = spread(62.2);
    expect(e.fineGoldGrams).toBe(0);
    expect(e.standardUncertainty.fineGoldGrams).toBeGreaterThan(0);
    expect(text).toMatch(/^at worst 0\.00 g – \d+\.\d+ g$/);
  });

  it("gives no ± around a specimen held at all gold", () => {
    // 20 g of 900 ‰ gold read to 0.01 g: the alloy is held at the whole specimen, and the
    // formula's ± (before that hold) is wider than what the worst case leaves.
    const e = estimateSpecimen({
      method: "hanging",
      airGrams: [20],
      waterGrams: [18.92],
      finenessPermille: 900,
      hostDensity: 2.65,
      hostDensityRange: [2.62, 2.68],
    });
    const [low, high] = e.range.fineGoldGrams;
    expect(e.fineGoldGrams + e.standardUncertainty.fineGoldGrams > high || e.fineGoldGrams - e.standardUncertainty.fineGoldGrams < low).toBe(true);
    expect(e.goldMassPercent).toBe(100);
    expect(spreadText(e.standardUncertainty.fineGoldGrams, e.range.fineGoldGrams, show, heldAtAnEnd(e))).toMatch(/^at worst /);
  });

  it("says none when even the worst case holds no gold", () => {
    const { e, text } = spread(61);
    expect(e.range.fineGoldGrams).toEqual([0, 0]);
    expect(text).toBe("none, even with every reading and assumption at its worst");
  });
});

describe("countOf", () => {
  it("counts in English: one find, otherwise finds (zero included)", () => {
    expect([0, 1, 2, 21].map((n) => countOf(n, "find", "finds"))).toEqual(["0 finds", "1 find", "2 finds", "21 finds"]);
  });
});

describe("formatMonth", () => {
  it("names the month in the given locale, whatever the server's zone", () => {
    expect(formatMonth("2026-06", "en-GB")).toBe("Jun 2026");
    expect(formatMonth("2026-12", "de-DE")).toBe("Dez. 2026");
    expect(formatMonth("2026-01", "en-US")).toBe("Jan 2026");
  });
});

describe("dates in one format per locale", () => {
  // 2026-06-13 03:30 UTC is the evening of the 12th in Denver (UTC−6 in summer).
  const evening = Date.UTC(2026, 5, 13, 3, 30);
  it("gives the day in the viewer's locale, on the given clock", () => {
    expect(formatDay(evening, "UTC", "en-GB")).toBe("13 Jun 2026");
    expect(formatDay(evening, "America/Denver", "en-GB")).toBe("12 Jun 2026");
    expect(formatDay(evening, "America/Denver", "en-US")).toBe("Jun 12, 2026");
    expect(formatDay(evening, "UTC", "de-DE")).toBe("13.06.2026");
  });
  it("gives the day and time the same way", () => {
    expect(formatWhen(evening, "America/Denver", "en-GB")).toBe("12 Jun 2026, 21:30");
    expect(formatWhen(evening, "UTC", "de-DE")).toBe("13.06.2026, 03:30");
  });
});

describe("dates on the device's own clock", () => {
  const evening = Date.UTC(2026, 5, 13, 3, 30);
  it("follow the device into another zone, though the formatter is kept between uses", () => {
    const before = process.env.TZ;
    try {
      process.env.TZ = "America/Los_Angeles"; // Node reads TZ again when it is set
      expect(formatWhen(evening, undefined, "en-GB")).toBe("12 Jun 2026, 20:30");
      process.env.TZ = "America/Denver";
      expect(formatWhen(evening, undefined, "en-GB")).toBe("12 Jun 2026, 21:30");
      // Phoenix keeps UTC−7 all year, Denver only in winter: told apart by July's offset.
      process.env.TZ = "America/Phoenix";
      expect(formatWhen(evening, undefined, "en-GB")).toBe("12 Jun 2026, 20:30");
    } finally {
      if (before === undefined) delete process.env.TZ;
      else process.env.TZ = before;
    }
  });
  it("a corrupt timestamp reads 'date unknown' rather than taking the screen down", () => {
    expect(formatDay(Number.NaN, "UTC", "en-GB")).toBe("date unknown");
    expect(formatWhen(Number.POSITIVE_INFINITY)).toBe("date unknown");
    expect(formatMonth("not-a-month", "en-GB")).toBe("not-a-month");
  });
});
