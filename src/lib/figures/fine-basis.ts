/**
 * How a find's fine-gold figure was reached, best first: an assay of the find; a hydrostatic
 * weigh-in; the purity the member recorded; the fineness of gold on its claim; the club's
 * fineness for gold found off any claim. A specimen with no weigh-in has no figure.
 */
export const FINE_BASES = ["assay", "weighed", "recorded_purity", "claim_fineness", "club_fineness"] as const;
export type FineBasis = (typeof FINE_BASES)[number];

export const FINE_BASIS_LABELS: Record<FineBasis, string> = {
  assay: "assay",
  weighed: "weighed specimen",
  recorded_purity: "recorded purity",
  claim_fineness: "claim fineness",
  club_fineness: "club fineness",
};

/** A find's weigh-in whose air reading is further than this from its recorded weight is flagged. */
export const WEIGH_MISMATCH = { relative: 0.1, absoluteGrams: 0.05 } as const;

/** The device's own check of the same rule (fine-figure.ts): a weigh-in's air reading far from the find's weight. */
export function weighMismatch(weightGrams: number | null, airGrams: readonly number[]): boolean {
  if (weightGrams == null || airGrams.length === 0) return false;
  const air = airGrams.reduce((a, b) => a + b, 0) / airGrams.length;
  return Math.abs(air - weightGrams) > Math.max(WEIGH_MISMATCH.relative * weightGrams, WEIGH_MISMATCH.absoluteGrams);
}
