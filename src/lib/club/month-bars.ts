import type { MonthlyProduction } from "./production";

export type MonthBars = {
  months: string[];
  series: { id: string; name: string; values: number[] }[];
  /** The top of the scale and its gridlines, in grams: round numbers above the tallest month. */
  top: number;
  ticks: number[];
};

const OFF_CLAIM = "Off-claim";

/** A round step (1, 2 or 5 × 10ⁿ) that splits `max` into at most `count` parts. */
function niceStep(max: number, count: number): number {
  const raw = max / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  return [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
}

/** Fine gold per month stacked by claim, in months' order, with a scale of round gridlines. */
export function monthBars(rows: MonthlyProduction[], gridlines = 4): MonthBars {
  const months = [...new Set(rows.map((m) => m.month))].sort();
  // One series per claim (by id: two claims may share a name), named by the claim.
  const ids = [...new Set(rows.map((m) => m.claimId))];
  const series = ids.map((id) => ({
    id: id ?? "",
    name: rows.find((m) => m.claimId === id)?.claimName ?? OFF_CLAIM,
    values: months.map((month) => rows.filter((m) => m.month === month && m.claimId === id).reduce((n, m) => n + m.fineGrams, 0)),
  }));
  const tallest = Math.max(0, ...months.map((_, i) => series.reduce((n, s) => n + s.values[i], 0)));
  if (tallest <= 0) return { months, series, top: 0, ticks: [] };
  const step = niceStep(tallest, gridlines);
  const top = Math.ceil(tallest / step) * step;
  const ticks = Array.from({ length: Math.round(top / step) + 1 }, (_, i) => Number((i * step).toPrecision(12)));
  return { months, series, top, ticks };
}
