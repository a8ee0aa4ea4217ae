import "server-only";
import { sql } from "drizzle-orm";
import { seasonBounds } from "@/lib/season";
import type { MonthlyProduction } from "@/lib/club/production";
import { getDb } from "../db";

/** Production per month and claim for a season: recorded weight and estimated fine gold (the latest weigh-in's, kept on the find). */
export function productionByMonth(season: number): MonthlyProduction[] {
  const { start, end } = seasonBounds(season);
  return getDb().all<MonthlyProduction>(sql`
    select strftime('%Y-%m', f.found_at / 1000, 'unixepoch') as month, f.claim_id as claimId, c.name as claimName,
           count(*) as finds, coalesce(sum(f.weight_grams), 0) as weightGrams,
           coalesce(sum(f.latest_fine_grams), 0) as fineGrams
    from finds f left join claims c on c.id = f.claim_id
    where f.deleted_at is null and f.found_at >= ${start} and f.found_at < ${end}
    group by month, f.claim_id order by month, claimName`);
}
