"use client";
import { useSyncExternalStore } from "react";
import { FIRST_COPY_UNFINISHED, type LodebookDb } from "./device-db";
import { useLiveQuery } from "./live-query";
import { syncStatus, type SyncStatus } from "./sync/status";

/**
 * Whether a camp sync ended without bringing anything: no signal, an error, a sign-in needed, an
 * app too old. ("done" is not one: a sync that ends so has stored its cursor, and the screen's
 * own query shows it a moment later; counting "done" here drew the empty screen for that moment.)
 */
const cameBackEmpty = (s: SyncStatus) => s.kind === "offline" || s.kind === "error" || s.kind === "needs-sign-in" || s.kind === "outdated";

// Latched for the page's life: a retry's "syncing" later on does not put the screens back to
// waiting once they have shown what the device holds. Watched here, from the module's load, not
// by the screens: a sync that ends while the member is on a screen without the wait (Sync,
// Settings) still counts when they come back to one with it.
let gaveUp = cameBackEmpty(syncStatus.get());
const listeners = new Set<() => void>();
syncStatus.subscribe(() => {
  if (gaveUp || !cameBackEmpty(syncStatus.get())) return;
  gaveUp = true;
  listeners.forEach((l) => l());
});
const subscribe = (onChange: () => void) => {
  listeners.add(onChange);
  return () => void listeners.delete(onChange);
};
const hasGivenUp = () => gaveUp;
const notOnServer = () => false;

// The devices seen holding their copy. The cursor is never deleted (a resync sets it to 0), and
// a copy once whole is never marked unfinished again, so once seen it need not be read again: a
// live query that kept reading them would run the screen's whole read again after every sync,
// whose pull writes the cursor even when nothing changed.
const copied = new WeakSet<LodebookDb>();

async function holdsCopy(db: LodebookDb): Promise<boolean> {
  if (copied.has(db)) return true;
  const [cursor, unfinished] = await db.meta.bulkGet(["cursor", FIRST_COPY_UNFINISHED]);
  if (cursor === undefined || unfinished !== undefined) return false;
  copied.add(db);
  return true;
}

/**
 * A device query for a screen, undefined (the screen shows its skeleton) until the device holds
 * its first copy of the member's logbook. A phone just signed in has an empty database until
 * the first camp sync brings the club's copy: a list's "none yet" was not true then, and its
 * records arrived a moment later above the screen's form, pushing it down the screen under the
 * member's thumb. The copy is there once a pull has stored its cursor (stored with the pulled
 * records in one transaction, and read here before the screen's own read, so a cursor seen
 * means those records are seen too) and its last page (a first copy of several pages is marked
 * unfinished until then), or a sync has ended without it (no signal, an error): then the
 * screen says what the device has, which may be nothing yet.
 *
 * `enough` (optional) says an answer may show before the copy: a record page whose record is
 * already on the device (saved on it while the first pull ran) shows it; only "not on this
 * device" waits.
 */
export function useQueryOnceCopied<T>(db: LodebookDb, querier: () => Promise<T>, deps: unknown[], enough?: (value: T) => boolean): T | undefined {
  const givenUp = useSyncExternalStore(subscribe, hasGivenUp, notOnServer);
  const read = useLiveQuery(async () => ({ copied: await holdsCopy(db), value: await querier() }), [db, ...deps]);
  if (read === undefined) return undefined;
  return read.copied || givenUp || enough?.(read.value) ? read.value : undefined;
}
