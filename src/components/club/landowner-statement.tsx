import type { LedgerSummary } from "@/lib/club/ledger";
import { royaltyDue } from "@/lib/club/royalty";
import { withoutBidiControls as plain } from "@/lib/text/safe-text";
import { PrintButton } from "./print-button";
import { ReportFigures, ReportTotals } from "./report-parts";

type Claim = {
  name: string;
  agencyRef: string | null;
  landowner: string | null;
  royaltyKind: "percent_of_value" | "grams_per_troy_ounce" | null;
  royaltyRate: number | null;
};

/**
 * The statement of a claim's production for its landowner: the period's totals, how the
 * figures were reached, the royalty the agreement sets on them, and what settles it.
 */
export function LandownerStatement({
  club,
  claim,
  claimLabel,
  period,
  summary,
  printedOn,
}: {
  club: string;
  claim: Claim;
  claimLabel: string;
  period: string;
  summary: LedgerSummary;
  printedOn: string;
}) {
  const due = royaltyDue(claim, summary);
  const terms =
    claim.royaltyKind === "percent_of_value"
      ? `${claim.royaltyRate} % of the value at the club's reference price`
      : claim.royaltyKind === "grams_per_troy_ounce"
        ? `${claim.royaltyRate} g for every troy ounce of fine gold`
        : null;
  return (
    <article className="report flex flex-col gap-4 bg-sheet p-6 print:p-0" data-testid="landowner-statement">
      <header className="flex items-start justify-between gap-4">
        <div>
          <p className="font-bold">{club}</p>
          <h1 className="text-2xl font-bold">Statement of production — {claimLabel}</h1>
          <p>
            To {claim.landowner ? plain(claim.landowner) : "the landowner"} · {period} · printed {printedOn}
          </p>
        </div>
        <PrintButton />
      </header>
      <ReportTotals summary={summary} priceToday={false} />
      <section aria-label="Royalty" className="border-b-2 border-ink pb-3" data-testid="royalty">
        <h2 className="text-lg font-bold">Royalty</h2>
        {due && terms ? (
          <p>
            The agreement sets {terms}: <span className="figure font-bold">{due.text}</span> on these estimates (at worst {due.low} to {due.high}).
          </p>
        ) : (
          <p>No royalty is recorded for this claim&apos;s agreement.</p>
        )}
      </section>
      <ReportFigures summary={summary} />
      <footer className="border-t-2 border-ink pt-2 text-sm">
        <p className="font-bold">Estimates are not assays.</p>
        <p>
          These figures are the club&apos;s estimates of fine gold from its members&apos; records. The agreement between the club and the landowner, and the
          assays or melts of what was recovered, settle what is owed; the local rules on reporting production apply.
        </p>
      </footer>
    </article>
  );
}
