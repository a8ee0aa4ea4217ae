import "server-only";
import { sql } from "drizzle-orm";
import { seasonBounds } from "@/lib/season";
import { getDb } from "../db";

/** Fine gold of a find's latest weigh-in: the estimate that stands for it. */
const latestFine = sql.raw(
  `(select w.fine_gold_grams from weigh_ins w where w.find_id = f.id and w.deleted_at is null order by w.weighed_at desc limit 1)`,
);

export type Tally = { finds: number; weightGrams: number; fineGoldGrams: number; weighedFinds: number };

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
