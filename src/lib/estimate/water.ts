import { EstimateInputError } from "./errors";

// CIPM recommendation: Tanaka, Girard, Davis, Peuto, Bignell, Metrologia 38 (2001) 301–309.
// Pure, air-free water at 101.325 kPa; valid 0–40 °C. Coefficients in °C and kg/m³.
const A1 = -3.983035;
const A2 = 301.797;
const A3 = 522528.9;
const A4 = 69.34881;
const A5 = 999.97495;

/** Temperature of greatest density: −a1 of the Tanaka formula. */
export const WATER_DENSEST_C = -A1;
export const WATER_TEMP_MIN_C = 0;
export const WATER_TEMP_MAX_C = 40;

/** Density of water in g/cm³ at tempC (°C). Arithmetic only, so every engine rounds alike. */
export function waterDensity(tempC: number): number {
  if (!Number.isFinite(tempC) || tempC < WATER_TEMP_MIN_C || tempC > WATER_TEMP_MAX_C) {
    throw new EstimateInputError("temperature_out_of_range", "waterTempC", `Water temperature must be between ${WATER_TEMP_MIN_C} and ${WATER_TEMP_MAX_C} °C.`);
  }
  const t1 = tempC + A1;
  const kgPerM3 = A5 * (1 - (t1 * t1 * (tempC + A2)) / (A3 * (tempC + A4)));
  return kgPerM3 / 1000;
}
