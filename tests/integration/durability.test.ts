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

const STREAMS = 3;
const findPrefix = (stream: number) => `0190a5f0-0000-7000-800${stream}-%`;

/**
 * Runs the push child and kills it with SIGKILL once it has acknowledged `killAfter` batches
 * (an event, not a guessed delay: the next batches are then in flight). Resolves with the last
 * id each stream had acknowledged.
 */
function runUntilKilled(file: string, memberId: string, clientIds: string[], acked: number[], killAfter: number): Promise<number[]> {
  return new Promise((resolve, reject) => {
    const starts = acked.map((n) => n + 1).join(",");
    const child = spawn(
      process.execPath,
      ["--conditions=react-server", "--import", "tsx", "tests/support/crash-child.ts", memberId, clientIds.join(","), starts],
      {
        env: { ...process.env, DATABASE_URL: file, LODEBOOK_LOG: "silent" },
        stdio: ["ignore", "pipe", "pipe"],
      },
    );
    const last = [...acked];
    let acks = 0;
    let buffer = "";
    let errors = "";
    child.stdout.on("data", (b: Buffer) => {
      buffer += b.toString();
      const lines = buffer.split("\n");
      buffer = lines.pop()!;
      for (const line of lines) {
        const m = /^ACK (\d+) (\d+)$/.exec(line);
        if (!m) continue;
        last[Number(m[1])] = Math.max(last[Number(m[1])], Number(m[2]));
        if (++acks === killAfter) child.kill("SIGKILL");
      }
    });
    child.stderr.on("data", (b: Buffer) => (errors += b.toString()));
    child.on("exit", (_code, signal) => {
      if (signal !== "SIGKILL") reject(new Error(`child ended on its own: ${errors}`));
      else resolve(last);
    });
  });
}

describe("durability (RELIABILITY 17, 18, 41)", () => {
  it("17: a push server killed with SIGKILL again and again keeps every acknowledged batch, and the file stays sound", async () => {
    const { db, file } = await seededDatabase();
    const member = memberByEmail(db, MEMBER_EMAIL);
    closeDb(); // the child owns the file now
    const clientIds = Array.from({ length: STREAMS }, () => uuidv7());
    let acked = clientIds.map(() => 0);
    // Kill after a different number of acknowledgements each time, so the kill meets the work at different points.
    for (const killAfter of [4, 9, 6, 11, 5]) acked = await runUntilKilled(file, member.id, clientIds, acked, killAfter);
    expect(acked.reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(20 * (4 + 9 + 6 + 11 + 5));
    expect(integrityCheck(file)).toBe("ok");
    const check = new Database(file, { readonly: true });
    clientIds.forEach((clientId, stream) => {
      const stored = check.prepare("select last_mutation_id l from sync_clients where id = ?").get(clientId) as { l: number } | undefined;
      // Acknowledged means committed: the server may hold more than the child reported, never less.
      expect(stored?.l ?? 0).toBeGreaterThanOrEqual(acked[stream]);
      const finds = (check.prepare("select count(*) n from finds where id like ?").get(findPrefix(stream)) as { n: number }).n;
      expect(finds).toBe(stored?.l ?? 0);
    });
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

describe("the backup download", () => {
  it("streams a copy that passes integrity_check and opens with the club's data, and leaves no copy behind", async () => {
    const os = await import("node:os");
    const fsp = await import("node:fs/promises");
    const path = await import("node:path");
    const Database = (await import("better-sqlite3")).default;
    const { GET } = await import("@/app/api/club/backup/route");
    const { seededDatabase, sessionCookie, memberByEmail, OFFICER_EMAIL, req } = await import("../support/test-db");
    const { db } = await seededDatabase();
    const before = (await fsp.readdir(os.tmpdir())).filter((n) => n.startsWith("lodebook-backup-")).length;
    const res = await GET(req("/api/club/backup", { cookie: await sessionCookie(memberByEmail(db, OFFICER_EMAIL)) }), {});
    expect(res.status).toBe(200);
    // Nothing is left in the temp folder, even before the download is read.
    expect((await fsp.readdir(os.tmpdir())).filter((n) => n.startsWith("lodebook-backup-")).length).toBe(before);
    expect(res.body).toBeInstanceOf(ReadableStream);
    const bytes = Buffer.from(await res.arrayBuffer());
    expect(Number(res.headers.get("content-length"))).toBe(bytes.length);
    const out = path.join(os.tmpdir(), `lodebook-check-${process.pid}.db`);
    await fsp.writeFile(out, bytes);
    const copy = new Database(out, { readonly: true });
    expect(copy.pragma("integrity_check", { simple: true })).toBe("ok");
    expect((copy.prepare("select count(*) n from finds").get() as { n: number }).n).toBe(
      (db.$client.prepare("select count(*) n from finds").get() as { n: number }).n,
    );
    copy.close();
    await fsp.rm(out, { force: true });
  });
});
