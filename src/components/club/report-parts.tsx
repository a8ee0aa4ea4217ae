import type { LedgerSummary } from "@/lib/club/ledger";
import { gramsToPennyweights, gramsToTroyOunces } from "@/lib/estimate/units";
import { FINE_BASIS_LABELS, type FineBasis } from "@/lib/figures/fine-basis";
import { formatGrams } from "@/lib/format";

const money = (v: number, c: string | null) => `${v.toFixed(2)} ${c ?? ""}`.trim();

/** A total mass as every console screen shows it: grams, troy ounces and pennyweights, and its worst cases when it has them. */
export function MassTotal({ grams, low, high, testId }: { grams: number; low?: number; high?: number; testId?: string }) {
  return (
    <>
      <p className="figure text-xl font-bold" data-testid={testId}>
        {formatGrams(grams)}
      </p>
      <p className="figure text-sm">
        {gramsToTroyOunces(grams).toFixed(3)} ozt · {gramsToPennyweights(grams).toFixed(2)} dwt
      </p>
      {low !== undefined && high !== undefined && (
        <p className="figure text-sm">
          at worst {formatGrams(low)} – {formatGrams(high)}
        </p>
      )}
    </>
  );
}

/** The report's headline figures. */
export function ReportTotals({ summary: s, priceToday }: { summary: LedgerSummary; priceToday: boolean }) {
  return (
    <section className="grid grid-cols-4 gap-4 border-y-2 border-ink py-3" data-testid="report-totals">
      <div>
        <p className="text-sm">Finds</p>
        <p className="figure text-xl font-bold">{s.finds}</p>
      </div>
      <div>
        <p className="text-sm">Fine gold (estimated)</p>
        <MassTotal grams={s.fineGrams} low={s.fineLow} high={s.fineHigh} testId="report-fine" />
      </div>
      <div>
        <p className="text-sm">Recorded weight</p>
        <MassTotal grams={s.weightGrams} />
      </div>
      <div>
        <p className="text-sm">Value at {priceToday ? "today's" : "each find's date"} reference price</p>
        <p className="figure text-xl font-bold">{money(s.value, s.currency)}</p>
        <p className="figure text-sm">
          at worst {money(s.valueLow, s.currency)} – {money(s.valueHigh, s.currency)}
        </p>
      </div>
    </section>
  );
}

/** Subtotals per member or per claim, each with its fine gold, range and value. */
export function ReportSubtotals({ title, rows, testId }: { title: string; rows: { label: string; summary: LedgerSummary }[]; testId: string }) {
  return (
    <section aria-label={title}>
      <h2 className="text-lg font-bold">{title}</h2>
      <table className="w-full text-left text-sm" data-testid={testId}>
        <thead>
          <tr className="border-b-2 border-ink">
            <th className="py-1 pr-2">{title.replace("Per ", "").replace(/^\w/, (c) => c.toUpperCase())}</th>
            <th className="py-1 pr-2 text-right">Finds</th>
            <th className="py-1 pr-2 text-right">Fine gold (est.)</th>
            <th className="py-1 pr-2 text-right">at worst</th>
            <th className="py-1 pr-2 text-right">Recorded weight</th>
            <th className="py-1 text-right">Value</th>
          </tr>
        </thead>
        <tbody>
          {[...rows]
            .sort((a, b) => b.summary.fineGrams - a.summary.fineGrams)
            .map((r) => (
              <tr key={r.label} className="border-b border-rule">
                <td className="py-1 pr-2">
                  <bdi>{r.label}</bdi>
                </td>
                <td className="figure py-1 pr-2 text-right">{r.summary.finds}</td>
                <td className="figure py-1 pr-2 text-right">{formatGrams(r.summary.fineGrams)}</td>
                <td className="figure py-1 pr-2 text-right">
                  {formatGrams(r.summary.fineLow)} – {formatGrams(r.summary.fineHigh)}
                </td>
                <td className="figure py-1 pr-2 text-right">{formatGrams(r.summary.weightGrams)}</td>
                <td className="figure py-1 text-right">{money(r.summary.value, r.summary.currency)}</td>
              </tr>
            ))}
        </tbody>
      </table>
    </section>
  );
}

/** How the figures were reached, and what is flagged. */
export function ReportFigures({ summary: s }: { summary: LedgerSummary }) {
  const bases = Object.entries(s.byBasis) as [FineBasis, number][];
  const none = s.finds - s.figured;
  return (
    <section aria-label="How the figures were reached" className="text-sm" data-testid="report-bases">
      <h2 className="text-lg font-bold">How the figures were reached</h2>
      <ul className="list-disc pl-5">
        {bases.map(([b, n]) => (
          <li key={b}>
            {n} find{n === 1 ? "" : "s"} by {FINE_BASIS_LABELS[b]}
          </li>
        ))}
        {none > 0 && (
          <li>
            {none} find{none === 1 ? "" : "s"} without a figure (specimens not yet weighed, or no weight recorded)
          </li>
        )}
        {s.mismatched > 0 && (
          <li className="font-bold">
            {s.mismatched} weigh-in{s.mismatched === 1 ? "" : "s"} far from the find&apos;s recorded weight: check before relying on them
          </li>
        )}
      </ul>
    </section>
  );
}
