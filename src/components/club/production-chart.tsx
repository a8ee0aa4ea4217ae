import { monthBars } from "@/lib/club/month-bars";
import type { MonthlyProduction } from "@/lib/club/production";
import { formatGrams, formatMonth } from "@/lib/format";

// Distinct in daylight and for common colour blindness (blue/orange/teal/purple/brown).
const COLOURS = ["#1f5fa8", "#c0601a", "#1a8073", "#7a3f9a", "#6b4a2b", "#a1265b"];

/**
 * Estimated fine gold per month, stacked by claim. Drawn on the server in plain HTML: the
 * console's first screen sends no chart code, and every label is text at the page's size.
 * The figures behind the bars are in a table under them.
 */
export function ProductionChart({ months: rows }: { months: MonthlyProduction[] }) {
  const { months, series, top, ticks } = monthBars(rows);
  const total = series.reduce((n, s) => n + s.values.reduce((a, v) => a + v, 0), 0);
  if (months.length === 0 || top === 0) return <p className="text-ink-soft">No fine gold recorded this season yet.</p>;
  const colour = (i: number) => COLOURS[i % COLOURS.length];
  return (
    <figure className="flex flex-col gap-3" data-testid="production-chart">
      <div className="flex gap-2">
        <div className="relative w-14 shrink-0 text-right text-sm text-ink-soft" aria-hidden="true">
          {ticks.map((t) => (
            <span key={t} className="absolute right-0 translate-y-1/2" style={{ bottom: `${(t / top) * 100}%` }}>
              {t} g
            </span>
          ))}
        </div>
        <div className="relative h-56 flex-1 border-b-2 border-l-2 border-edge">
          {ticks.slice(1).map((t) => (
            <div key={t} className="absolute inset-x-0 border-t border-rule" style={{ bottom: `${(t / top) * 100}%` }} aria-hidden="true" />
          ))}
          <div className="absolute inset-0 flex items-end justify-around gap-1 px-1">
            {months.map((month, i) => {
              const sum = series.reduce((n, s) => n + s.values[i], 0);
              return (
                <div
                  key={month}
                  className="flex w-full max-w-12 flex-col-reverse"
                  style={{ height: `${(sum / top) * 100}%` }}
                  title={`${formatMonth(month)}: ${formatGrams(sum)}`}
                  aria-hidden="true"
                >
                  {series.map((s, k) =>
                    s.values[i] > 0 ? <div key={s.id} style={{ height: `${(s.values[i] / sum) * 100}%`, background: colour(k) }} /> : null,
                  )}
                </div>
              );
            })}
          </div>
        </div>
      </div>
      <div className="ml-16 flex justify-around gap-1 text-sm text-ink-soft" aria-hidden="true">
        {months.map((month) => (
          <span key={month} className="w-full max-w-12 text-center">
            {formatMonth(month)}
          </span>
        ))}
      </div>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        <span className="text-ink-soft">Grams of fine gold (estimated), {formatGrams(total)} in all:</span>
        {series.map((s, k) => (
          <span key={s.id} className="flex items-center gap-1">
            <span className="inline-block size-3 rounded-sm" style={{ background: colour(k) }} aria-hidden="true" />
            {s.name}
          </span>
        ))}
      </figcaption>
      <details className="text-sm">
        <summary className="cursor-pointer">The figures behind the bars</summary>
        <div className="overflow-x-auto">
          <table className="mt-2 w-full text-left">
            <thead>
              <tr className="border-b-2 border-rule">
                <th className="py-1 pr-3">Month</th>
                {series.map((s) => (
                  <th key={s.id} className="py-1 pr-3 text-right">
                    {s.name}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {months.map((month, i) => (
                <tr key={month} className="border-b border-rule">
                  <th className="py-1 pr-3 font-normal">{formatMonth(month)}</th>
                  {series.map((s) => (
                    <td key={s.id} className="figure py-1 pr-3 text-right">
                      {formatGrams(s.values[i])}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </figure>
  );
}
