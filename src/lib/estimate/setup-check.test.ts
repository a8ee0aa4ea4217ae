import { describe, expect, it } from "vitest";
import { judgeSetupCheck, measureDensity, CHECK_COVERAGE } from "./setup-check";
import { REFERENCE_OBJECTS } from "./reference-objects";
import { roundToStep } from "./test-specimen";

// Independent calculations, typed here from their sources rather than taken from the engine.
// Tanaka et al., Metrologia 38 (2001) 301, check value: water at 20 °C is 998.2067 kg/m³.
const RHO_W_20 = 0.9982067;
// Kell, J. Chem. Eng. Data 20 (1975) 97 (as in Jones & Harris, J. Res. NIST 97 (1992) 335),
// g/cm³: agrees with Tanaka within about 3 ppm over 0–40 °C; used here for dρw/dT.
function kell(t: number): number {
  return (
    (999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3 + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5) / (1 + 16.87985e-3 * t) / 1000
  );
}
// OIML D 28: air 1.2 kg/m³, reference weights 8000 kg/m³; a scale shows m_c = (m − ρa·V)/(1 − ρa/ρref).
const AIR = 0.0012;
const K = 1 - AIR / 8.0;
/** Readings a perfect scale shows for a solid object of true mass m and density ρ, hung in water at 20 °C. */
function hangingReadings(mass: number, density: number) {
  const v = mass / density;
  return { air: (mass - AIR * v) / K, water: (mass - RHO_W_20 * v) / K, buoyancy: ((RHO_W_20 - AIR) * v) / K };
}
const SQRT3 = Math.sqrt(3);
const copper = REFERENCE_OBJECTS.find((r) => r.id === "copper")!;
const coin = REFERENCE_OBJECTS.find((r) => r.id === "gold-coin")!;

describe("measuring a density (the setup check's reading)", () => {
  it("gives the textbook density ρ = W·ρw/(W − W_water) with the air's buoyancy left out", () => {
    const m = measureDensity({ method: "hanging", airGrams: [50], waterGrams: [44.42], waterTempToleranceC: 0, airBuoyancyCorrection: false });
    // By hand with Tanaka's check value at 20 °C: 50 × 0.9982067 / 5.58.
    expect(m.density).toBeCloseTo((50 * RHO_W_20) / 5.58, 5);
  });

  it("has the standard uncertainty of the hand-derived sensitivities (GUM, JCGM 100:2008 eq. 10)", () => {
    const A = 50;
    const W = 44.42;
    const m = measureDensity({
      method: "hanging",
      airGrams: [A],
      waterGrams: [W],
      waterTempC: 20,
      waterTempToleranceC: 2,
      scaleResolutionGrams: 0.01,
      airBuoyancyCorrection: false,
    });
    // ∂ρ/∂A = −W·ρw/(A − W)², ∂ρ/∂W = A·ρw/(A − W)², ∂ρ/∂ρw = A/(A − W); dρw/dT from Kell.
    // Each reading: rectangular over ± 0.02 g (the default accuracy of a 0.01 g scale, 2 steps), u = 0.02/√3.
    // Temperature: rectangular over 20 ± 2 °C, u = 2/√3.
    const d = A - W;
    const uReading = 0.02 / SQRT3;
    const dRhoWdT = (kell(20.001) - kell(19.999)) / 0.002;
    const terms = [((-W * RHO_W_20) / d ** 2) * uReading, ((A * RHO_W_20) / d ** 2) * uReading, (A / d) * dRhoWdT * (2 / SQRT3)];
    const byHand = Math.sqrt(terms.reduce((s, x) => s + x * x, 0));
    expect(m.standardUncertainty / byHand).toBeCloseTo(1, 3);
  });

  it("agrees with a Monte Carlo propagation of the same distributions (JCGM 101:2008)", () => {
    const A = 31.1;
    const W = 29.49;
    const m = measureDensity({ method: "hanging", airGrams: [A], waterGrams: [W], waterTempC: 20, waterTempToleranceC: 2, airBuoyancyCorrection: false });
    // A plain linear congruential generator of our own; Kell's water for each drawn temperature.
    let seed = 12345;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    const n = 40_000;
    let sum = 0;
    let sum2 = 0;
    for (let i = 0; i < n; i++) {
      const a = A + (2 * rand() - 1) * 0.02;
      const w = W + (2 * rand() - 1) * 0.02;
      const rho = (a * kell(18 + 4 * rand())) / (a - w);
      sum += rho;
      sum2 += rho * rho;
    }
    const sd = Math.sqrt((sum2 - (sum * sum) / n) / (n - 1));
    expect(m.standardUncertainty / sd).toBeGreaterThan(0.97);
    expect(m.standardUncertainty / sd).toBeLessThan(1.03);
  });

  it("corrects the air's buoyancy by default (OIML D 28), for both ways of reading", () => {
    const r = hangingReadings(50, 8.96);
    const exact = { scaleResolutionGrams: 1e-9, scaleAccuracyGrams: 1e-9, waterTempToleranceC: 0 };
    expect(measureDensity({ method: "hanging", airGrams: [r.air], waterGrams: [r.water], ...exact }).density).toBeCloseTo(8.96, 4);
    expect(measureDensity({ method: "buoyancy", airGrams: [r.air], waterGrams: [r.buoyancy], ...exact }).density).toBeCloseTo(8.96, 4);
  });
});

