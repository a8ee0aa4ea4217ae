import "server-only";
import { sql, type SQL } from "drizzle-orm";
import { TROY_OUNCE_GRAMS } from "@/lib/estimate/units";
import type { ExportRow, LedgerPage, LedgerQuery, LedgerRow, LedgerSummary } from "@/lib/club/ledger";
import { addTotals, NO_TOTALS } from "@/lib/club/totals";
import { clubDay, currentSeason, dayStart, nextDay, seasonBounds } from "@/lib/time/club-day";
import { getDb } from "../db";
import { pricesInForce } from "./prices";
import { CHANGED_SINCE_QUERY } from "./query-thread";
import { clubSettings } from "./settings";
import { totalsBy } from "./totals";

// The latest weigh-in's figures and the review state are kept on each find row (see
// figures.ts). The reference price in force on a find's day comes from the price periods:
// each price runs from its date to the next one's; "today" uses the latest price for all.
// Prices are applied outside SQL: a join on date ranges searched every period for every row
// (a season of a large club with monthly prices took 0.3 s for totals and 0.5 s for a page
// sorted by anything but date).

/** The filters other than time; time is a found_at range (see timeBounds). */
function filters(q: LedgerQuery): SQL[] {
  const parts: SQL[] = [sql`f.deleted_at is null`];
  if (q.claimId) parts.push(sql`f.claim_id = ${q.claimId}`);
  if (q.memberId) parts.push(sql`f.member_id = ${q.memberId}`);
  if (q.kind) parts.push(sql`f.kind = ${q.kind}`);
  // "Changed since the query" reads each queried or answered find's latest query (few rows).
  if (q.state === "changed") parts.push(sql.raw(`f.review_state in ('queried', 'answered') and ${CHANGED_SINCE_QUERY}`));
  else if (q.state) parts.push(sql`f.review_state = ${q.state}`);
  return parts;
}

const NEVER = -9e15;
const FOREVER = 9e15;

/** Season, from and to as one found_at range [start, end), in the club's days. */
function timeBounds(q: LedgerQuery, tz = clubSettings().timeZone): { start: number; end: number } {
  let start = NEVER;
  let end = FOREVER;
  if (q.season) ({ start, end } = seasonBounds(q.season, tz));
  if (q.from) start = Math.max(start, dayStart(q.from, tz));
  if (q.to) end = Math.min(end, dayStart(nextDay(q.to), tz));
  return { start, end };
}

/** Only the bounds that bound anything, so an unbounded query keeps the planner's other indexes in play. */
function where(q: LedgerQuery, bounds = timeBounds(q)): SQL {
  const parts = filters(q);
  if (bounds.start > NEVER) parts.push(sql`f.found_at >= ${bounds.start}`);
  if (bounds.end < FOREVER) parts.push(sql`f.found_at < ${bounds.end}`);
  return sql.join(parts, sql` and `);
}

type Span = { price: number | null; currency: string | null; start: number; end: number };

/**
 * The price periods as found_at ranges: each price runs from its date to the next one's (of
 * two on one date, the later entered), and the time before the first has no price; "today"
 * puts every find under the latest price.
 */
function priceSpans(mode: LedgerQuery["price"], tz = clubSettings().timeZone): Span[] {
  // A price takes effect at the start of its day in the club's time zone.
  const prices = pricesInForce()
    .reverse()
    .map((p) => ({ price: p.pricePerTroyOunce, currency: p.currency, start: dayStart(p.effectiveOn, tz) }));
  if (prices.length === 0) return [{ price: null, currency: null, start: NEVER, end: FOREVER }];
  if (mode === "today") return [{ ...prices[prices.length - 1], start: NEVER, end: FOREVER }];
  return [
    { price: null, currency: null, start: NEVER, end: prices[0].start },
    ...prices.map((p, i) => ({ price: p.price, currency: p.currency, start: p.start, end: i + 1 < prices.length ? prices[i + 1].start : FOREVER })),
  ];
}

/**
 * Totals as one plain aggregate per price period, each an index range on found_at over the
 * covering ledger index (the bare aggregate's plan): the value is each period's fine gold
 * times its price, with no price lookup or product per row.
 */
function ledgerSummary(q: LedgerQuery, spans: Span[]): LedgerSummary {
  return groupedSummaries(q, spans, [])[0]?.summary ?? { ...NO_TOTALS, value: 0, valueLow: 0, valueHigh: 0, currency: null };
}

/**
 * Totals per group (member, claim, or none) as one aggregate per price period over the
 * covering ledger index, each period's fine gold valued at its price.
 */
