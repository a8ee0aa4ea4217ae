import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { Readable } from "node:stream";
import { requireActor } from "@/server/auth/actor";
import { backupTo, recordBackupDownload } from "@/server/backup";
import { route } from "@/server/http";

/**
 * A consistent backup of the club's database, for an officer to keep somewhere safe. Streamed
 * from a temporary copy (SQLite's online backup), never read whole into memory. The copy is
 * opened, then its folder removed at once: the open file lives until the stream closes, and
 * nothing is left behind if the download is abandoned.
 */
export const GET = route(async (req) => {
  const actor = await requireActor(req, "downloadBackup", "club");
  const dir = await fs.mkdtemp(path.join(os.tmpdir(), "lodebook-backup-"));
  const file = path.join(dir, "lodebook.db");
  try {
    await backupTo(file);
    const handle = await fs.open(file, "r");
    const { size } = await handle.stat();
    await fs.rm(dir, { recursive: true, force: true });
    recordBackupDownload(actor.id, size);
    return new Response(Readable.toWeb(handle.createReadStream()) as ReadableStream<Uint8Array>, {
      headers: {
        "Content-Type": "application/vnd.sqlite3",
        "Content-Length": String(size),
        "Content-Disposition": `attachment; filename="lodebook-${new Date().toISOString().slice(0, 10)}.db"`,
        "Cache-Control": "no-store",
        "X-Content-Type-Options": "nosniff",
      },
    });
  } catch (error) {
    await fs.rm(dir, { recursive: true, force: true });
    throw error;
  }
});
