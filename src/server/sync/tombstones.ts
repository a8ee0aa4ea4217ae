import "server-only";
import { getDb } from "../db";
import { statement, type Sqlite } from "../db/rows";

const DAY_MS = 86_400_000;

/** How long a deletion is kept for devices that have not synced (LODEBOOK_TOMBSTONE_DAYS, default 180). */
export function tombstoneDays(): number {
  const days = Number(process.env.LODEBOOK_TOMBSTONE_DAYS ?? 180);
  return Number.isFinite(days) && days > 0 ? days : 180;
}

/** The highest change number of a purged deletion: a device whose cursor is below it may have missed one. */
export function tombstoneHorizon(sqlite: Sqlite): number {
  return (statement(sqlite, "select value from sequences where name = 'tombstone_horizon'").get() as { value: number } | undefined)?.value ?? 0;
}

// Children before parents, and only rows nothing still points at (a review keeps its find).
const PURGES = [
  "delete from photos where deleted_at is not null and deleted_at < ? returning seq",
  "delete from weigh_ins where deleted_at is not null and deleted_at < ? returning seq",
  `delete from finds where deleted_at is not null and deleted_at < ?
     and not exists (select 1 from photos p where p.find_id = finds.id)
     and not exists (select 1 from weigh_ins w where w.find_id = finds.id)
     and not exists (select 1 from reviews r where r.find_id = finds.id) returning seq`,
  `delete from outings where deleted_at is not null and deleted_at < ?
     and not exists (select 1 from finds f where f.outing_id = outings.id) returning seq`,
];

/**
 * Drops deletions older than the keeping time, and raises the horizon past them in the same
 * transaction. A device that comes back from longer away is told to resync in full (its pull
 * answers `resync`), so what was deleted stays deleted there too.
 */
export function purgeTombstones(now = Date.now(), days = tombstoneDays()): { purged: number; horizon: number } {
  const sqlite = getDb().$client;
  return sqlite
    .transaction(() => {
      const cutoff = now - days * DAY_MS;
      let purged = 0;
      let horizon = tombstoneHorizon(sqlite);
      for (const text of PURGES) {
        for (const { seq } of statement(sqlite, text).all(cutoff) as { seq: number }[]) {
          purged++;
          horizon = Math.max(horizon, seq);
        }
      }
      statement(sqlite, "insert into sequences (name, value) values ('tombstone_horizon', ?) on conflict(name) do update set value = excluded.value").run(horizon);
      return { purged, horizon };
    })
    .immediate();
}
