import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import type { Actor } from "./auth/actor";
import { appendChunk } from "./append-chunk";
import { AppError } from "./errors";
import { discardPartial, heldBytes, partialPath, sweepNowAndThen, withPhotoLock } from "./photo-partials";
import { checkQuota, photoFor, storeCheckedPhoto } from "./photos";

/** The largest chunk one request may carry (devices send 256 kB). */
export const MAX_CHUNK_BYTES = 1024 * 1024;

/** Where an upload stands: bytes the server holds of `total` (the record's size), and whether it is stored. */
export type UploadState = { received: number; total: number; complete: boolean };

export async function uploadStatus(actor: Actor, id: string): Promise<UploadState> {
  const row = photoFor(actor, id, true);
  if (row.storageKey) return { received: row.bytes, total: row.bytes, complete: true };
  // After the chunk in progress (a cut one may still be draining), so the answer is final.
  return withPhotoLock(id, async () => ({ received: await heldBytes(partialPath(actor.id, id)), total: row.bytes, complete: false }));
}

/**
 * One chunk of a photo, appended at `offset`, which must be what the server holds (else 409
 * with the server's offset). Bytes are kept as they stream in, so a link cut mid-chunk keeps
 * what arrived and the device resumes from there. When the record's size is reached, the
 * whole photo passes the same checks as a whole upload and is stored; a refused photo's
 * partial is discarded, so the device starts again from 0.
 */
export async function receiveChunk(actor: Actor, id: string, offset: number, req: Request): Promise<UploadState & { stored?: boolean }> {
  const row = photoFor(actor, id, true);
  if (row.storageKey) return { received: row.bytes, total: row.bytes, complete: true, stored: false };
  sweepNowAndThen();
  const file = partialPath(actor.id, id);
  return withPhotoLock(id, async () => {
    const held = await heldBytes(file);
    if (offset !== held)
      throw new AppError("conflict:offset", `The server holds ${held} bytes of this photo: send from byte ${held}.`, { offset: [String(held)] });
    const declared = Number(req.headers.get("content-length") ?? "0");
    if (declared > MAX_CHUNK_BYTES) throw new AppError("too_large:chunk", `A chunk may be at most ${MAX_CHUNK_BYTES} bytes.`, { chunk: [String(declared)] });
    if (held + declared > row.bytes)
      throw new AppError("bad_request:offset", `The photo has ${row.bytes} bytes; this chunk would end past them.`, { offset: [String(offset)] });
    await checkQuota(actor.id, Math.min(row.bytes, held + (declared || MAX_CHUNK_BYTES)), id);
    const received = held + (await appendBody(req, file, row.bytes - held));
    if (received < row.bytes) return { received, total: row.bytes, complete: false };
    const bytes = await fs.readFile(file);
    try {
      const result = await storeCheckedPhoto(actor, row, bytes);
      await discardPartial(actor.id, id);
      return { received, total: row.bytes, complete: true, stored: result.stored };
    } catch (error) {
      // A refused photo (hash, not a JPEG, too large, quota) starts over; a storage failure keeps its bytes.
      if (error instanceof AppError) await discardPartial(actor.id, id);
      throw error;
    }
  });
}

/** The chunk, appended as it streams, flushed before the server says it holds it. */
async function appendBody(req: Request, file: string, room: number): Promise<number> {
  await fs.mkdir(path.dirname(file), { recursive: true });
  return appendChunk(req, file, { room, maxChunk: MAX_CHUNK_BYTES, pastEnd: "This chunk runs past the photo's size in its record.", durable: true });
}
