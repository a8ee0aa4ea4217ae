/**
 * What the club's own melts and assays say about a claim's gold.
 *
 * Each recovery that can speak to fineness gives one implied fineness with a weight:
 * - an assay that states its fineness: that fineness, weighted by the find's weight;
 * - a melt of placer gold only (nuggets, flakes, fines, crystalline: their weight is gold
 *   alloy): 1000 × fine gold recovered ÷ weight melted, weighted by the weight melted.
 * Melts with specimens in them (mostly rock by weight) say nothing about fineness this way;
 * they still count in the estimate-to-recovered comparison.
 *
 * The proposal is the weighted mean of those finenesses, with a range of ± twice their
 * weighted standard deviation, never narrower than ± MIN_HALF_RANGE ‰ (one melt tells little
 * about the next; our choice), clamped to 1–1000 ‰ and centred again.
 */
export const MIN_HALF_RANGE = 15;

export type RecoveryFigures = {
  kind: "melt" | "assay";
  fineGrams: number;
  fineness: number | null;
  estimatedGrams: number;
  grossGrams: number;
  placerGrams: number;
};

export type FinenessProposal = { value: number; low: number; high: number; recoveries: number; weightGrams: number };

function impliedFineness(r: RecoveryFigures): { f: number; w: number } | null {
  if (r.kind === "assay" && r.fineness !== null && r.grossGrams > 0) return { f: r.fineness, w: r.grossGrams };
  if (r.kind === "melt" && r.placerGrams > 0 && r.placerGrams === r.grossGrams)
    return { f: Math.min(1000, (1000 * r.fineGrams) / r.placerGrams), w: r.placerGrams };
  return null;
}

export function proposeFineness(recoveries: readonly RecoveryFigures[]): FinenessProposal | null {
  const points = recoveries.map(impliedFineness).filter((p): p is { f: number; w: number } => p !== null);
  if (points.length === 0) return null;
  const weight = points.reduce((n, p) => n + p.w, 0);
  const mean = points.reduce((n, p) => n + p.w * p.f, 0) / weight;
  const sd = Math.sqrt(points.reduce((n, p) => n + p.w * (p.f - mean) ** 2, 0) / weight);
  const half = Math.max(2 * sd, MIN_HALF_RANGE);
  const low = Math.max(1, mean - half);
  const high = Math.min(1000, mean + half);
  const round = (v: number) => Math.round(v * 10) / 10;
  return { value: round((low + high) / 2), low: round(low), high: round(high), recoveries: points.length, weightGrams: weight };
}

/** Recovered ÷ estimated for each recovery that had an estimate, with their mean and spread. */
export function recoveryRatios(recoveries: readonly RecoveryFigures[]): { ratios: number[]; mean: number | null; sd: number | null } {
  const ratios = recoveries.filter((r) => r.estimatedGrams > 0).map((r) => r.fineGrams / r.estimatedGrams);
  if (ratios.length === 0) return { ratios, mean: null, sd: null };
  const mean = ratios.reduce((a, b) => a + b, 0) / ratios.length;
  const sd = ratios.length > 1 ? Math.sqrt(ratios.reduce((n, r) => n + (r - mean) ** 2, 0) / (ratios.length - 1)) : null;
  return { ratios, mean, sd };
}
