import { describe, expect, it } from "vitest";
import { monthBars } from "./month-bars";
import { NO_TOTALS } from "./totals";

const row = (month: string, claimName: string | null, fineGrams: number, claimId = claimName) => ({ ...NO_TOTALS, month, claimId, claimName, fineGrams });

describe("fine gold per month, stacked by claim", () => {
  it("sums each claim's rows per month, months in order, off-claim finds named", () => {
    const bars = monthBars([row("2026-06", "Larkspur", 2), row("2026-05", "Larkspur", 1.5), row("2026-06", null, 0.25), row("2026-06", "Larkspur", 1)]);
    expect(bars.months).toEqual(["2026-05", "2026-06"]);
    expect(bars.series).toEqual([
      { id: "Larkspur", name: "Larkspur", values: [1.5, 3] },
      { id: "", name: "Off-claim", values: [0, 0.25] },
    ]);
  });

  it("keeps two claims of the same name apart", () => {
    const bars = monthBars([row("2026-06", "Bench", 1, "c1"), row("2026-06", "Bench", 2, "c2")]);
    expect(bars.series.map((s) => [s.id, s.values[0]])).toEqual([
      ["c1", 1],
      ["c2", 2],
    ]);
  });

  it("puts the scale's top on a round gridline at or above the tallest month", () => {
    const bars = monthBars([row("2026-06", "A", 3), row("2026-06", "B", 0.25), row("2026-07", "A", 1)]);
    expect(bars.top).toBeGreaterThanOrEqual(3.25);
    expect(bars.ticks[0]).toBe(0);
    expect(bars.ticks.at(-1)).toBe(bars.top);
    expect(bars.ticks).toEqual([0, 1, 2, 3, 4]);
    expect(monthBars([row("2026-06", "A", 0.07)]).ticks).toEqual([0, 0.02, 0.04, 0.06, 0.08]);
  });

  it("has no scale when nothing was found", () => {
    expect(monthBars([])).toEqual({ months: [], series: [], top: 0, ticks: [] });
  });
});
