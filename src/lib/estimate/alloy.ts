import { EstimateInputError } from "./errors";

/** Pure gold, g/cm³ at 20 °C: CRC Handbook of Chemistry and Physics ("sp. gr. 19.32 (20C)"). */
export const GOLD_DENSITY = 19.32;
/** Pure silver, g/cm³: CRC Handbook of Chemistry and Physics. */
export const SILVER_DENSITY = 10.49;

/**
 * Density (g/cm³) of a gold–silver alloy of the given fineness (‰ gold by mass), by ideal
 * mixing of volumes: 1/ρ = w/ρAu + (1 − w)/ρAg. Kraut & Stern (Gold Bulletin 33, 2000) show
 * the deviation from ideal mixing is small beside the error of a hydrostatic weighing.
 */
export function goldAlloyDensity(finenessPermille: number): number {
  if (!Number.isFinite(finenessPermille) || finenessPermille <= 0 || finenessPermille > 1000) {
    throw new EstimateInputError("fineness_out_of_range", "finenessPermille", "Gold fineness must be more than 0 and at most 1000 parts per thousand.");
  }
  const w = finenessPermille / 1000;
  return 1 / (w / GOLD_DENSITY + (1 - w) / SILVER_DENSITY);
}

/**
 * The fineness (‰) whose alloy has the given density: goldAlloyDensity turned round. No
 * gold–silver alloy is lighter than silver (0 here) and none is denser than gold (above 1000
 * here, which no fineness reaches).
 */
export function finenessAtDensity(density: number): number {
  const w = (1 / SILVER_DENSITY - 1 / density) / (1 / SILVER_DENSITY - 1 / GOLD_DENSITY);
  return Math.max(0, w * 1000);
}

/** Fineness (‰) from karat: a karat is 1/24 by mass. */
export function karatToFineness(karat: number): number {
  return (karat / 24) * 1000;
}
