import "server-only";
import { sql } from "drizzle-orm";
import type { MonthlyProduction } from "@/lib/club/production";
import { seasonMonths } from "@/lib/season";
import { clubSettings } from "./settings";
import { totalsBy } from "./totals";

/**
 * Production per month (of the club's days) and claim for a season: fine gold from the
 * figures kept on each find, and recorded weight. One aggregate per month over the index.
 */
export function productionByMonth(season: number): MonthlyProduction[] {
  return seasonMonths(season, clubSettings().timeZone).flatMap(({ month, start, end }) =>
    totalsBy<{ k0: string | null; k1: string | null }>(
      sql`from finds f left join claims c on c.id = f.claim_id where f.deleted_at is null and f.found_at >= ${start} and f.found_at < ${end}`,
      [sql`f.claim_id`, sql`c.name`],
    )
      .map((r) => ({ month, claimId: r.k0, claimName: r.k1, ...r.totals }))
      .sort((a, b) => (a.claimName ?? "").localeCompare(b.claimName ?? "")),
  );
}
