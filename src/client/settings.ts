import type { MassUnit } from "@/lib/estimate/units";
import type { LodebookDb } from "./device-db";
import { enqueue, loadValidation } from "./logbook";

/** The member's choices on this device. Location sharing and mail on a query also go to the club's server. */
export type MemberSettings = {
  massUnit: MassUnit;
  tempUnit: "C" | "F";
  scaleResolution: string;
  hostPreset: string;
  finenessPreset: string;
  locationSharing: "exact" | "claim";
  /** E-mail the member when an officer queries one of their finds. */
  mailOnQuery: boolean;
  tileUrl: string;
  /** "Records now, photos later": camp sync sends records and receives, and photos wait (this device only). */
  photosLater: boolean;
};

export const DEFAULT_SETTINGS: MemberSettings = {
  massUnit: "g",
  tempUnit: "C",
  scaleResolution: "0.01",
  // Preset ids, not the preset tables: those (with their sources) load with the weigh-in flow.
  hostPreset: "quartz",
  finenessPreset: "natural",
  locationSharing: "exact",
  mailOnQuery: false,
  tileUrl: "",
  photosLater: false,
};

export async function readSettings(db: LodebookDb): Promise<MemberSettings> {
  const rows = await db.settings.toArray();
  const stored = Object.fromEntries(rows.map((r) => [r.key, r.value]));
  return { ...DEFAULT_SETTINGS, ...stored } as MemberSettings;
}

export async function saveSettings(db: LodebookDb, changes: Partial<MemberSettings>): Promise<void> {
  await loadValidation();
  await db.transaction("rw", db.settings, db.outbox, async () => {
    const before = (await db.settings.get("locationSharing"))?.value ?? DEFAULT_SETTINGS.locationSharing;
    const mailBefore = (await db.settings.get("mailOnQuery"))?.value ?? DEFAULT_SETTINGS.mailOnQuery;
    await db.settings.bulkPut(Object.entries(changes).map(([key, value]) => ({ key, value })));
    const synced = {
      ...(changes.locationSharing && changes.locationSharing !== before ? { locationSharing: changes.locationSharing } : {}),
      ...(changes.mailOnQuery !== undefined && changes.mailOnQuery !== mailBefore ? { mailOnQuery: changes.mailOnQuery } : {}),
    };
    if (Object.keys(synced).length > 0) await enqueue(db, "settings.put", synced, "settings");
  });
}
