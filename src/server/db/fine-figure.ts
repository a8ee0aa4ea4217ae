import { WEIGH_MISMATCH } from "../../lib/figures/fine-basis";

// The one rule for a find's fine-gold figure, as SQLite expressions over the find row's own
// columns: assay, then weigh-in, then (except for specimens, whose grade only a weigh-in
// tells) the member's recorded purity, then the fineness the find was figured with. Triggers
// (figureTriggersSql, created by a migration and checked against this text by a test) write
// it on every insert and every change of an input; nothing else writes these columns.

const figured = (assay: string, weighed: string, purity: string, fineness: string) =>
  `case when assay_fine is not null then ${assay} when weighed_fine is not null then ${weighed} when kind = 'specimen' or weight_grams is null then null when purity is not null then ${purity} else ${fineness} end`;

export const FINE_FIGURE = {
  fine_basis: figured("'assay'", "'weighed'", "'recorded_purity'", "fineness_used_basis"),
  latest_fine_grams: figured("assay_fine", "weighed_fine", "weight_grams * purity / 1000.0", "weight_grams * fineness_used / 1000.0"),
  latest_fine_low: figured("assay_low", "weighed_low", "weight_grams * purity / 1000.0", "weight_grams * fineness_used_low / 1000.0"),
  latest_fine_high: figured("assay_high", "weighed_high", "weight_grams * purity / 1000.0", "weight_grams * fineness_used_high / 1000.0"),
  weigh_mismatch: `coalesce(weighed_air is not null and weight_grams is not null and abs(weighed_air - weight_grams) > max(${WEIGH_MISMATCH.relative} * weight_grams, ${WEIGH_MISMATCH.absoluteGrams}), 0)`,
} as const;

/** The columns the figure is worked out from: a change to any of them works it out again. */
export const FINE_FIGURE_INPUTS = [
  "kind",
  "weight_grams",
  "purity",
  "weighed_fine",
  "weighed_low",
  "weighed_high",
  "weighed_air",
  "assay_fine",
  "assay_low",
  "assay_high",
  "fineness_used",
  "fineness_used_low",
  "fineness_used_high",
  "fineness_used_basis",
] as const;

const SET = Object.entries(FINE_FIGURE)
  .map(([column, expr]) => `${column} = ${expr}`)
  .join(", ");

/** The statements that keep the figure; a migration creates them with exactly this text. */
export function figureTriggersSql(): string[] {
  return [
    `CREATE TRIGGER finds_figure_insert AFTER INSERT ON finds BEGIN UPDATE finds SET ${SET} WHERE rowid = NEW.rowid; END`,
    `CREATE TRIGGER finds_figure_update AFTER UPDATE OF ${FINE_FIGURE_INPUTS.join(", ")} ON finds BEGIN UPDATE finds SET ${SET} WHERE rowid = NEW.rowid; END`,
  ];
}

/** Works every find's figure out again (the triggers' own statement, for all rows). */
export const RECOMPUTE_ALL_FIGURES = `UPDATE finds SET ${SET}`;
