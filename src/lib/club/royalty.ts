import { gramsToTroyOunces } from "../estimate/units";
import { formatGrams } from "../format";
import type { LedgerSummary } from "./ledger";

type Terms = { royaltyKind: "percent_of_value" | "grams_per_troy_ounce" | null; royaltyRate: number | null };

/** The royalty a claim's agreement sets on a period's production, with its worst cases. */
export function royaltyDue(
  claim: Terms,
  s: Pick<LedgerSummary, "value" | "valueLow" | "valueHigh" | "currency" | "fineGrams" | "fineLow" | "fineHigh">,
): { text: string; low: string; high: string } | null {
  if (!claim.royaltyKind || claim.royaltyRate === null) return null;
  const rate = claim.royaltyRate;
  if (claim.royaltyKind === "percent_of_value") {
    const money = (v: number) => `${((v * rate) / 100).toFixed(2)} ${s.currency ?? ""}`.trim();
    return { text: money(s.value), low: money(s.valueLow), high: money(s.valueHigh) };
  }
  const grams = (fine: number) => formatGrams(gramsToTroyOunces(fine) * rate);
  return { text: grams(s.fineGrams), low: grams(s.fineLow), high: grams(s.fineHigh) };
}
