// Exact definitions from the international yard and pound agreement (1959), as tabulated in
// NIST Handbook 44, Appendix C, and NIST SP 811, Appendix B.8.
export const GRAIN_GRAMS = 0.06479891;
export const PENNYWEIGHT_GRAMS = 24 * GRAIN_GRAMS;
export const TROY_OUNCE_GRAMS = 480 * GRAIN_GRAMS;

export const MASS_UNITS = ["g", "ozt", "dwt", "gr"] as const;
export type MassUnit = (typeof MASS_UNITS)[number];

const GRAMS_PER_UNIT: Record<MassUnit, number> = {
  g: 1,
  ozt: TROY_OUNCE_GRAMS,
  dwt: PENNYWEIGHT_GRAMS,
  gr: GRAIN_GRAMS,
};

export const MASS_UNIT_LABELS: Record<MassUnit, string> = {
  g: "grams",
  ozt: "troy ounces",
  dwt: "pennyweights",
  gr: "grains",
};

export const gramsToTroyOunces = (g: number) => g / TROY_OUNCE_GRAMS;
export const gramsToPennyweights = (g: number) => g / PENNYWEIGHT_GRAMS;
export const gramsToGrains = (g: number) => g / GRAIN_GRAMS;
export const troyOuncesToGrams = (ozt: number) => ozt * TROY_OUNCE_GRAMS;

export function convertMass(grams: number, unit: MassUnit): number {
  return grams / GRAMS_PER_UNIT[unit];
}

export function toGrams(value: number, unit: MassUnit): number {
  return value * GRAMS_PER_UNIT[unit];
}

export const celsiusToFahrenheit = (c: number) => (c * 9) / 5 + 32;
export const fahrenheitToCelsius = (f: number) => ((f - 32) * 5) / 9;
