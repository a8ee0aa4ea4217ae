import "server-only";
import Database from "better-sqlite3";
import fs from "node:fs";
import path from "node:path";
import { audit } from "./audit";
import { getDb } from "./db";

/** A consistent copy of the live database, taken with SQLite's online backup API while writes go on. */
export async function backupTo(file: string): Promise<void> {
  fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  await getDb().$client.backup(file);
}

/** SQLite's own check of a database file: "ok" or the problems it found. */
export function integrityCheck(file: string): string {
  const db = new Database(file, { readonly: true, fileMustExist: true });
  try {
    return (db.pragma("integrity_check") as { integrity_check: string }[]).map((r) => r.integrity_check).join("; ");
  } finally {
    db.close();
  }
}

/**
 * Puts a backup in place of the database file. The server must be stopped: its WAL and
 * shared-memory files belong to the old database and are removed.
 */
export function restoreFrom(backup: string, target: string): void {
  const verdict = integrityCheck(backup);
  if (verdict !== "ok") throw new Error(`The backup fails SQLite's integrity check: ${verdict}`);
  for (const suffix of ["-wal", "-shm"]) fs.rmSync(`${target}${suffix}`, { force: true });
  const temp = `${target}.restoring`;
  fs.copyFileSync(backup, temp);
  fs.renameSync(temp, target);
}

/** The audit log's line for a backup an officer took away. */
export function recordBackupDownload(actorId: string, bytes: number): void {
  audit(getDb(), { actorId, action: "backup.download", entity: "database", entityId: null, after: { bytes } });
}
