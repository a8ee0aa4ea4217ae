import type { Metadata } from "next";
import { PrintButton } from "@/components/club/print-button";
import { LandownerStatement } from "@/components/club/landowner-statement";
import { ReportFigures, ReportSubtotals, ReportTotals } from "@/components/club/report-parts";
import { ledgerQuerySchema } from "@/lib/club/ledger";
import { KIND_LABELS } from "@/lib/entities/find";
import { FINE_BASIS_LABELS } from "@/lib/figures/fine-basis";
import { formatGrams } from "@/lib/format";
import { clubDay } from "@/lib/time/club-day";
import { withoutBidiControls as plain } from "@/lib/text/safe-text";
import { requirePageActor } from "@/server/auth/current";
import { listClaims } from "@/server/club/claims";
import { ledgerPage, ledgerRows, ledgerSubtotals } from "@/server/club/ledger";
import { clubSettings } from "@/server/club/settings";
import { listMembers } from "@/server/queries/members";

export const metadata: Metadata = { title: "Production report" };

type Props = { searchParams: Promise<Record<string, string>> };

/** Rows the printed report lists one by one; past this, the subtotals stand and the CSV has every row. */
const REPORT_ROWS = 5000;

/**
 * A printable report of what the ledger's filters select: the period, totals with their worst
 * cases and value, how figures were reached, subtotals per member and per claim, the finds,
 * page numbers and the caution that estimates are not assays.
 */
export default async function ReportPage({ searchParams }: Props) {
  await requirePageActor("viewLedger", "/club/report");
  const { form, ...filters } = await searchParams;
  const parsed = ledgerQuerySchema.safeParse(filters);
  if (!parsed.success) {
    const [issue] = parsed.error.issues;
    const field = issue.path.map(String).join(".");
    return (
      <p className="field-error">
        These report filters are not valid: {field ? `check ${field}: ` : ""}
        {issue.message}
      </p>
    );
  }
  const q = parsed.data;
  const { summary } = ledgerPage({ ...q, page: 1, pageSize: 1 });
  const rows = ledgerRows(q, REPORT_ROWS);
  const claims = listClaims();
  const club = clubSettings();
  const members = listMembers();
  const claim = q.claimId ? claims.find((c) => c.id === q.claimId) : undefined;
  const member = q.memberId ? members.find((m) => m.id === q.memberId) : undefined;
  const memberName = new Map(members.map((m) => [m.id, plain(m.name ?? m.email)]));
  const claimLabel = new Map(claims.map((c) => [c.id, `${plain(c.name)}${c.agencyRef ? ` (${plain(c.agencyRef)})` : ""}`]));
  const printedOn = clubDay(new Date().getTime(), club.timeZone);
  const period = q.season ? `Season ${q.season}` : q.from || q.to ? `${q.from ?? "…"} to ${q.to ?? "…"}` : "All seasons";
  if (form === "landowner") {
    if (!claim) return <p className="field-error">Choose a claim in the ledger&apos;s filters for its landowner&apos;s statement.</p>;
    return (
      <LandownerStatement
        club={plain(club.name)}
        claim={claim}
        claimLabel={claimLabel.get(claim.id) ?? claim.name}
        period={period}
        summary={summary}
        printedOn={printedOn}
      />
    );
  }
  const byMember = ledgerSubtotals(q, "member").map((g) => ({ label: memberName.get(g.id ?? "") ?? "—", summary: g.summary }));
  const byClaim = ledgerSubtotals(q, "claim").map((g) => ({ label: g.id ? (claimLabel.get(g.id) ?? "—") : "Off the club's claims", summary: g.summary }));

  return (
    <article className="report flex flex-col gap-4 bg-sheet p-6 print:p-0" data-testid="report">
      <header className="flex items-start justify-between gap-4">
        <div>
          <p className="font-bold">{plain(club.name)}</p>
          <h1 className="text-2xl font-bold">Production report — {claim ? claimLabel.get(claim.id) : member ? memberName.get(member.id) : "whole club"}</h1>
          <p>
            {period}
            {q.kind ? ` · ${KIND_LABELS[q.kind]} only` : ""}
            {q.state === "changed" ? " · changed since the query only" : q.state ? ` · ${q.state} only` : ""} · printed {printedOn}
          </p>
        </div>
        <PrintButton />
      </header>
      <ReportTotals summary={summary} priceToday={q.price === "today"} />
      {!q.memberId && <ReportSubtotals title="Per member" rows={byMember} testId="by-member" />}
      {!q.claimId && <ReportSubtotals title="Per claim" rows={byClaim} testId="by-claim" />}
      <ReportFigures summary={summary} />
      <section aria-labelledby="finds-title">
        <h2 id="finds-title" className="text-lg font-bold">
          Finds {rows.length < summary.finds ? `(the first ${rows.length} of ${summary.finds}; the CSV export has every row)` : ""}
        </h2>
        <table className="w-full text-left text-sm">
          <thead>
            <tr className="border-b-2 border-ink">
              <th className="py-1 pr-2">Found</th>
              <th className="py-1 pr-2">Member</th>
              <th className="py-1 pr-2">Claim</th>
              <th className="py-1 pr-2">Kind</th>
              <th className="py-1 pr-2 text-right">Weight</th>
              <th className="py-1 pr-2 text-right">Fine gold (est.)</th>
              <th className="py-1 pr-2">How</th>
              <th className="py-1 pr-2 text-right">Value</th>
              <th className="py-1">Review</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.id} className="border-b border-rule">
                <td className="figure py-1 pr-2">{r.foundOn}</td>
                <td className="py-1 pr-2">
                  <bdi>{memberName.get(r.memberId) ?? ""}</bdi>
                </td>
                <td className="py-1 pr-2">
                  <bdi>{r.claimName ? plain(r.claimName) : "off-claim"}</bdi>
                </td>
                <td className="py-1 pr-2">{KIND_LABELS[r.kind as keyof typeof KIND_LABELS]}</td>
                <td className="figure py-1 pr-2 text-right">{r.weightGrams != null ? formatGrams(r.weightGrams) : "—"}</td>
                <td className="figure py-1 pr-2 text-right">{r.fineGrams != null ? formatGrams(r.fineGrams) : "—"}</td>
                <td className="py-1 pr-2">
                  {r.fineBasis ? FINE_BASIS_LABELS[r.fineBasis] : r.kind === "specimen" ? "not weighed" : "no weight"}
                  {r.weighMismatch ? " · weigh-in ≠ weight" : ""}
                  {r.outsideClaim ? " · position outside its claim" : ""}
                  {r.fineBasis === "weighed" && r.scaleChecked === false ? " · scale not checked" : ""}
                </td>
                <td className="figure py-1 pr-2 text-right">{r.value != null ? r.value.toFixed(2) : "—"}</td>
                <td className="py-1">{r.state}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <footer className="border-t-2 border-ink pt-2 text-sm">
        <p className="font-bold">Estimates are not assays.</p>
        <p>
          Fine gold is estimated for every find: specimens from members&apos; hydrostatic weigh-ins (assuming a host-rock density and a gold fineness), other
          gold from its recorded weight at the purity the member recorded or the claim&apos;s fineness. &ldquo;At worst&rdquo; is the range over those
          assumptions. Only an assay or a melt establishes gold content; sell on a buyer&apos;s test, not on this report. Claim boundaries are the club&apos;s
          drawing, not a survey; reporting duties differ by place and land agency.
        </p>
      </footer>
    </article>
  );
}
