"use client";
// Device-database hooks of the member screens. The position and URL-hash hooks have modules
// of their own, so that a screen without them does not load them.
import { useLiveQuery } from "dexie-react-hooks";
import type { LodebookDb } from "./device-db";
import { DEFAULT_SETTINGS, readSettings, type MemberSettings } from "./settings";

export function useClaims(db: LodebookDb) {
  return useLiveQuery(() => db.claims.toArray().then((c) => c.sort((a, b) => a.name.localeCompare(b.name))), [db]);
}

export function useSettings(db: LodebookDb): MemberSettings {
  return useLiveQuery(() => readSettings(db), [db]) ?? DEFAULT_SETTINGS;
}

/** The outing not yet ended, if any: where quick finds go. */
export function useCurrentOuting(db: LodebookDb) {
  return useLiveQuery(
    async () =>
      (await db.outings
        .orderBy("startedAt")
        .reverse()
        .filter((o) => o.endedAt === null)
        .first()) ?? null,
    [db],
  );
}
