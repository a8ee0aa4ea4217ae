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

/** A find as a device holds it: its weight, and the server's figure as of the last pull. */
export type DeviceFindFigures = {
  weightGrams: number | null;
  figure?: { basis: FineBasis | null; fineGrams: number | null; low: number | null; high: number | null; weighMismatch: boolean } | null;
};

/**
 * The same totals over the finds a device holds (the phone's tally), from the figures the
 * server worked out: a find saved since the last camp sync has none yet and counts as not
 * figured.
 */
export function deviceTotals(finds: readonly DeviceFindFigures[]): Totals {
  return finds.reduce<Totals>((t, f) => {
    const fig = f.figure?.fineGrams != null ? f.figure : null;
    const byBasis = { ...t.byBasis };
    if (fig?.basis) byBasis[fig.basis] = (byBasis[fig.basis] ?? 0) + 1;
    return {
      finds: t.finds + 1,
      weightGrams: t.weightGrams + (f.weightGrams ?? 0),
      fineGrams: t.fineGrams + (fig?.fineGrams ?? 0),
      fineLow: t.fineLow + (fig?.low ?? 0),
      fineHigh: t.fineHigh + (fig?.high ?? 0),
      figured: t.figured + (fig ? 1 : 0),
      mismatched: t.mismatched + (f.figure?.weighMismatch ? 1 : 0),
      byBasis,
    };
  }, NO_TOTALS);
}
