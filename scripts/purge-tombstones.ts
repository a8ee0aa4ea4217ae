import { closeDb } from "../src/server/db";
import { deletePurgedPhotoBytes, purgeTombstones, tombstoneDays } from "../src/server/sync/tombstones";
import { applyLocalDefaults } from "./lib/env";

// npm run db:purge-tombstones: drop deletions older than LODEBOOK_TOMBSTONE_DAYS (default 180).
// Devices away longer than that resync in full at their next camp sync.
applyLocalDefaults();
const { purged, horizon } = purgeTombstones();
const bytes = await deletePurgedPhotoBytes();
closeDb();
console.log(
  `Removed the bytes of ${bytes.deleted} photo${bytes.deleted === 1 ? "" : "s"} from storage${bytes.failed ? `; ${bytes.failed} could not be removed and will be tried again` : ""}.`,
);
console.log(`Purged ${purged} deletion${purged === 1 ? "" : "s"} older than ${tombstoneDays()} days; devices below change ${horizon} will resync in full.`);
