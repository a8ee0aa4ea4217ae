import { convertMass, type MassUnit } from "@/lib/estimate/units";

const DIGITS: Record<MassUnit, number> = { g: 2, ozt: 3, dwt: 2, gr: 1 };

export function formatGrams(grams: number, unit: MassUnit = "g"): string {
  return `${convertMass(grams, unit).toFixed(DIGITS[unit])} ${unit}`;
}

export function formatDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}
