import "server-only";
import { serverEnv } from "../env";
import { getDb } from "../db";
import { statement, type Sqlite } from "../db/rows";
import { logger } from "../log";
import { photoStorage } from "../storage";

const DAY_MS = 86_400_000;

/** How long a deletion is kept for devices that have not synced (LODEBOOK_TOMBSTONE_DAYS, default 180). */
export function tombstoneDays(): number {
  return serverEnv().LODEBOOK_TOMBSTONE_DAYS;
}

/** The highest change number of a purged deletion: a device whose cursor is below it may have missed one. */
export function tombstoneHorizon(sqlite: Sqlite): number {
  return (statement(sqlite, "select value from sequences where name = 'tombstone_horizon'").get() as { value: number } | undefined)?.value ?? 0;
}

// Children before parents, and only rows nothing still points at (a review keeps its find).
const PURGES = [
  "delete from photos where deleted_at is not null and deleted_at < ? returning seq, storage_key as storageKey",
  "delete from weigh_ins where deleted_at is not null and deleted_at < ? returning seq",
  "delete from barren_rocks where deleted_at is not null and deleted_at < ? returning seq",
  // A scale stays while a weigh-in or a piece names it (the find panel shows its name).
  `delete from scales where deleted_at is not null and deleted_at < ?
     and not exists (select 1 from weigh_ins w where w.scale_id = scales.id)
     and not exists (select 1 from barren_rocks b where b.scale_id = scales.id) returning seq`,
  `delete from finds where deleted_at is not null and deleted_at < ?
     and not exists (select 1 from photos p where p.find_id = finds.id)
     and not exists (select 1 from weigh_ins w where w.find_id = finds.id)
     and not exists (select 1 from reviews r where r.find_id = finds.id)
     and not exists (select 1 from recovery_finds rf where rf.find_id = finds.id) returning seq`,
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
        for (const { seq, storageKey } of statement(sqlite, text).all(cutoff) as { seq: number; storageKey?: string | null }[]) {
          purged++;
          horizon = Math.max(horizon, seq);
          // The photo's bytes go too, once this deletion is final (deletePurgedPhotoBytes).
          if (storageKey) statement(sqlite, "insert or ignore into photo_bytes_to_delete (storage_key, since) values (?, ?)").run(storageKey, now);
        }
      }
      statement(sqlite, "insert into sequences (name, value) values ('tombstone_horizon', ?) on conflict(name) do update set value = excluded.value").run(
        horizon,
      );
      return { purged, horizon };
    })
    .immediate();
}

/**
 * Removes from storage the bytes of photos whose deletion became final. Each key is forgotten
 * only after storage confirms, so a failure is retried at the next purge.
 */
export async function deletePurgedPhotoBytes(): Promise<{ deleted: number; failed: number }> {
  const sqlite = getDb().$client;
  const keys = (statement(sqlite, "select storage_key as key from photo_bytes_to_delete").all() as { key: string }[]).map((r) => r.key);
  let deleted = 0;
  let failed = 0;
  for (const key of keys) {
    try {
      await photoStorage().delete(key);
      statement(sqlite, "delete from photo_bytes_to_delete where storage_key = ?").run(key);
      deleted++;
    } catch (error) {
      failed++;
      logger.warn({ code: "storage_delete_failed", key, reason: (error as Error).message }, "photo bytes not deleted; retried at the next purge");
    }
  }
  return { deleted, failed };
}
