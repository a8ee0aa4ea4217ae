import "server-only";
import { sql } from "drizzle-orm";
import { seasonBounds } from "@/lib/season";
import { getDb } from "../db";

/** Fine gold of a find's latest weigh-in: the estimate that stands for it. */
const latestFine = sql.raw(
  `(select w.fine_gold_grams from weigh_ins w where w.find_id = f.id and w.deleted_at is null order by w.weighed_at desc limit 1)`,
);

export type Tally = { finds: number; weightGrams: number; fineGoldGrams: number; weighedFinds: number };

export function memberSeasonTally(memberId: string, year: number): Tally {
  const { start, end } = seasonBounds(year);
  const row = getDb().get<{ finds: number; weight: number | null; fine: number | null; weighed: number }>(sql`
    select count(*) as finds, sum(f.weight_grams) as weight, sum(${latestFine}) as fine, count(${latestFine}) as weighed
    from finds f
    where f.member_id = ${memberId} and f.deleted_at is null and f.found_at >= ${start} and f.found_at < ${end}`);
  return { finds: row.finds, weightGrams: row.weight ?? 0, fineGoldGrams: row.fine ?? 0, weighedFinds: row.weighed };
}

export type RecentFind = { id: string; kind: string; weightGrams: number | null; foundAt: number; claimName: string | null; fineGoldGrams: number | null };

export function recentFindsOf(memberId: string, limit = 6): RecentFind[] {
  return getDb().all<RecentFind>(sql`
    select f.id, f.kind, f.weight_grams as weightGrams, f.found_at as foundAt, c.name as claimName, ${latestFine} as fineGoldGrams
    from finds f left join claims c on c.id = f.claim_id
    where f.member_id = ${memberId} and f.deleted_at is null
    order by f.found_at desc limit ${limit}`);
}

export type ClaimTally = Tally & { claimId: string | null; claimName: string | null; kind: string | null; members: number };

/** The club's season per claim (officers only: callers check the capability). */
export function clubSeasonByClaim(year: number): ClaimTally[] {
  const { start, end } = seasonBounds(year);
  const rows = getDb().all<{ claimId: string | null; claimName: string | null; kind: string | null; finds: number; weight: number | null; fine: number | null; weighed: number; members: number }>(sql`
    select c.id as claimId, c.name as claimName, c.kind as kind, count(f.id) as finds, sum(f.weight_grams) as weight,
           sum(${latestFine}) as fine, count(${latestFine}) as weighed, count(distinct f.member_id) as members
    from finds f left join claims c on c.id = f.claim_id
    where f.deleted_at is null and f.found_at >= ${start} and f.found_at < ${end}
    group by c.id order by c.name`);
  return rows.map((r) => ({
    claimId: r.claimId,
    claimName: r.claimName,
    kind: r.kind,
    finds: r.finds,
    weightGrams: r.weight ?? 0,
    fineGoldGrams: r.fine ?? 0,
    weighedFinds: r.weighed,
    members: r.members,
  }));
}
