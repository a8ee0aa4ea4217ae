import type { FineBasis } from "../figures/fine-basis";

/**
 * Totals of a set of finds, as every screen, report, export and mail shows them. Fine gold is
 * the sum of each find's figure; its low and high are the sums of each find's worst cases.
 * `figured` counts finds that have a figure (a specimen never weighed has none).
 */
export type Totals = {
  finds: number;
  weightGrams: number;
  fineGrams: number;
  fineLow: number;
  fineHigh: number;
  figured: number;
  mismatched: number;
  byBasis: Partial<Record<FineBasis, number>>;
};

export const NO_TOTALS: Totals = { finds: 0, weightGrams: 0, fineGrams: 0, fineLow: 0, fineHigh: 0, figured: 0, mismatched: 0, byBasis: {} };

export function addTotals(a: Totals, b: Totals): Totals {
  const byBasis = { ...a.byBasis };
  for (const [k, n] of Object.entries(b.byBasis) as [FineBasis, number][]) byBasis[k] = (byBasis[k] ?? 0) + n;
  return {
    finds: a.finds + b.finds,
    weightGrams: a.weightGrams + b.weightGrams,
    fineGrams: a.fineGrams + b.fineGrams,
    fineLow: a.fineLow + b.fineLow,
    fineHigh: a.fineHigh + b.fineHigh,
    figured: a.figured + b.figured,
    mismatched: a.mismatched + b.mismatched,
    byBasis,
  };
}
