import "server-only";
import { statement, type Sqlite } from "../db/rows";

// The ledger's figures are kept on each find row (the latest weigh-in's server estimate, the
// latest verify or query) so that totals over a large club are one pass over an index.
// Refreshed wherever those change: push, reviews, seeding.

const WEIGH_IN_FIGURES = `
  (latest_alloy_grams, latest_fine_grams, latest_fine_low, latest_fine_high) = (
    select w.gold_alloy_grams, w.fine_gold_grams,
      json_extract(w.server_estimate, '$.range.fineGoldGrams[0]'), json_extract(w.server_estimate, '$.range.fineGoldGrams[1]')
    from weigh_ins w where w.find_id = finds.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1)`;

const REVIEW_STATE = `
  review_state = coalesce((select case r.action when 'verify' then 'verified' else 'queried' end
    from reviews r where r.find_id = finds.id and r.action in ('verify','query') order by r.created_at desc, r.seq desc limit 1), 'new')`;

/** After a weigh-in of the find is added, changed or deleted. */
export function refreshWeighInFigures(sqlite: Sqlite, findId: string): void {
  statement(sqlite, `update finds set ${WEIGH_IN_FIGURES} where id = ?`).run(findId);
}

/**
 * After a new weigh-in of the find: its figures become the find's when no other weigh-in is
 * later (the same order as WEIGH_IN_FIGURES), without reading the JSON back. An edited or
 * deleted weigh-in can hand the place to another, so those use refreshWeighInFigures.
 */
export function weighInAdded(sqlite: Sqlite, w: { id: string; findId: string; weighedAt: number; alloyGrams: number; fineGrams: number; fineRange: readonly [number, number] }): void {
  statement(
    sqlite,
    `update finds set latest_alloy_grams = ?, latest_fine_grams = ?, latest_fine_low = ?, latest_fine_high = ?
     where id = ? and not exists (select 1 from weigh_ins w where w.find_id = finds.id and w.deleted_at is null
       and (w.weighed_at > ? or (w.weighed_at = ? and w.id > ?)))`,
  ).run(w.alloyGrams, w.fineGrams, w.fineRange[0], w.fineRange[1], w.findId, w.weighedAt, w.weighedAt, w.id);
}

/** After an officer's review of the find. */
export function refreshReviewState(sqlite: Sqlite, findId: string): void {
  statement(sqlite, `update finds set ${REVIEW_STATE} where id = ?`).run(findId);
}

export function refreshAllFigures(sqlite: Sqlite): void {
  sqlite.prepare(`update finds set ${WEIGH_IN_FIGURES}, ${REVIEW_STATE}`).run();
}
