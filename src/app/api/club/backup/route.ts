import fs from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { requireActor } from "@/server/auth/actor";
import { backupTo, recordBackupDownload } from "@/server/backup";
import { route } from "@/server/http";

/** A consistent backup of the club's database, for an officer to keep somewhere safe. */
export const GET = route(async (req) => {
  const actor = await requireActor(req, "downloadBackup", "club");
  const dir = await fs.mkdtemp(path.join(os.tmpdir(), "lodebook-backup-"));
  const file = path.join(dir, "lodebook.db");
  try {
    await backupTo(file);
    const bytes = await fs.readFile(file);
    recordBackupDownload(actor.id, bytes.length);
    return new Response(new Uint8Array(bytes), {
      headers: {
        "Content-Type": "application/vnd.sqlite3",
        "Content-Disposition": `attachment; filename="lodebook-${new Date().toISOString().slice(0, 10)}.db"`,
        "Cache-Control": "no-store",
        "X-Content-Type-Options": "nosniff",
      },
    });
  } finally {
    await fs.rm(dir, { recursive: true, force: true });
  }
});
