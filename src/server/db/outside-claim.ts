import "server-only";
import type Database from "better-sqlite3";
import type { Polygon } from "../../lib/entities/claim";
import { inBoundary } from "../../lib/geo";

/**
 * Marks each find whose position lies outside the boundary of the claim it is recorded on
 * (the ledger flags them). Finds without a position, a claim or a boundary are not outside.
 * Runs over one claim's finds when its boundary changes, or over all of them.
 */
export function refreshOutsideClaim(sqlite: Database.Database, claimId?: string): number {
  const claims = (
    claimId ? sqlite.prepare("select id, boundary from claims where id = ?").all(claimId) : sqlite.prepare("select id, boundary from claims").all()
  ) as { id: string; boundary: string | null }[];
  const finds = sqlite.prepare("select id, lat, lon from finds where claim_id = ? and lat is not null and lon is not null");
  const mark = sqlite.prepare("update finds set outside_claim = ? where id = ? and outside_claim <> ?");
  let changed = 0;
  for (const c of claims) {
    const boundary = c.boundary ? (JSON.parse(c.boundary) as Polygon) : null;
    for (const f of finds.all(c.id) as { id: string; lat: number; lon: number }[]) {
      const outside = boundary ? (inBoundary(f.lat, f.lon, boundary) ? 0 : 1) : 0;
      changed += mark.run(outside, f.id, outside).changes;
    }
  }
  return changed;
}

/** Once per database: finds recorded before the flag existed get it. */
export function backfillOutsideClaim(sqlite: Database.Database): void {
  const done = sqlite.prepare("select 1 from sequences where name = 'outside_claim_backfill'").get();
  if (done) return;
  sqlite.transaction(() => {
    refreshOutsideClaim(sqlite);
    sqlite.prepare("insert into sequences (name, value) values ('outside_claim_backfill', 1)").run();
  })();
}
