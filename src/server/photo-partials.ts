import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { serverEnv } from "./env";

/** A partial upload not added to for this long is abandoned, and removed. */
export const PARTIAL_KEEP_MS = 24 * 3600 * 1000;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Where partial uploads live: one folder per member, one file per photo, both named by the server's ids. */
export function uploadRoot(): string {
  const env = serverEnv();
  return path.resolve(env.LODEBOOK_UPLOAD_DIR ?? path.join(env.LODEBOOK_PHOTO_DIR, ".partial"));
}

export function partialPath(memberId: string, photoId: string): string {
  // Both come from the database and the route's parsed id; checked again so no path can escape.
  if (!UUID.test(memberId) || !UUID.test(photoId)) throw new Error("unsafe partial upload name");
  return path.join(uploadRoot(), memberId, photoId);
}

/** Bytes the server holds of a photo's partial upload (0 when none). */
export async function heldBytes(file: string): Promise<number> {
  try {
    return (await fs.stat(file)).size;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return 0;
    throw error;
  }
}

/** Bytes of a member's partial uploads (they count toward the photo quota), but for one photo's. */
export async function partialBytesOf(memberId: string, exceptPhotoId?: string): Promise<number> {
  let names: string[];
  try {
    names = await fs.readdir(path.join(uploadRoot(), memberId));
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return 0;
    throw error;
  }
  let total = 0;
  for (const name of names) if (name !== exceptPhotoId) total += await heldBytes(path.join(uploadRoot(), memberId, name));
  return total;
}

export async function discardPartial(memberId: string, photoId: string): Promise<void> {
  await fs.rm(partialPath(memberId, photoId), { force: true });
}

/** Removes partial uploads nobody has added to for PARTIAL_KEEP_MS, and member folders left empty. */
export async function sweepAbandonedPartials(now = Date.now()): Promise<number> {
  const root = uploadRoot();
  let removed = 0;
  let members: string[];
  try {
    members = await fs.readdir(root);
  } catch {
    return 0;
  }
  for (const member of members) {
    const dir = path.join(root, member);
    const files = await fs.readdir(dir).catch(() => [] as string[]);
    for (const name of files) {
      const file = path.join(dir, name);
      const stat = await fs.stat(file).catch(() => null);
      if (stat && now - stat.mtimeMs > PARTIAL_KEEP_MS) {
        await fs.rm(file, { force: true });
        removed++;
      }
    }
    await fs.rmdir(dir).catch(() => undefined); // only succeeds when empty
  }
  return removed;
}

let lastSweep = 0;
/** The sweep, at most once an hour, from the upload path itself (no timer to run). */
export function sweepNowAndThen(now = Date.now()): void {
  if (now - lastSweep < 3600_000) return;
  lastSweep = now;
  void sweepAbandonedPartials(now).catch(() => undefined);
}

const locks = new Map<string, Promise<unknown>>();
/**
 * One request at a time per photo: a chunk sent again after a cut waits until the server has
 * finished with the cut one, so the two never write into the file together.
 */
export async function withPhotoLock<T>(photoId: string, fn: () => Promise<T>): Promise<T> {
  const before = locks.get(photoId) ?? Promise.resolve();
  const run = before.catch(() => undefined).then(fn);
  const tail = run.catch(() => undefined);
  locks.set(photoId, tail);
  try {
    return await run;
  } finally {
    if (locks.get(photoId) === tail) locks.delete(photoId);
  }
}
