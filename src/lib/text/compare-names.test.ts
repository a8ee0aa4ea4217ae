import { describe, expect, it } from "vitest";
import { compareNames } from "./compare-names";

describe("compareNames", () => {
  it("orders names blind to case and accents", () => {
    expect(["bench", "Zebra Wash", "Éclat", "apple", "Álamo", "Dry Creek"].sort(compareNames)).toEqual([
      "Álamo",
      "apple",
      "bench",
      "Dry Creek",
      "Éclat",
      "Zebra Wash",
    ]);
  });

  it("agrees with ICU's collation (Intl.Collator, root order) on names a club gives its claims", () => {
    // Reference: the Unicode Collation Algorithm as ICU implements it, through Intl.Collator.
    const names = [
      "Larkspur Bench",
      "larkspur bench 2",
      "Ore Hill",
      "Öre Hill North",
      "Quail Flat",
      "quartz ridge",
      "Ábrego Gulch",
      "Abbot's Draw",
      "O’Brien Gully",
      "Oak Gully",
      "Østby Flat",
      "Oster Wash",
      "Łoś Bench",
      "Lost Bench",
      "Æther Ridge",
      "Afton Draw",
      "Straße Gulch",
      "Strata Knoll",
    ];
    expect([...names].sort(compareNames)).toEqual([...names].sort(new Intl.Collator("en").compare));
  });

  it("keeps an order of its own (code points: upper case first) for names equal but for case or accents", () => {
    // The same names in any order come out in one order (code points decide the tie).
    expect(["ore", "Óre", "Ore"].sort(compareNames)).toEqual(["Ore", "ore", "Óre"]);
    expect(["Óre", "Ore", "ore"].sort(compareNames)).toEqual(["Ore", "ore", "Óre"]);
    expect(compareNames("Ore", "ore")).toBe(-compareNames("ore", "Ore"));
    expect(compareNames("Ore", "Ore")).toBe(0);
  });
});
