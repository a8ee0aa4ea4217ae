import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { databasePath } from "../db";
import { serverEnv } from "../env";

/**
 * The club's basemap is one file in the data folder, beside the database: an officer uploads
 * it in the console, or places it there by hand (`basemap.pmtiles`). Uploads in progress wait
 * in `.basemap-upload`, in the same folder, so finishing one is a rename on one file system.
 */
export function basemapDir(): string {
  return path.dirname(databasePath());
}

export function basemapPath(): string {
  return path.join(basemapDir(), "basemap.pmtiles");
}

export function basemapUploadDir(): string {
  return path.join(basemapDir(), ".basemap-upload");
}

/** LODEBOOK_BASEMAP_MAX_MB (300 by default): see README, "Offline basemap". */
export function maxBasemapBytes(): number {
  return Math.floor(serverEnv().LODEBOOK_BASEMAP_MAX_MB * 1024 * 1024);
}

/** One chunk of an upload: under the front door's 8 MB, and a few seconds on a home uplink. */
export const MAX_BASEMAP_CHUNK_BYTES = 4 * 1024 * 1024;

/**
 * Puts a finished archive in place: flushed, renamed over the old one (readers holding the old
 * file open finish reading it), then the folder flushed so the rename survives a power cut.
 */
export async function installBasemap(from: string): Promise<void> {
  const handle = await fs.open(from, "r+");
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
  await fs.rename(from, basemapPath());
  await syncDir(basemapDir());
}

/** Writes a whole archive aside and renames it into place (the demo's invented basemap). */
export async function writeBasemap(bytes: Uint8Array): Promise<void> {
  await fs.mkdir(basemapUploadDir(), { recursive: true });
  const temp = path.join(basemapUploadDir(), `write-${process.pid}-${Date.now()}.partial`);
  await fs.writeFile(temp, bytes);
  await installBasemap(temp);
}

async function syncDir(dir: string): Promise<void> {
  const handle = await fs.open(dir, "r").catch(() => null);
  if (!handle) return;
  try {
    await handle.sync();
  } catch {
    // Some file systems refuse to flush a folder; the rename itself is still atomic.
  } finally {
    await handle.close();
  }
}