describe("the setup check's verdict", () => {
  const onScale = (g: number) => roundToStep(g, 0.01);

  it("passes a sound rig: a 50 g copper slug read on a 0.01 g scale", () => {
    const r = hangingReadings(50, copper.density);
    const check = judgeSetupCheck({ method: "hanging", airGrams: [onScale(r.air)], waterGrams: [onScale(r.water)] }, copper);
    expect(check.passed).toBe(true);
    expect(Math.abs(check.difference)).toBeLessThan(0.01);
    // Expected error by hand: each reading ± 0.02 g rectangular on 5.58 g of water pushed aside,
    // so u(ρ)/ρ ≈ √2 × 0.0115 / 5.58 ≈ 0.29 %; with the slug's own 0.02: 2 × √(0.026² + 0.02²) ≈ 0.066 g/cm³.
    expect(check.allowedDifference).toBeGreaterThan(0.06);
    expect(check.allowedDifference).toBeLessThan(0.07);
    expect(check.allowedDifference).toBeCloseTo(CHECK_COVERAGE * Math.sqrt(check.measuredUncertainty ** 2 + 0.02 ** 2), 12);
    expect(check.coarse).toBe(false);
  });

  it("fails a rig whose basket touches the cup (the in-water reading 0.10 g heavy), and says how far off", () => {
    const r = hangingReadings(50, copper.density);
    const check = judgeSetupCheck({ method: "hanging", airGrams: [onScale(r.air)], waterGrams: [onScale(r.water + 0.1)] }, copper);
    expect(check.passed).toBe(false);
    // By hand: the water pushed aside reads 5.48 g for 5.58: ρ ≈ 8.96 × 5.58 / 5.48 ≈ 9.12 g/cm³, 1.8 % heavy.
    expect(check.difference).toBeCloseTo(8.96 * (5.58 / 5.48) - 8.96, 1);
    expect(check.differencePercent).toBeGreaterThan(1.6);
    expect(check.differencePercent).toBeLessThan(2.0);
  });

  it("fails a wet line tared dry: the buoyancy vessel reading 0.05 g light", () => {
    const r = hangingReadings(50, copper.density);
    const check = judgeSetupCheck({ method: "buoyancy", airGrams: [onScale(r.air)], waterGrams: [onScale(r.buoyancy - 0.05)] }, copper);
    expect(check.passed).toBe(false);
    expect(check.difference).toBeGreaterThan(0);
  });

  it("passes a one-ounce 999.9 coin on a 0.01 g scale; a quarter-ounce coin's check is too coarse to prove much", () => {
    // 1 troy ounce = 31.1034768 g (NIST SP 811 B.8 / Handbook 44 App. C).
    const r = hangingReadings(31.1034768, coin.density);
    const check = judgeSetupCheck({ method: "hanging", airGrams: [onScale(r.air)], waterGrams: [onScale(r.water)] }, coin);
    expect(check.passed).toBe(true);
    // 1.61 g of water pushed aside: by hand u(ρ)/ρ = 0.0115 × √(1 + (W/A)²) / 1.61 ≈ 0.99 %, so 2u ≈ 0.38 g/cm³,
    // just inside 2 % of 19.32 (0.386).
    expect(check.allowedDifference).toBeGreaterThan(0.37);
    expect(check.allowedDifference).toBeLessThan(0.39);
    expect(check.coarse).toBe(false);
    const quarter = hangingReadings(31.1034768 / 4, coin.density);
    const small = judgeSetupCheck({ method: "hanging", airGrams: [onScale(quarter.air)], waterGrams: [onScale(quarter.water)] }, coin);
    // 0.40 g of water pushed aside: 2u ≈ 4 × 0.38 ≈ 1.5 g/cm³, near 8 % of the coin's density.
    expect(small.coarse).toBe(true);
  });

  it("refuses a reference that is not a density", () => {
    expect(() => judgeSetupCheck({ method: "hanging", airGrams: [10], waterGrams: [6] }, { density: 0.5, uncertainty: 0 })).toThrow(
      /reference object's density/,
    );
    expect(() => judgeSetupCheck({ method: "hanging", airGrams: [10], waterGrams: [6] }, { density: 2.65, uncertainty: -1 })).toThrow(/uncertainty/);
  });
});
