"use client";
// Device-database hooks of the member screens. The position and URL-hash hooks have modules
// of their own, so that a screen without them does not load them.
import { useLiveQuery } from "@/client/live-query";
import { compareNames } from "@/lib/text/compare-names";
import type { LodebookDb } from "./device-db";
import { DEFAULT_SETTINGS, readSettings, type MemberSettings } from "./settings";

/** The club's claims, by name. */
export const readClaims = (db: LodebookDb) => db.claims.toArray().then((c) => c.sort((a, b) => compareNames(a.name, b.name)));

/** The outing not yet ended, if any: where quick finds go. */
export const readCurrentOuting = async (db: LodebookDb) =>
  (await db.outings
    .orderBy("startedAt")
    .reverse()
    .filter((o) => o.endedAt === null)
    .first()) ?? null;

export function useClaims(db: LodebookDb) {
  return useLiveQuery(() => readClaims(db), [db]);
}

/** The member's settings as stored on the device; undefined until the device has answered. */
export function useStoredSettings(db: LodebookDb): MemberSettings | undefined {
  return useLiveQuery(() => readSettings(db), [db]);
}

/** The member's settings, the defaults until the device has answered. */
export function useSettings(db: LodebookDb): MemberSettings {
  return useStoredSettings(db) ?? DEFAULT_SETTINGS;
}

export function useCurrentOuting(db: LodebookDb) {
  return useLiveQuery(() => readCurrentOuting(db), [db]);
}