function groupedSummaries(q: LedgerQuery, spans: Span[], keys: SQL[]): { key: unknown[]; summary: LedgerSummary }[] {
  const bounds = timeBounds(q);
  const groups = new Map<string, { key: unknown[]; summary: LedgerSummary }>();
  for (const span of spans) {
    const start = Math.max(span.start, bounds.start);
    const end = Math.min(span.end, bounds.end);
    if (start >= end) continue;
    for (const part of totalsBy<Record<string, unknown>>(sql`from finds f where ${where(q, { start, end })}`, keys)) {
      if (part.totals.finds === 0) continue;
      const key = keys.map((_, i) => part[`k${i}`]);
      const id = JSON.stringify(key);
      const g = groups.get(id) ?? { key, summary: { ...NO_TOTALS, value: 0, valueLow: 0, valueHigh: 0, currency: null } };
      const t = part.totals;
      g.summary = { ...g.summary, ...addTotals(g.summary, t) };
      if (span.price !== null) {
        g.summary.value += (t.fineGrams * span.price) / TROY_OUNCE_GRAMS;
        g.summary.valueLow += (t.fineLow * span.price) / TROY_OUNCE_GRAMS;
        g.summary.valueHigh += (t.fineHigh * span.price) / TROY_OUNCE_GRAMS;
      }
      if (span.currency !== null && (g.summary.currency === null || span.currency > g.summary.currency)) g.summary.currency = span.currency;
      groups.set(id, g);
    }
  }
  return [...groups.values()];
}

/** Subtotals per member or per claim, for the report. */
export function ledgerSubtotals(q: LedgerQuery, by: "member" | "claim"): { id: string | null; summary: LedgerSummary }[] {
  return getDb().transaction(() =>
    groupedSummaries(q, priceSpans(q.price), [by === "member" ? sql`f.member_id` : sql`f.claim_id`]).map((g) => ({
      id: g.key[0] as string | null,
      summary: g.summary,
    })),
  );
}

/**
 * A find's value as a sort key: its fine gold times the price of its period, chosen by the
 * same periods the values are worked out with (numbers only, never text, in the SQL).
 */
function valueKey(spans: Span[]): string {
  const priced = spans.filter((s) => s.price !== null);
  if (priced.length === 0) return "null";
  const cases = priced.map((s) => `when f.found_at >= ${Number(s.start)} and f.found_at < ${Number(s.end)} then ${Number(s.price)}`).join(" ");
  return `f.latest_fine_grams * (case ${cases} else null end)`;
}

const ORDER: Record<Exclude<LedgerQuery["sort"], "value">, string> = {
  foundAt: "f.found_at",
  weight: "f.weight_grams",
  fine: "f.latest_fine_grams",
  member: "m.name",
  claim: "c.name",
  kind: "f.kind",
  method: "f.method",
  state: "f.review_state",
};

const ROW_COLUMNS = sql.raw(`f.id, f.member_id as memberId, m.name as memberName, f.claim_id as claimId, c.name as claimName,
  f.found_at as foundAt, f.kind, f.method, f.weight_grams as weightGrams,
  f.latest_alloy_grams as alloyGrams, f.latest_fine_grams as fineGrams, f.latest_fine_low as fineLow, f.latest_fine_high as fineHigh,
  f.fine_basis as fineBasis, f.weigh_mismatch as weighMismatch, f.weighed_scale_checked as scaleChecked, f.outside_claim as outsideClaim, f.review_state as state,
  ${CHANGED_SINCE_QUERY} as changedSinceQuery`);

type UnpricedRow = Omit<LedgerRow, "price" | "currency" | "value" | "weighMismatch" | "outsideClaim" | "changedSinceQuery" | "scaleChecked" | "foundOn"> & {
  weighMismatch: number | boolean;
  scaleChecked: number | boolean | null;
  outsideClaim: number | boolean;
  changedSinceQuery: number | boolean | null;
};

const MEMBER_JOIN = "join members m on m.id = f.member_id";
const CLAIM_JOIN = "left join claims c on c.id = f.claim_id";
const ROW_JOINS = sql.raw(`${MEMBER_JOIN} ${CLAIM_JOIN}`);

function rows(q: LedgerQuery, tail: SQL): UnpricedRow[] {
  return getDb().all<UnpricedRow>(sql`select ${ROW_COLUMNS} from finds f ${ROW_JOINS} where ${where(q)} ${tail}`);
}

