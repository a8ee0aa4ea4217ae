import "fake-indexeddb/auto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll } from "vitest";

process.env.AUTH_SECRET ??= "test-secret-not-for-production-0123456789";
process.env.LODEBOOK_LOG ??= "silent";

// Every temporary folder a test file makes (databases, photos, mail, backups) goes under one
// root of its own, removed when the file's tests end: a run leaves nothing in the temp dir.
const root = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-tests-"));
process.env.TMPDIR = root;
afterAll(async () => {
  const { closeDb } = await import("@/server/db");
  closeDb();
  fs.rmSync(root, { recursive: true, force: true });
});
