import { describe, expect, it } from "vitest";
import { waterDensity } from "./water";

describe("waterDensity", () => {
  // Check values published with the formula: Tanaka et al., Metrologia 38 (2001) 301–309, Table 1 (kg/m³).
  const tanaka: [number, number][] = [
    [0, 999.8428],
    [10, 999.7027],
    [20, 998.2067],
    [30, 995.6488],
  ];
  it.each(tanaka)("at %d °C matches Tanaka 2001 to 1e-4 kg/m³", (t, expected) => {
    expect(Math.abs(waterDensity(t) * 1000 - expected)).toBeLessThanOrEqual(1e-4 + 1e-9);
  });

  // Kell, J. Chem. Eng. Data 20 (1975) 97–105, as reproduced in Jones & Harris, J. Res. NIST 97 (1992) 335.
  // Denominator 1 + 16.879850e-3·t (some reprints misprint it as 16.897850e-3).
  const kell = (t: number) =>
    (999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3 + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5) / (1 + 16.87985e-3 * t);

  it("agrees with Kell 1975 within 5 ppm from 0 to 40 °C", () => {
    for (let t = 0; t <= 40; t += 0.5) {
      const ppm = (Math.abs(waterDensity(t) * 1000 - kell(t)) / kell(t)) * 1e6;
      expect(ppm, `at ${t} °C`).toBeLessThan(5);
    }
  });

  it("refuses temperatures outside 0–40 °C, naming the field", () => {
    expect(() => waterDensity(-1)).toThrow(expect.objectContaining({ field: "waterTempC", code: "temperature_out_of_range" }));
    expect(() => waterDensity(41)).toThrow(/between 0 and 40/);
    expect(() => waterDensity(Number.NaN)).toThrow();
  });
});
