import type { Metadata } from "next";
import { ClaimsMap } from "@/components/club/claims-map";
import { ProductionChart } from "@/components/club/production-chart";
import { addTotals, NO_TOTALS } from "@/lib/club/totals";
import { gramsToPennyweights } from "@/lib/estimate/units";
import { formatGrams } from "@/lib/format";
import { seasonNow } from "@/lib/season";
import { requirePageActor } from "@/server/auth/current";
import { listClaims } from "@/server/club/claims";
import { productionByMonth } from "@/server/club/production";
import { clubSettings } from "@/server/club/settings";
import { clubSeasonByClaim } from "@/server/queries/tally";

export const metadata: Metadata = { title: "Club console" };

export default async function ClubConsolePage() {
  await requirePageActor("viewLedger", "/club");
  const season = seasonNow(clubSettings().timeZone);
  const byClaim = clubSeasonByClaim(season);
  const claims = listClaims();
  const labels = Object.fromEntries(
    claims.map((c) => {
      const t = byClaim.find((b) => b.claimId === c.id);
      return [c.id, `${c.name}: ${t ? formatGrams(t.totals.fineGrams) : "0 g"} fine`];
    }),
  );
  const total = byClaim.reduce((t, c) => addTotals(t, c.totals), NO_TOTALS);

  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-2xl font-bold">Club console · {season} season</h1>

      <section aria-labelledby="claims-title" className="sheet overflow-x-auto">
        <h2 id="claims-title" className="heading-bar mb-3 text-lg">
          Production by claim
        </h2>
        <table className="w-full text-left">
          <thead>
            <tr className="border-b-2 border-rule">
              <th className="py-2 pr-3">Claim</th>
              <th className="py-2 pr-3">Kind</th>
              <th className="py-2 pr-3 text-right">Finds</th>
              <th className="py-2 pr-3 text-right">Members</th>
              <th className="py-2 pr-3 text-right">Fine gold (est.)</th>
              <th className="py-2 pr-3 text-right">at worst</th>
              <th className="py-2 text-right">Recorded weight</th>
            </tr>
          </thead>
          <tbody>
            {byClaim.map((c) => (
              <tr key={c.claimId ?? "none"} className="border-b border-rule">
                <td className="py-2 pr-3 font-bold">{c.claimName ?? "Off-claim"}</td>
                <td className="py-2 pr-3 capitalize">{c.kind ?? "—"}</td>
                <td className="figure py-2 pr-3 text-right">{c.totals.finds}</td>
                <td className="figure py-2 pr-3 text-right">{c.members}</td>
                <td className="figure py-2 pr-3 text-right">{formatGrams(c.totals.fineGrams)}</td>
                <td className="figure py-2 pr-3 text-right text-sm">
                  {formatGrams(c.totals.fineLow)} – {formatGrams(c.totals.fineHigh)}
                </td>
                <td className="figure py-2 text-right">{formatGrams(c.totals.weightGrams)}</td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr className="font-bold">
              <td className="py-2 pr-3" colSpan={2}>
                Club total
              </td>
              <td className="figure py-2 pr-3 text-right" data-testid="club-total-finds">
                {total.finds}
              </td>
              <td />
              <td className="figure py-2 pr-3 text-right">
                {formatGrams(total.fineGrams)} · {gramsToPennyweights(total.fineGrams).toFixed(1)} dwt
              </td>
              <td className="figure py-2 pr-3 text-right text-sm">
                {formatGrams(total.fineLow)} – {formatGrams(total.fineHigh)}
              </td>
              <td className="figure py-2 text-right">{formatGrams(total.weightGrams)}</td>
            </tr>
          </tfoot>
        </table>
        <p className="mt-3 text-sm text-ink-soft">
          Fine gold is estimated for every find: specimens from their weigh-ins, other gold from its weight at the purity the member recorded or the
          claim&apos;s fineness. &ldquo;At worst&rdquo; is the range over those assumptions. An estimate is not an assay.
        </p>
      </section>

      <div className="grid gap-4 xl:grid-cols-2">
        <section aria-labelledby="chart-title" className="sheet">
          <h2 id="chart-title" className="heading-bar mb-3 text-lg">
            Production per month
          </h2>
          <ProductionChart months={productionByMonth(season)} />
        </section>
        <section aria-labelledby="map-title" className="sheet">
          <h2 id="map-title" className="heading-bar mb-3 text-lg">
            Claims and their season
          </h2>
          <ClaimsMap claims={claims} labels={labels} />
        </section>
      </div>
    </div>
  );
}
