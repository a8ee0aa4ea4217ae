import "server-only";
import type { Polygon } from "@/lib/entities/claim";
import { CLUB_FINENESS } from "@/lib/figures/claim-profile";
import { refreshOutsideClaim } from "../db/outside-claim";
import { statement, type Sqlite } from "../db/rows";

// The ledger's inputs are kept on each find row (the latest weigh-in's server estimate, the
// latest verify or query) so that totals over a large club are one pass over an index; the
// fine-gold figure itself is derived from them by SQLite (db/fine-figure.ts).
// Refreshed wherever those change: push, reviews, seeding.

const WEIGH_IN_FIGURES = `
  (latest_alloy_grams, weighed_fine, weighed_low, weighed_high, weighed_air, weighed_scale_checked) = (
    select w.gold_alloy_grams, w.fine_gold_grams,
      json_extract(w.server_estimate, '$.range.fineGoldGrams[0]'), json_extract(w.server_estimate, '$.range.fineGoldGrams[1]'), w.air_grams,
      coalesce(w.scale_check_passed, 0)
    from weigh_ins w where w.find_id = finds.id and w.deleted_at is null order by w.weighed_at desc, w.id desc limit 1)`;

// The query thread's state: the latest verify or query decides; a query the member has
// answered (an answer naming it) is "answered" until an officer verifies or queries again.
const REVIEW_STATE = `
  review_state = coalesce((select case when r.action = 'verify' then 'verified'
      when exists (select 1 from answers a where a.review_id = r.id and a.deleted_at is null) then 'answered' else 'queried' end
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
export function weighInAdded(
  sqlite: Sqlite,
  w: {
    id: string;
    findId: string;
    weighedAt: number;
    alloyGrams: number;
    fineGrams: number;
    fineRange: readonly [number, number];
    airGrams: number;
    scaleChecked: boolean;
  },
): void {
  statement(
    sqlite,
    `update finds set latest_alloy_grams = ?, weighed_fine = ?, weighed_low = ?, weighed_high = ?, weighed_air = ?, weighed_scale_checked = ?
     where id = ? and not exists (select 1 from weigh_ins w where w.find_id = finds.id and w.deleted_at is null
       and (w.weighed_at > ? or (w.weighed_at = ? and w.id > ?)))`,
  ).run(w.alloyGrams, w.fineGrams, w.fineRange[0], w.fineRange[1], w.airGrams, w.scaleChecked ? 1 : 0, w.findId, w.weighedAt, w.weighedAt, w.id);
}

/**
 * What a find takes from its claim as it arrives: the fineness it is figured with (the claim's
 * profile now, or the club's off any claim) and the boundary its position is checked against.
 */
export function claimFacts(sqlite: Sqlite, claimId: string | null): ClaimFacts {
  if (claimId) {
    const row = statement(sqlite, "select fineness, fineness_low, fineness_high, boundary from claims where id = ?").raw().get(claimId) as
      [number, number, number, string | null] | undefined;
    if (row)
      return {
        finenessUsed: row[0],
        finenessUsedLow: row[1],
        finenessUsedHigh: row[2],
        finenessUsedBasis: "claim_fineness",
        boundary: row[3] ? (JSON.parse(row[3]) as Polygon) : null,
      };
  }
  return {
    finenessUsed: CLUB_FINENESS.value,
    finenessUsedLow: CLUB_FINENESS.low,
    finenessUsedHigh: CLUB_FINENESS.high,
    finenessUsedBasis: "club_fineness",
    boundary: null,
  };
}

export type ClaimFacts = FinenessUsed & { boundary: Polygon | null };

export type FinenessUsed = { finenessUsed: number; finenessUsedLow: number; finenessUsedHigh: number; finenessUsedBasis: "claim_fineness" | "club_fineness" };

/**
 * Re-figures finds with their claims' fineness as it stands now (an officer's choice after
 * accepting a new fineness): one statement over the chosen finds.
 */
export function refigureFineness(sqlite: Sqlite, where: { claimId: string; start: number; end: number }): number {
  return statement(
    sqlite,
    `update finds set fineness_used = c.fineness, fineness_used_low = c.fineness_low, fineness_used_high = c.fineness_high, fineness_used_basis = 'claim_fineness'
     from claims c where c.id = finds.claim_id and finds.claim_id = ? and finds.found_at >= ? and finds.found_at < ? and finds.deleted_at is null`,
  ).run(where.claimId, where.start, where.end).changes;
}

/** After an officer's review of the find, or the member's answer to a query. */
export function refreshReviewState(sqlite: Sqlite, findId: string): void {
  statement(sqlite, `update finds set ${REVIEW_STATE} where id = ?`).run(findId);
}

export function refreshAllFigures(sqlite: Sqlite): void {
  refreshOutsideClaim(sqlite);
  sqlite.prepare(`update finds set ${WEIGH_IN_FIGURES}, ${REVIEW_STATE}`).run();
  // Finds written straight to the table (seeding) are figured with their claims' fineness now.
  sqlite
    .prepare(
      `update finds set fineness_used = coalesce(c.fineness, ?), fineness_used_low = coalesce(c.fineness_low, ?), fineness_used_high = coalesce(c.fineness_high, ?),
         fineness_used_basis = case when c.id is null then 'club_fineness' else 'claim_fineness' end
       from finds f2 left join claims c on c.id = f2.claim_id where f2.id = finds.id and finds.fineness_used_basis is null`,
    )
    .run(CLUB_FINENESS.value, CLUB_FINENESS.low, CLUB_FINENESS.high);
}
