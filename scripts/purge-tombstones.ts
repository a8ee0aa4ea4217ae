import { closeDb } from "../src/server/db";
import { purgeTombstones, tombstoneDays } from "../src/server/sync/tombstones";
import { applyLocalDefaults } from "./lib/env";

// npm run db:purge-tombstones: drop deletions older than LODEBOOK_TOMBSTONE_DAYS (default 180).
// Devices away longer than that resync in full at their next camp sync.
applyLocalDefaults();
const { purged, horizon } = purgeTombstones();
closeDb();
console.log(`Purged ${purged} deletion${purged === 1 ? "" : "s"} older than ${tombstoneDays()} days; devices below change ${horizon} will resync in full.`);
