import { describe, expect, it } from "vitest";
import { wholeNumber } from "./whole-number";

describe("a whole number in a query string (wholeNumber)", () => {
  const season = wholeNumber("season", 2000, 2100);

  it.each([
    ["2026", 2026],
    [2026, 2026],
    ["2000", 2000],
    ["2100", 2100],
  ])("reads %j as %d", (input, out) => {
    expect(season.parse(input)).toBe(out);
  });

  // Each of these JavaScript's Number reads as a number (z.coerce did): none is how anyone writes a season.
  it.each(["0x7d9", "2.026e3", " 2026", "2026 ", "+2026", "2026.0", "", "٢٠٢٦", "2026\n", "Infinity", "0b11111101010"])(
    "refuses %j, saying how to write it",
    (input) => {
      const r = season.safeParse(input);
      expect(r.success).toBe(false);
      expect(r.error!.issues[0].message).toBe("Give season as a whole number in decimal digits.");
    },
  );

  it("says which end a number is past, in its own words where given", () => {
    expect(season.safeParse("1999").error!.issues[0].message).toBe("season must be at least 2000.");
    expect(season.safeParse(2101).error!.issues[0].message).toBe("season must be at most 2100.");
    expect(season.safeParse(2026.5).error!.issues[0].message).toBe("Give season as a whole number in decimal digits.");
    const offset = wholeNumber("offset", 0, 10, { min: "offset cannot be negative" });
    expect(offset.safeParse("-1").error!.issues[0].message).toBe("offset cannot be negative");
  });
});
