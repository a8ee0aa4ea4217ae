import "server-only";
import { sql } from "drizzle-orm";
import type { Totals } from "@/lib/club/totals";
import { seasonBounds } from "@/lib/season";
import { clubSettings } from "../club/settings";
import { totalsBy } from "../club/totals";
import { getDb } from "../db";

export type ClaimTally = { claimId: string | null; claimName: string | null; kind: string | null; members: number; totals: Totals };

/** The club's season per claim (officers only: callers check the capability). */
export function clubSeasonByClaim(year: number): ClaimTally[] {
  const { start, end } = seasonBounds(year, clubSettings().timeZone);
  const inSeason = sql`f.deleted_at is null and f.found_at >= ${start} and f.found_at < ${end}`;
  const members = new Map(
    getDb()
      .all<{ claimId: string | null; n: number }>(
        sql`select f.claim_id as claimId, count(distinct f.member_id) as n from finds f where ${inSeason} group by f.claim_id`,
      )
      .map((r) => [r.claimId, r.n]),
  );
  return totalsBy<{ k0: string | null; k1: string | null; k2: string | null }>(sql`from finds f left join claims c on c.id = f.claim_id where ${inSeason}`, [
    sql`c.id`,
    sql`c.name`,
    sql`c.kind`,
  ])
    .map((r) => ({ claimId: r.k0, claimName: r.k1, kind: r.k2, members: members.get(r.k0) ?? 0, totals: r.totals }))
    .sort((a, b) => (a.claimName ?? "\uffff").localeCompare(b.claimName ?? "\uffff"));
}
