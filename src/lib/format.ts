import { convertMass, type MassUnit } from "./estimate/units";

const DIGITS: Record<MassUnit, number> = { g: 2, ozt: 3, dwt: 2, gr: 1 };

export function formatGrams(grams: number, unit: MassUnit = "g"): string {
  return `${convertMass(grams, unit).toFixed(DIGITS[unit])} ${unit}`;
}

export function formatDay(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

/** Local date and time, as the member's device shows it. */
export function formatWhen(ms: number): string {
  return new Date(ms).toLocaleString(undefined, { dateStyle: "medium", timeStyle: "short" });
}

/** For <input type="datetime-local">, in local time. */
export function toLocalInput(ms: number): string {
  const d = new Date(ms);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}
