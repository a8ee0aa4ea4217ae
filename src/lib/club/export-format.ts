import type { ExportRow } from "./ledger";

/** Decimals each exported number keeps: what its measurement can carry (common practice of the trade's scales and GPS). */
const PLACES: Partial<Record<keyof ExportRow, number>> = {
  weightGrams: 3,
  alloyGrams: 3,
  fineGrams: 3,
  fineLow: 3,
  fineHigh: 3,
  price: 2,
  value: 2,
  lat: 6,
  lon: 6,
  depthCm: 0,
};

/** A row's values for the CSV, numbers rounded to sensible places, the instant as ISO 8601. */
export function exportCells<K extends keyof ExportRow>(row: ExportRow, columns: readonly K[]): (string | number | boolean | null)[] {
  return columns.map((c) => {
    const v = row[c];
    if (c === "foundAt") return new Date(v as number).toISOString();
    const places = PLACES[c];
    if (typeof v === "number" && places !== undefined) return Number(v.toFixed(places));
    return v as string | number | boolean | null;
  });
}
