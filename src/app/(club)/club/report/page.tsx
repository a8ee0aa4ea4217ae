import type { Metadata } from "next";
import { PrintButton } from "@/components/club/print-button";
import { ledgerQuerySchema } from "@/lib/club/ledger";
import { KIND_LABELS } from "@/lib/entities/find";
import { gramsToPennyweights, gramsToTroyOunces } from "@/lib/estimate/units";
import { formatDay, formatGrams } from "@/lib/format";
import { withoutBidiControls as plain } from "@/lib/text/safe-text";
import { requirePageActor } from "@/server/auth/current";
import { listClaims } from "@/server/club/claims";
import { ledgerRows } from "@/server/club/ledger";
import { listMembers } from "@/server/queries/members";

export const metadata: Metadata = { title: "Season report" };

type Props = { searchParams: Promise<Record<string, string>> };

/** A printable report of what the ledger's filters select: title, period, totals, table, caution. */
export default async function ReportPage({ searchParams }: Props) {
  await requirePageActor("viewLedger", "/club/report");
  const parsed = ledgerQuerySchema.safeParse(await searchParams);
  if (!parsed.success) return <p className="field-error">These report filters are not valid: {parsed.error.issues[0].message}</p>;
  const q = parsed.data;
  const rows = ledgerRows(q);
  const claim = q.claimId ? listClaims().find((c) => c.id === q.claimId) : undefined;
  const member = q.memberId ? listMembers().find((m) => m.id === q.memberId) : undefined;
  const period = q.season ? `Season ${q.season}` : q.from || q.to ? `${q.from ?? "…"} to ${q.to ?? "…"}` : "All seasons";
  const sum = (f: (r: (typeof rows)[number]) => number | null) => rows.reduce((n, r) => n + (f(r) ?? 0), 0);
  const weight = sum((r) => r.weightGrams);
  const fine = sum((r) => r.fineGrams);
  const value = sum((r) => r.value);
  const currency = rows.find((r) => r.currency)?.currency ?? "";

  return (
    <article className="report flex flex-col gap-4 bg-sheet p-6 print:p-0" data-testid="report">
      <header className="flex items-start justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold">Production report — {claim ? plain(claim.name) : member ? plain(member.name ?? member.email) : "whole club"}</h1>
          <p>
            {period}
            {q.kind ? ` · ${KIND_LABELS[q.kind]} only` : ""}
            {q.state ? ` · ${q.state} only` : ""} · printed {new Date().toISOString().slice(0, 10)}
          </p>
        </div>
        <PrintButton />
      </header>
      <section className="grid grid-cols-4 gap-4 border-y-2 border-ink py-3">
        <div>
          <p className="text-sm">Finds</p>
          <p className="figure text-xl font-bold">{rows.length}</p>
        </div>
        <div>
          <p className="text-sm">Recorded weight</p>
          <p className="figure text-xl font-bold">{formatGrams(weight)}</p>
          <p className="figure text-sm">
            {gramsToTroyOunces(weight).toFixed(3)} ozt · {gramsToPennyweights(weight).toFixed(2)} dwt
          </p>
        </div>
        <div>
          <p className="text-sm">Fine gold (estimated)</p>
          <p className="figure text-xl font-bold">{formatGrams(fine)}</p>
          <p className="figure text-sm">{gramsToTroyOunces(fine).toFixed(3)} ozt</p>
        </div>
        <div>
          <p className="text-sm">Value at {q.price === "today" ? "today's" : "each find's date"} reference price</p>
          <p className="figure text-xl font-bold">
            {value.toFixed(2)} {currency}
          </p>
        </div>
      </section>
      <table className="w-full text-left text-sm">
        <thead>
          <tr className="border-b-2 border-ink">
            <th className="py-1 pr-2">Found</th>
            <th className="py-1 pr-2">Member</th>
            <th className="py-1 pr-2">Claim</th>
            <th className="py-1 pr-2">Kind</th>
            <th className="py-1 pr-2 text-right">Weight</th>
            <th className="py-1 pr-2 text-right">Fine gold (est.)</th>
            <th className="py-1 pr-2 text-right">Value</th>
            <th className="py-1">Review</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-b border-rule">
              <td className="figure py-1 pr-2">{formatDay(r.foundAt)}</td>
              <td className="py-1 pr-2">
                <bdi>{plain(r.memberName ?? "")}</bdi>
              </td>
              <td className="py-1 pr-2">
                <bdi>{r.claimName ? plain(r.claimName) : "off-claim"}</bdi>
              </td>
              <td className="py-1 pr-2">{KIND_LABELS[r.kind as keyof typeof KIND_LABELS]}</td>
              <td className="figure py-1 pr-2 text-right">{r.weightGrams != null ? formatGrams(r.weightGrams) : "—"}</td>
              <td className="figure py-1 pr-2 text-right">{r.fineGrams != null ? formatGrams(r.fineGrams) : "—"}</td>
              <td className="figure py-1 pr-2 text-right">{r.value != null ? r.value.toFixed(2) : "—"}</td>
              <td className="py-1">{r.state}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <footer className="border-t-2 border-ink pt-2 text-sm">
        <p className="font-bold">Estimates are not assays.</p>
        <p>
          Fine gold comes from members&apos; hydrostatic weigh-ins of specimens, assuming a host-rock density and a gold fineness. Only an assay
          establishes gold content. Claim boundaries are the club&apos;s drawing, not a survey; reporting duties differ by place and land agency.
        </p>
      </footer>
    </article>
  );
}
