import "server-only";
import crypto from "node:crypto";
import { and, eq, isNotNull, sql } from "drizzle-orm";
import { MAX_PHOTO_BYTES, MAX_PHOTO_EDGE } from "@/lib/entities/photo";
import { can } from "@/lib/roles";
import type { Actor } from "./auth/actor";
import { getDb } from "./db";
import { serverEnv } from "./env";
import { photos } from "./db/schema";
import { AppError } from "./errors";
import { readBodyLimited } from "./http";
import { inspectJpeg, stripJpegMetadata } from "./jpeg";
import { partialBytesOf } from "./photo-partials";
import { photoStorage } from "./storage";

/** Photo bytes one member may keep on the club's server (LODEBOOK_PHOTO_QUOTA_MB). */
const memberPhotoQuotaBytes = () => Math.floor(serverEnv().LODEBOOK_PHOTO_QUOTA_MB * 1024 * 1024);

export type PhotoRow = { id: string; memberId: string; sha256: string; bytes: number; storageKey: string | null; deletedAt: number | null };

export function photoFor(actor: Actor, id: string, forWrite: boolean): PhotoRow {
  const row = getDb()
    .select({
      id: photos.id,
      memberId: photos.memberId,
      sha256: photos.sha256,
      bytes: photos.bytes,
      storageKey: photos.storageKey,
      deletedAt: photos.deletedAt,
    })
    .from(photos)
    .where(eq(photos.id, id))
    .get();
  const allowed = row && !row.deletedAt && (row.memberId === actor.id || (!forWrite && can(actor.role, "viewLedger")));
  // 404 for what the caller may not know exists.
  if (!row || !allowed) throw new AppError("not_found:photo", "No such photo.");
  return row;
}

/**
 * Throws when `more` bytes would take the member past their photo space: what storage holds
 * (deleted photos awaiting their purge included), uploads on their way to storage, and
 * uploads still coming in chunk by chunk (all but `exceptPartial`, which `more` replaces).
 */
export async function checkQuota(memberId: string, more: number, exceptPartial?: string): Promise<void> {
  const used = getDb()
    .select({ total: sql<number>`coalesce(sum(${photos.storedBytes}), 0)` })
    .from(photos)
    .where(and(eq(photos.memberId, memberId), isNotNull(photos.storageKey)))
    .get()!.total;
  const partial = await partialBytesOf(memberId, exceptPartial);
  if (used + (uploading.get(memberId) ?? 0) + partial + more > memberPhotoQuotaBytes()) {
    throw new AppError(
      "too_large:quota",
      "Your photo space on the club's server is full (deleted photos count until their keeping time ends). Ask an officer.",
    );
  }
}

/**
 * Stores a photo's bytes after its record: idempotent by id and SHA-256, checked to be a real
 * JPEG within the size and pixel limits, kept under a server-made name.
 */
export async function receivePhoto(actor: Actor, id: string, req: Request): Promise<{ stored: boolean; sha256: string }> {
  const row = photoFor(actor, id, true);
  const bytes = await readBodyLimited(req, MAX_PHOTO_BYTES, "photo", `A photo may be at most ${Math.round(MAX_PHOTO_BYTES / 1024 / 1024)} MB after shrinking.`);
  return storeCheckedPhoto(actor, row, bytes);
}

/** The checks every complete upload passes (whole or the last chunk), then the store. */
export async function storeCheckedPhoto(actor: Actor, row: PhotoRow, bytes: Buffer): Promise<{ stored: boolean; sha256: string }> {
  const sha256 = crypto.createHash("sha256").update(bytes).digest("hex");
  if (sha256 !== row.sha256) {
    throw new AppError("bad_request:photo", "The bytes do not match the photo's SHA-256: the upload was cut or changed. Send it again.", {
      sha256: ["mismatch"],
    });
  }
  if (row.storageKey) return { stored: false, sha256 }; // already here: nothing to do
  const size = inspectJpeg(bytes);
  if (!size) throw new AppError("unsupported:photo", "That file is not a JPEG photo.", { contentType: ["not a JPEG"] });
  if (size.width > MAX_PHOTO_EDGE || size.height > MAX_PHOTO_EDGE) {
    throw new AppError("too_large:photo", `Photos may be at most ${MAX_PHOTO_EDGE} pixels on a side.`, {
      width: [String(size.width)],
      height: [String(size.height)],
    });
  }
  // Uploads still being written count too: checked and recorded only after storage answers,
  // a burst sent at once would all pass the check against the same total. This photo's own
  // partial upload (if it came in chunks) is what is being stored, so it is not counted twice.
  await checkQuota(actor.id, bytes.length, row.id);
  uploading.set(actor.id, (uploading.get(actor.id) ?? 0) + bytes.length);
  try {
    const key = `p/${row.id}`;
    await photoStorage().put(key, bytes, "image/jpeg");
    getDb()
      .update(photos)
      .set({ storageKey: key, storedBytes: bytes.length, uploadedAt: Date.now(), width: size.width, height: size.height })
      .where(eq(photos.id, row.id))
      .run();
  } finally {
    const left = (uploading.get(actor.id) ?? 0) - bytes.length;
    if (left > 0) uploading.set(actor.id, left);
    else uploading.delete(actor.id);
  }
  return { stored: true, sha256 };
}

/** Bytes of each member's uploads on their way to storage, not yet recorded in the database. */
const uploading = new Map<string, number>();

/** The photo as served: owner or officer only, with no EXIF. */
export async function servePhoto(actor: Actor, id: string): Promise<Buffer> {
  const row = photoFor(actor, id, false);
  if (!row.storageKey) throw new AppError("not_found:photo", "This photo has not reached the server yet.");
  const bytes = await photoStorage().get(row.storageKey);
  if (!bytes) throw new AppError("not_found:photo", "This photo has not reached the server yet.");
  const stripped = stripJpegMetadata(bytes);
  // Uploads are walked the same way before they are kept, so this is storage gone wrong.
  if (!stripped) throw new AppError("not_found:photo", "This photo cannot be read on the server.");
  return stripped;
}
