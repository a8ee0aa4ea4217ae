"use client";
import { useSyncExternalStore } from "react";
import type { LodebookDb } from "./device-db";
import { useLiveQuery } from "./live-query";
import { syncStatus, type SyncStatus } from "./sync/status";

/**
 * Whether a camp sync ended without bringing anything: no signal, an error, a sign-in needed, an
 * app too old. ("done" is not one: a sync that ends so has stored its cursor, and the screen's
 * own query shows it a moment later; counting "done" here drew the empty screen for that moment.)
 */
const cameBackEmpty = (s: SyncStatus) => s.kind === "offline" || s.kind === "error" || s.kind === "needs-sign-in" || s.kind === "outdated";

// Latched for the page's life: a retry's "syncing" later on does not put the screens back to
// waiting once they have shown what the device holds.
let gaveUp = cameBackEmpty(syncStatus.get());
const subscribe = (onChange: () => void) =>
  syncStatus.subscribe(() => {
    if (gaveUp || !cameBackEmpty(syncStatus.get())) return;
    gaveUp = true;
    onChange();
  });
const hasGivenUp = () => gaveUp;
const notOnServer = () => false;

/**
 * A device query for a screen, undefined (the screen shows its skeleton) until the
 * device holds its first copy of the member's logbook. A phone just signed in has an empty
 * database until the first camp sync brings the club's copy: the list's "none yet" was not
 * true then, and its records arrived a moment later above the screen's form, pushing it down
 * the screen under the member's thumb. The copy is there once a pull has stored its cursor
 * (read with the list, in one query, so both come from the same state of the device), or a
 * sync has ended without one (no signal, an error): then the screen says what the device has,
 * which may be nothing yet.
 */
export function useQueryOnceCopied<T>(db: LodebookDb, querier: () => Promise<T>, deps: unknown[]): T | undefined {
  const givenUp = useSyncExternalStore(subscribe, hasGivenUp, notOnServer);
  const read = useLiveQuery(async () => ({ copied: (await db.meta.get("cursor")) !== undefined, value: await querier() }), [db, ...deps]);
  if (read === undefined || !(read.copied || givenUp)) return undefined;
  return read.value;
}
