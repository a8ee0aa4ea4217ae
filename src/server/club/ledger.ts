import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { TROY_OUNCE_GRAMS } from "@/lib/estimate/units";
import type { LedgerPage, LedgerQuery, LedgerRow } from "@/lib/club/ledger";
import { seasonBounds } from "@/lib/season";
import { getDb } from "../db";

// The latest weigh-in stands for a find; the latest verify/query is its review state; the
// reference price is the one in force on the find's day (or today's, by the switch).
const LATEST_WEIGH_IN = sql.raw(`(select w2.id from weigh_ins w2 where w2.find_id = f.id and w2.deleted_at is null order by w2.weighed_at desc, w2.id desc limit 1)`);
const STATE = sql.raw(
  `coalesce((select case r.action when 'verify' then 'verified' else 'queried' end from reviews r where r.find_id = f.id and r.action in ('verify','query') order by r.created_at desc, r.seq desc limit 1), 'new')`,
);

function priceRow(mode: LedgerQuery["price"]): SQL {
  return mode === "today"
    ? sql.raw(`(select p.id from reference_prices p order by p.effective_on desc, p.created_at desc limit 1)`)
    : sql.raw(`(select p.id from reference_prices p where p.effective_on <= strftime('%Y-%m-%d', f.found_at / 1000, 'unixepoch') order by p.effective_on desc, p.created_at desc limit 1)`);
}

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
  return sql.join(parts, sql` and `);
}

const ORDER: Record<LedgerQuery["sort"], string> = {
  foundAt: "foundAt",
  weight: "weightGrams",
  fine: "fineGrams",
  member: "memberName",
  claim: "claimName",
  kind: "kind",
};

/** The rows the filters select, as one SQL source the page, the totals and the CSV share. */
function selection(q: LedgerQuery): SQL {
  return sql`
    select f.id, f.member_id as memberId, m.name as memberName, f.claim_id as claimId, c.name as claimName,
           f.found_at as foundAt, f.kind, f.method, f.weight_grams as weightGrams,
           w.gold_alloy_grams as alloyGrams, w.fine_gold_grams as fineGrams,
           json_extract(w.server_estimate, '$.range.fineGoldGrams[0]') as fineLow,
           json_extract(w.server_estimate, '$.range.fineGoldGrams[1]') as fineHigh,
           p.price_per_troy_ounce as price, p.currency as currency,
           w.fine_gold_grams * p.price_per_troy_ounce / ${TROY_OUNCE_GRAMS} as value,
           ${STATE} as state
    from finds f
    join members m on m.id = f.member_id
    left join claims c on c.id = f.claim_id
    left join weigh_ins w on w.id = ${LATEST_WEIGH_IN}
    left join reference_prices p on p.id = ${priceRow(q.price)}
    where ${where(q)}`;
}

export function ledgerPage(q: LedgerQuery): LedgerPage {
  const db = getDb();
  const source = selection(q);
  const stateFilter = q.state ? sql` where state = ${q.state}` : sql``;
  return db.transaction((tx) => {
    const summary = tx.get<{ finds: number; weight: number | null; fine: number | null; value: number | null; currency: string | null }>(
      sql`select count(*) as finds, sum(weightGrams) as weight, sum(fineGrams) as fine, sum(value) as value, max(currency) as currency from (${source})${stateFilter}`,
    );
    const order = sql.raw(`${ORDER[q.sort]} ${q.dir === "asc" ? "asc" : "desc"} nulls last, id`);
    const rows = tx.all<LedgerRow>(sql`select * from (${source})${stateFilter} order by ${order} limit ${q.pageSize} offset ${(q.page - 1) * q.pageSize}`);
    return {
      rows,
      total: summary.finds,
      summary: { finds: summary.finds, weightGrams: summary.weight ?? 0, fineGrams: summary.fine ?? 0, value: summary.value ?? 0, currency: summary.currency },
      page: q.page,
      pageSize: q.pageSize,
    };
  });
}

/** Every row the filters select, for export (bounded). */
export function ledgerRows(q: LedgerQuery, max = 200_000): LedgerRow[] {
  const stateFilter = q.state ? sql` where state = ${q.state}` : sql``;
  return getDb().all<LedgerRow>(sql`select * from (${selection(q)})${stateFilter} order by foundAt, id limit ${max}`);
}

/** Seasons that have finds, newest first, for the filters. */
export function ledgerSeasons(): number[] {
  return getDb()
    .all<{ y: string }>(sql`select distinct strftime('%Y', found_at / 1000, 'unixepoch') as y from finds where deleted_at is null order by y desc`)
    .map((r) => Number(r.y));
}
