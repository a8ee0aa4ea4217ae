import { describe, expect, it } from "vitest";
import { decimalMarkOf, parseNumber, readNumber } from "./parse-number";

// [typed, where "." is the decimal mark, where "," is, where the locale is unknown]
const TABLE: [string, number | undefined, number | undefined, number | undefined][] = [
  ["", undefined, undefined, undefined],
  ["12.5", 12.5, 12.5, 12.5],
  ["12,5", 12.5, 12.5, 12.5],
  ["35,1", 35.1, 35.1, 35.1],
  ["0,125", 0.125, 0.125, 0.125], // a leading 0 is never a thousands group
  ["2,495", 2495, 2.495, NaN],
  ["2.495", 2.495, 2495, NaN],
  ["2,400", 2400, 2.4, NaN],
  ["1,234,567", 1234567, NaN, 1234567],
  ["1.234.567", NaN, 1234567, 1234567],
  ["2,495.50", 2495.5, 2495.5, 2495.5],
  ["2.495,50", 2495.5, 2495.5, 2495.5],
  ["2 495", 2495, 2495, 2495],
  ["2\u00a0495,5", 2495.5, 2495.5, 2495.5],
  ["2'495.5", 2495.5, 2495.5, 2495.5],
  ["-3.25", -3.25, -3.25, -3.25],
  ["+7", 7, 7, 7],
  [".5", 0.5, 0.5, 0.5],
  ["1e-3", 0.001, 0.001, 0.001],
  ["1e30", 1e30, 1e30, 1e30],
  ["12,34,5", NaN, NaN, NaN],
  ["1,2.3", NaN, NaN, NaN],
  ["12 34", NaN, NaN, NaN],
  ["abc", NaN, NaN, NaN],
  ["1..2", NaN, NaN, NaN],
  [",", NaN, NaN, NaN],
  ["-", NaN, NaN, NaN],
  ["12g", NaN, NaN, NaN],
];

describe("numbers as people type them (issues 15 and 19; common practice of en and de keyboards)", () => {
  it.each(TABLE)("%j reads as %s / %s / %s", (typed, point, comma, unknown) => {
    const check = (got: number | undefined, want: number | undefined) =>
      want === undefined ? expect(got).toBeUndefined() : Number.isNaN(want) ? expect(got).toBeNaN() : expect(got).toBeCloseTo(want, 12);
    check(parseNumber(typed, "."), point);
    check(parseNumber(typed, ","), comma);
    check(parseNumber(typed), unknown);
  });

  it("learns the decimal mark from the locale's own formatting (CLDR through Intl)", () => {
    expect(decimalMarkOf("en-US")).toBe(".");
    expect(decimalMarkOf("de-DE")).toBe(",");
    expect(decimalMarkOf("fr-FR")).toBe(",");
    expect(decimalMarkOf("en-AU")).toBe(".");
  });

  it("reads the same with the mark given as a lookup, and looks it up only for text two readings fit", () => {
    for (const [typed, point, comma] of TABLE) {
      for (const [mark, want] of [
        [".", point],
        [",", comma],
      ] as const) {
        let asked = 0;
        const got = parseNumber(typed, () => (asked++, mark));
        expect(Number.isNaN(got!) ? "NaN" : got, `${typed} with ${mark}`).toEqual(Number.isNaN(want!) ? "NaN" : want);
        expect(asked).toBeLessThanOrEqual(1);
      }
    }
    const asks = (typed: string) => {
      let asked = 0;
      parseNumber(typed, () => (asked++, "."));
      return asked;
    };
    // An empty field, whole numbers and plain decimals never need the locale: a form of empty
    // fields, read on every draw, never loads the browser's number tables.
    expect(["", "35", "12.5", "35,1", "0.125", "2 495", "2,495.50"].map(asks)).toEqual([0, 0, 0, 0, 0, 0, 0]);
    expect(["2,495", "2.495", "1,234,567"].map(asks)).toEqual([1, 1, 1]);
  });

  it("asks the browser's tables once per locale, not once per field read", () => {
    const Real = Intl.NumberFormat;
    let made = 0;
    const Counting = function (...args: ConstructorParameters<typeof Intl.NumberFormat>) {
      made++;
      return new Real(...args);
    } as unknown as typeof Intl.NumberFormat;
    Intl.NumberFormat = Counting;
    try {
      for (let i = 0; i < 50; i++) {
        expect(decimalMarkOf("pt-BR")).toBe(",");
        expect(decimalMarkOf("ja-JP")).toBe(".");
        expect(readNumber("2,495", { label: "weight" }, () => decimalMarkOf("pt-BR")).value).toBe(2.495);
      }
      expect(made).toBe(2);
    } finally {
      Intl.NumberFormat = Real;
    }
  });
});

describe("a number field's message names the real problem (issue 19)", () => {
  const weight = { label: "weight", above: 0, max: 100_000, unit: "g" };
  it.each([
    ["", undefined, undefined],
    ["12,5", 12.5, undefined],
    ["0", undefined, "The weight must be more than 0 g."],
    ["-3", undefined, "The weight must be more than 0 g."],
    ["1e30", undefined, "The weight can be at most 100 000 g."],
    ["2,400", undefined, "“2,400” could be 2400 or 2.4: write it without a thousands mark."],
    ["abc", undefined, "Type the weight as a number, like 12.5."],
  ])("%j", (typed, value, error) => {
    const r = readNumber(typed, weight, null); // the locale unknown
    expect(r.value).toBe(value);
    expect(r.error).toBe(error);
  });
  it("reads by the locale's mark where one is known", () => {
    expect(readNumber("2,400", weight, ".").value).toBe(2400);
    expect(readNumber("2,400", weight, ",").value).toBe(2.4);
  });
});