/** Each row's price in force on its day (a binary search of the periods, which tile all time) and its value. */
function withPrices(list: UnpricedRow[], spans: Span[], tz = clubSettings().timeZone): LedgerRow[] {
  return list.map((r) => {
    let lo = 0;
    let hi = spans.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (spans[mid].start <= r.foundAt) lo = mid;
      else hi = mid - 1;
    }
    const { price, currency } = spans[lo];
    return {
      ...r,
      foundOn: clubDay(r.foundAt, tz),
      weighMismatch: !!r.weighMismatch,
      outsideClaim: !!r.outsideClaim,
      changedSinceQuery: !!r.changedSinceQuery,
      scaleChecked: r.scaleChecked === null ? null : !!r.scaleChecked,
      price,
      currency,
      value: price === null || r.fineGrams === null ? null : (r.fineGrams * price) / TROY_OUNCE_GRAMS,
    };
  });
}

/** What the page's sort needs beside the find row itself. */
const SORT_JOIN: Partial<Record<LedgerQuery["sort"], string>> = { member: MEMBER_JOIN, claim: CLAIM_JOIN };

export function ledgerPage(q: LedgerQuery): LedgerPage {
  return getDb().transaction(() => {
    const spans = priceSpans(q.price);
    const summary = ledgerSummary(q, spans);
    // The page is chosen on sort keys alone (for most sorts, from the covering ledger index),
    // then only its rows are read whole: a sort of whole joined rows took 0.25 s on a large
    // club's season. Ties go newest first, then by the row's place in the table (stable).
    const key = q.sort === "value" ? valueKey(spans) : ORDER[q.sort];
    const order = sql.raw(`order by ${key} ${q.dir === "asc" ? "asc" : "desc"} nulls last, f.found_at desc, f.rowid`);
    const chosen = sql`(select f.rowid as rid from finds f ${sql.raw(SORT_JOIN[q.sort] ?? "")} where ${where(q)} ${order} limit ${q.pageSize} offset ${(q.page - 1) * q.pageSize}) page`;
    const list = getDb().all<UnpricedRow>(sql`select ${ROW_COLUMNS} from ${chosen} join finds f on f.rowid = page.rid ${ROW_JOINS} ${order}`);
    return { rows: withPrices(list, spans), total: summary.finds, summary, page: q.page, pageSize: q.pageSize };
  });
}

const EXPORT_COLUMNS = sql.raw(`f.outing_id as outingId, o.started_at as outingStartedAt, f.depth_cm as depthCm, f.notes,
  case when m.location_sharing = 'exact' then f.lat end as lat, case when m.location_sharing = 'exact' then f.lon end as lon`);

/**
 * Every row the filters select with where and how it was found (positions only where the
 * member shares them), for the CSV and GeoJSON exports (bounded).
 */
export function ledgerExportRows(q: LedgerQuery, max = 200_000): ExportRow[] {
  return getDb().transaction(() => {
    const tz = clubSettings().timeZone;
    const list = getDb().all<
      UnpricedRow & { outingId: string | null; outingStartedAt: number | null; depthCm: number | null; notes: string; lat: number | null; lon: number | null }
    >(
      sql`select ${ROW_COLUMNS}, ${EXPORT_COLUMNS} from finds f ${ROW_JOINS} left join outings o on o.id = f.outing_id where ${where(q)} order by f.found_at, f.id limit ${max}`,
    );
    const priced = withPrices(list, priceSpans(q.price, tz), tz);
    return priced.map((r, i) => {
      const x = list[i];
      return {
        ...r,
        outingId: x.outingId,
        outingOn: x.outingStartedAt === null ? null : clubDay(x.outingStartedAt, tz),
        depthCm: x.depthCm,
        notes: x.notes,
        lat: x.lat,
        lon: x.lon,
      };
    });
  });
}

/** Every row the filters select, for export (bounded). */
export function ledgerRows(q: LedgerQuery, max = 200_000): LedgerRow[] {
  return getDb().transaction(() => withPrices(rows(q, sql`order by f.found_at, f.id limit ${max}`), priceSpans(q.price)));
}

/** Seasons (of the club's days) from the first find to the last, newest first, for the filters. */
export function ledgerSeasons(): number[] {
  const span = getDb().get<{ first: number | null; last: number | null }>(
    sql`select min(found_at) as first, max(found_at) as last from finds where deleted_at is null`,
  );
  if (span.first === null || span.last === null) return [];
  const tz = clubSettings().timeZone;
  const seasons: number[] = [];
  for (let y = currentSeason(span.last, tz); y >= currentSeason(span.first, tz); y--) seasons.push(y);
  return seasons;
}
