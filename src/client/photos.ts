import { PHOTO_SEND_EDGE, PHOTO_SEND_QUALITY } from "@/lib/entities/constants";
import type { LodebookDb, LocalPhoto } from "./device-db";
import { enqueue, loadValidation, newId, stripLocal } from "./logbook";

export type PhotoMeta = { takenAt: number | null; lat: number | null; lon: number | null };

/** GPS position and time from a photo's EXIF, read before shrinking drops them. */
export async function readPhotoMeta(file: Blob | ArrayBuffer): Promise<PhotoMeta> {
  // Loaded when a photo is added, not with the screen (a precached chunk, so offline too).
  const { default: exifr } = await import("exifr");
  try {
    const bytes = file instanceof ArrayBuffer ? file : await file.arrayBuffer();
    const tags = (await exifr.parse(bytes, {
      gps: true,
      tiff: true,
      exif: true,
      pick: ["DateTimeOriginal", "CreateDate", "GPSLatitude", "GPSLongitude", "GPSLatitudeRef", "GPSLongitudeRef"],
    })) as { DateTimeOriginal?: Date; CreateDate?: Date; latitude?: number; longitude?: number } | undefined;
    const when = tags?.DateTimeOriginal ?? tags?.CreateDate;
    const lat = typeof tags?.latitude === "number" && Number.isFinite(tags.latitude) ? tags.latitude : null;
    const lon = typeof tags?.longitude === "number" && Number.isFinite(tags.longitude) ? tags.longitude : null;
    return {
      takenAt: when instanceof Date && !Number.isNaN(when.getTime()) ? when.getTime() : null,
      lat: lon === null ? null : lat,
      lon: lat === null ? null : lon,
    };
  } catch {
    return { takenAt: null, lat: null, lon: null };
  }
}

export const THUMB_EDGE = 320;

/**
 * Shrinks on the device to what a club needs (long edge 1600 px, JPEG quality 0.7: about
 * 190 kB from a 12 MP photo, chosen by the bench's photo study, see README): a day's photos
 * go up a 1 Mbit/s camp link in under two minutes and keep the gold's detail zoomed 2×.
 */
export async function shrinkImage(file: Blob, maxEdge = PHOTO_SEND_EDGE, quality = PHOTO_SEND_QUALITY): Promise<{ blob: Blob; width: number; height: number }> {
  const bitmap = await createImageBitmap(file, { imageOrientation: "from-image" });
  const scale = Math.min(1, maxEdge / Math.max(bitmap.width, bitmap.height));
  const width = Math.max(1, Math.round(bitmap.width * scale));
  const height = Math.max(1, Math.round(bitmap.height * scale));
  const canvas = new OffscreenCanvas(width, height);
  const ctx = canvas.getContext("2d");
  if (!ctx) throw new Error("This browser cannot shrink photos.");
  ctx.drawImage(bitmap, 0, 0, width, height);
  bitmap.close();
  // A canvas re-encode carries no EXIF: the GPS stays in the record, not in the bytes.
  const blob = await canvas.convertToBlob({ type: "image/jpeg", quality });
  return { blob, width, height };
}

export async function sha256Hex(blob: Blob): Promise<string> {
  const digest = await crypto.subtle.digest("SHA-256", await blob.arrayBuffer());
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, "0")).join("");
}

export class StorageFullError extends Error {
  constructor() {
    super("This device is out of storage space, so the photo was not saved. Free some space (or sync and remove old photos) and try again.");
    this.name = "StorageFullError";
  }
}

function isQuotaError(error: unknown): boolean {
  const e = error as { name?: string; inner?: { name?: string } } | undefined;
  return e?.name === "QuotaExceededError" || e?.inner?.name === "QuotaExceededError";
}

/**
 * Adds a photo to a find: EXIF read, shrunk, hashed, and stored with its outbox entry in one
 * transaction. A find without a position takes the photo's GPS position.
 */
export async function addPhoto(db: LodebookDb, findId: string, file: Blob): Promise<{ photo: LocalPhoto; positionFromPhoto: boolean }> {
  const meta = await readPhotoMeta(file);
  const shrunk = await shrinkImage(file);
  const thumb = await shrinkImage(file, THUMB_EDGE, 0.7);
  const photo: LocalPhoto = {
    id: newId(),
    findId,
    sha256: await sha256Hex(shrunk.blob),
    contentType: "image/jpeg",
    bytes: shrunk.blob.size,
    width: shrunk.width,
    height: shrunk.height,
    takenAt: meta.takenAt,
    lat: meta.lat,
    lon: meta.lon,
    blob: shrunk.blob,
    thumb: thumb.blob,
    uploaded: 0,
    updatedAt: Date.now(),
  };
  let positionFromPhoto = false;
  await loadValidation();
  try {
    await db.transaction("rw", [db.photos, db.finds, db.outbox], async () => {
      const { blob: _b, thumb: _t, uploaded: _u, ...record } = photo;
      await db.photos.add(photo);
      await enqueue(db, "photo.put", stripLocal(record), photo.id);
      const find = await db.finds.get(findId);
      if (find && find.lat === null && meta.lat !== null && meta.lon !== null) {
        const updated = { ...stripLocal(find), lat: meta.lat, lon: meta.lon, accuracyM: null, locationSource: "photo" as const };
        await db.finds.put({ ...updated, updatedAt: Date.now() });
        await enqueue(db, "find.put", updated, findId);
        positionFromPhoto = true;
      }
    });
  } catch (error) {
    if (isQuotaError(error)) throw new StorageFullError();
    throw error;
  }
  return { photo, positionFromPhoto };
}
