import { describe, expect, it } from "vitest";
import { goldAlloyDensity, karatToFineness } from "./alloy";

describe("goldAlloyDensity", () => {
  // Rose, The Metallurgy of Gold (6th ed., 1915), Table XIV: specific gravity of Au–Ag alloys
  // at 15 °C by parts per thousand of gold. The 333 row (13.00) is a known misprint and left out.
  const rose: [number, number][] = [
    [1000, 19.26],
    [917, 18.08],
    [879, 17.54],
    [843, 16.96],
    [750, 16.03],
    [667, 15.07],
    [500, 13.6],
    [250, 11.78],
    [167, 11.28],
  ];
  it.each(rose)("at %d ‰ is within 1 %% of Rose's %f", (fineness, sg) => {
    expect(Math.abs(goldAlloyDensity(fineness) - sg) / sg).toBeLessThan(0.01);
  });

  it("is pure gold (CRC Handbook, 19.32 g/cm³ at 20 °C) at 1000 ‰", () => {
    expect(goldAlloyDensity(1000)).toBeCloseTo(19.32, 12);
  });

  it("refuses fineness outside (0, 1000]", () => {
    expect(() => goldAlloyDensity(0)).toThrow(expect.objectContaining({ field: "finenessPermille" }));
    expect(() => goldAlloyDensity(1001)).toThrow();
  });

  it("converts karat to fineness (a karat is 1/24 by mass)", () => {
    expect(karatToFineness(18)).toBe(750);
    expect(karatToFineness(24)).toBe(1000);
  });
});
