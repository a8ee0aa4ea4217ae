import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { TROY_OUNCE_GRAMS } from "@/lib/estimate/units";
import type { LedgerPage, LedgerQuery, LedgerRow } from "@/lib/club/ledger";
import { seasonBounds } from "@/lib/season";
import { getDb } from "../db";

// The latest weigh-in's figures and the review state are kept on each find row (see
// figures.ts). The reference price in force on a find's day comes from the price periods:
// each price runs from its date to the next one's; "today" uses the latest price for all.
function periods(mode: LedgerQuery["price"]): SQL {
  return mode === "today"
    ? sql.raw(`periods as materialized (select price_per_troy_ounce as price, currency, 0 as start_ms, 9e15 as end_ms from reference_prices order by effective_on desc, created_at desc limit 1)`)
    : sql.raw(
        `periods as materialized (select price_per_troy_ounce as price, currency, unixepoch(effective_on) * 1000 as start_ms, coalesce(lead(unixepoch(effective_on) * 1000) over (order by effective_on, created_at), 9e15) as end_ms from reference_prices)`,
      );
}
const PRICE_JOIN = sql.raw(`left join periods p on f.found_at >= p.start_ms and f.found_at < p.end_ms`);

function where(q: LedgerQuery): SQL {
  const parts: SQL[] = [sql`f.deleted_at is null`];
  if (q.claimId) parts.push(sql`f.claim_id = ${q.claimId}`);
  if (q.memberId) parts.push(sql`f.member_id = ${q.memberId}`);
  if (q.kind) parts.push(sql`f.kind = ${q.kind}`);
  if (q.season) {
    const { start, end } = seasonBounds(q.season);
    parts.push(sql`f.found_at >= ${start} and f.found_at < ${end}`);
  }
  if (q.from) parts.push(sql`f.found_at >= ${Date.parse(`${q.from}T00:00:00Z`)}`);
  if (q.to) parts.push(sql`f.found_at < ${Date.parse(`${q.to}T00:00:00Z`) + 86_400_000}`);
  if (q.state) parts.push(sql`f.review_state = ${q.state}`);
  return sql.join(parts, sql` and `);
}

const ORDER: Record<LedgerQuery["sort"], string> = {
  foundAt: "f.found_at",
  weight: "f.weight_grams",
  fine: "f.latest_fine_grams",
  member: "m.name",
  claim: "c.name",
  kind: "f.kind",
};

const ROW_COLUMNS = sql.raw(`f.id, f.member_id as memberId, m.name as memberName, f.claim_id as claimId, c.name as claimName,
  f.found_at as foundAt, f.kind, f.method, f.weight_grams as weightGrams,
  f.latest_alloy_grams as alloyGrams, f.latest_fine_grams as fineGrams, f.latest_fine_low as fineLow, f.latest_fine_high as fineHigh,
  p.price as price, p.currency as currency, f.latest_fine_grams * p.price / ${TROY_OUNCE_GRAMS} as value, f.review_state as state`);

function rows(q: LedgerQuery, tail: SQL): SQL {
  return sql`with ${periods(q.price)}
    select ${ROW_COLUMNS}
    from finds f join members m on m.id = f.member_id left join claims c on c.id = f.claim_id ${PRICE_JOIN}
    where ${where(q)} ${tail}`;
}

export function ledgerPage(q: LedgerQuery): LedgerPage {
  const db = getDb();
  return db.transaction((tx) => {
    // Each price period (and the time before the first) is the outer loop, an index range on
    // found_at the inner one (CROSS JOIN fixes that order in SQLite): one pass over the rows, as
    // the bare aggregate makes, instead of a search of the periods for every row.
    const summary = tx.get<{ finds: number; weight: number | null; fine: number | null; value: number | null; currency: string | null }>(sql`
      with ${periods(q.price)},
      spans as (
        select price, currency, start_ms, end_ms from periods
        union all select null, null, -9e15, coalesce((select min(start_ms) from periods), 9e15)
      )
      select count(*) as finds, sum(f.weight_grams) as weight, sum(f.latest_fine_grams) as fine,
             sum(f.latest_fine_grams * s.price) / ${TROY_OUNCE_GRAMS} as value, max(s.currency) as currency
      from spans s cross join finds f on f.found_at >= s.start_ms and f.found_at < s.end_ms
      where ${where(q)}`);
    const order = sql.raw(`order by ${ORDER[q.sort]} ${q.dir === "asc" ? "asc" : "desc"} nulls last, f.id`);
    const page = tx.all<LedgerRow>(rows(q, sql`${order} limit ${q.pageSize} offset ${(q.page - 1) * q.pageSize}`));
    return {
      rows: page,
      total: summary.finds,
      summary: { finds: summary.finds, weightGrams: summary.weight ?? 0, fineGrams: summary.fine ?? 0, value: summary.value ?? 0, currency: summary.currency },
      page: q.page,
      pageSize: q.pageSize,
    };
  });
}

/** Every row the filters select, for export (bounded). */
export function ledgerRows(q: LedgerQuery, max = 200_000): LedgerRow[] {
  return getDb().all<LedgerRow>(rows(q, sql`order by f.found_at, f.id limit ${max}`));
}

/** Seasons that have finds, newest first, for the filters. */
export function ledgerSeasons(): number[] {
  return getDb()
    .all<{ y: string }>(sql`select distinct strftime('%Y', found_at / 1000, 'unixepoch') as y from finds where deleted_at is null order by y desc`)
    .map((r) => Number(r.y));
}
