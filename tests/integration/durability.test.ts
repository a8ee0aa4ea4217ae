import Database from "better-sqlite3";
import { spawn } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { v7 as uuidv7 } from "uuid";
import { describe, expect, it } from "vitest";
import { backupTo, integrityCheck, restoreFrom } from "@/server/backup";
import { closeDb, getDb } from "@/server/db";
import { MEMBER_EMAIL, memberByEmail, seededDatabase, sessionCookie } from "../support/test-db";
import { newFind, pull, push } from "../support/sync-client";

/** Runs the push child until killed; resolves with the last batch it acknowledged. */
function runUntilKilled(file: string, memberId: string, clientId: string, start: number, killAfterMs: number): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "tests/support/crash-child.ts", memberId, clientId, String(start)], {
      env: { ...process.env, DATABASE_URL: file, LODEBOOK_LOG: "silent" },
      stdio: ["ignore", "pipe", "pipe"],
    });
    let acked = start - 1;
    let buffer = "";
    let errors = "";
    child.stdout.on("data", (b: Buffer) => {
      buffer += b.toString();
      for (const m of buffer.matchAll(/ACK (\d+)\n/g)) acked = Math.max(acked, Number(m[1]));
      buffer = buffer.slice(buffer.lastIndexOf("\n") + 1);
    });
    child.stderr.on("data", (b: Buffer) => (errors += b.toString()));
    const timer = setTimeout(() => child.kill("SIGKILL"), killAfterMs);
    child.on("exit", (_code, signal) => {
      clearTimeout(timer);
      if (signal !== "SIGKILL") reject(new Error(`child ended on its own: ${errors}`));
      else resolve(acked);
    });
  });
}

describe("durability (RELIABILITY 17, 18)", () => {
  it("17: a push server killed with SIGKILL again and again keeps every acknowledged batch, and the file stays sound", async () => {
    const { db, file } = await seededDatabase();
    const member = memberByEmail(db, MEMBER_EMAIL);
    closeDb(); // the child owns the file now
    const clientId = uuidv7();
    let acked = 0;
    for (const ms of [1800, 2300, 2000, 2600]) acked = await runUntilKilled(file, member.id, clientId, acked + 1, ms);
    expect(acked).toBeGreaterThan(20);
    expect(integrityCheck(file)).toBe("ok");
    const check = new Database(file, { readonly: true });
    const stored = check.prepare("select last_mutation_id l from sync_clients where id = ?").get(clientId) as { l: number };
    // Acknowledged means committed: the server may hold more than the child reported, never less.
    expect(stored.l).toBeGreaterThanOrEqual(acked);
    const finds = (check.prepare("select count(*) n from finds where id like '0190a5f0-0000-7000-8000-%'").get() as { n: number }).n;
    expect(finds).toBe(stored.l);
    check.close();
  }, 60_000);

  it("18: a backup taken during writes passes integrity_check and restores into a working server", async () => {
    const { db } = await seededDatabase();
    const member = memberByEmail(db, MEMBER_EMAIL);
    const cookie = await sessionCookie(member);
    const clientId = uuidv7();
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-backup-"));
    const backup = path.join(dir, "copy.db");
    let id = 0;
    const writes = (async () => {
      for (let i = 0; i < 30; i++) await push(cookie, clientId, [{ id: ++id, name: "find.put", args: newFind() }]);
    })();
    await backupTo(backup);
    await writes;
    expect(integrityCheck(backup)).toBe("ok");
    const inBackup = (new Database(backup, { readonly: true }).prepare("select count(*) n from finds").get() as { n: number }).n;

    // Restore into a fresh place and serve from it: pushes and pulls work, the data is the backup's.
    const target = path.join(dir, "restored.db");
    restoreFrom(backup, target);
    closeDb();
    process.env.DATABASE_URL = target;
    expect((getDb().$client.prepare("select count(*) n from finds").get() as { n: number }).n).toBe(inBackup);
    const after = await push(cookie, uuidv7(), [{ id: 1, name: "find.put", args: newFind() }]);
    expect(after.body.results[0].status).toBe("applied");
    expect((await pull(cookie, clientId, 0, 10)).status).toBe(200);
  });
});
