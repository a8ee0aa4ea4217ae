import { sql } from "drizzle-orm";
import { WEIGH_MISMATCH } from "../../lib/figures/fine-basis";

// The one rule for a find's fine-gold figure, as SQLite expressions over the find row's own
// columns (generated columns of `finds`): assay, then weigh-in, then (except for specimens,
// whose grade only a weigh-in tells) the member's recorded purity, then the fineness the find
// was figured with. Written once here; the ledger, report, chart, digest and tally read it.

const figured = (assay: string, weighed: string, purity: string, fineness: string) => `case
  when assay_fine is not null then ${assay}
  when weighed_fine is not null then ${weighed}
  when kind = 'specimen' or weight_grams is null then null
  when purity is not null then ${purity}
  else ${fineness} end`;

export const FINE_FIGURE = {
  basis: sql.raw(figured("'assay'", "'weighed'", "'recorded_purity'", "fineness_used_basis")),
  fine: sql.raw(figured("assay_fine", "weighed_fine", "weight_grams * purity / 1000.0", "weight_grams * fineness_used / 1000.0")),
  low: sql.raw(figured("assay_low", "weighed_low", "weight_grams * purity / 1000.0", "weight_grams * fineness_used_low / 1000.0")),
  high: sql.raw(figured("assay_high", "weighed_high", "weight_grams * purity / 1000.0", "weight_grams * fineness_used_high / 1000.0")),
  weighMismatch: sql.raw(
    `coalesce(weighed_air is not null and weight_grams is not null and abs(weighed_air - weight_grams) > max(${WEIGH_MISMATCH.relative} * weight_grams, ${WEIGH_MISMATCH.absoluteGrams}), 0)`,
  ),
};
