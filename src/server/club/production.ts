import "server-only";
import { sql } from "drizzle-orm";
import type { MonthlyProduction } from "@/lib/club/production";
import { seasonBounds } from "@/lib/season";
import { totalsBy } from "./totals";

/** Production per month and claim for a season: fine gold (the figures kept on each find) and recorded weight. */
export function productionByMonth(season: number): MonthlyProduction[] {
  const { start, end } = seasonBounds(season);
  return totalsBy<{ k0: string; k1: string | null; k2: string | null }>(
    sql`from finds f left join claims c on c.id = f.claim_id where f.deleted_at is null and f.found_at >= ${start} and f.found_at < ${end}`,
    [sql`strftime('%Y-%m', f.found_at / 1000, 'unixepoch')`, sql`f.claim_id`, sql`c.name`],
  )
    .map((r) => ({ month: r.k0, claimId: r.k1, claimName: r.k2, ...r.totals }))
    .sort((a, b) => a.month.localeCompare(b.month) || (a.claimName ?? "").localeCompare(b.claimName ?? ""));
}
