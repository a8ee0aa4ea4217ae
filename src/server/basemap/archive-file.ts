import "server-only";
import fs, { type FileHandle } from "node:fs/promises";
import type { Stats } from "node:fs";
import type { ArchiveProblem, RasterType } from "@/lib/pmtiles/archive";
import { logger } from "../log";
import { basemapPath } from "./files";
import { inspectArchive, type Inspection } from "./inspect";

/** What a device needs to know of the club's basemap before it downloads or reads it. */
export type BasemapInfo = {
  bytes: number;
  /** Changes whenever the file is replaced: a device holding another has an older copy. */
  etag: string;
  updatedAt: string;
  tileType: RasterType;
  minZoom: number;
  maxZoom: number;
  bounds: [number, number, number, number];
};

/**
 * The archive is never changed in place, only replaced by a rename, so its inode, size and
 * time of change name one version: a strong validator without reading the bytes (the same
 * choice many file servers make).
 */
function etagOf(stat: Stats): string {
  return `"${stat.ino.toString(36)}-${stat.size.toString(36)}-${Math.floor(stat.mtimeMs).toString(36)}"`;
}

// A file placed by hand is checked once per version, not on every range a map reads.
const inspected = new Map<string, Inspection>();

async function inspectOnce(etag: string, handle: FileHandle, size: number): Promise<Inspection> {
  const kept = inspected.get(etag);
  if (kept) return kept;
  const result = await inspectArchive(handle, size);
  if (!result.ok) logger.warn({ problem: result.problem, file: basemapPath() }, "the basemap in the data folder is not one Lodebook can serve");
  if (inspected.size > 16) inspected.clear();
  inspected.set(etag, result);
  return result;
}

export type OpenBasemap =
  { kind: "ready"; handle: FileHandle; info: BasemapInfo } | { kind: "refused"; handle: FileHandle; problem: ArchiveProblem; bytes: number } | { kind: "none" };

/**
 * Opens the club's basemap. Everything after (its check, every range served) reads through
 * this one handle, so an archive replaced meanwhile never mixes into the answer. The caller
 * closes the handle.
 */
export async function openBasemap(): Promise<OpenBasemap> {
  let handle: FileHandle;
  try {
    handle = await fs.open(basemapPath(), "r");
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return { kind: "none" };
    throw error;
  }
  try {
    const stat = await handle.stat();
    if (!stat.isFile()) {
      await handle.close();
      return { kind: "none" };
    }
    const etag = etagOf(stat);
    const checked = await inspectOnce(etag, handle, stat.size);
    if (!checked.ok) return { kind: "refused", handle, problem: checked.problem, bytes: stat.size };
    const { header } = checked;
    return {
      kind: "ready",
      handle,
      info: {
        bytes: stat.size,
        etag,
        updatedAt: stat.mtime.toISOString(),
        tileType: header.tileType,
        minZoom: header.minZoom,
        maxZoom: header.maxZoom,
        bounds: header.bounds,
      },
    };
  } catch (error) {
    await handle.close();
    throw error;
  }
}

/** The basemap's facts, or the problem that keeps it from being served; the file is closed again. */
export async function describeBasemap(): Promise<{ info: BasemapInfo | null; problem: (ArchiveProblem & { bytes: number }) | null }> {
  const open = await openBasemap();
  if (open.kind === "none") return { info: null, problem: null };
  await open.handle.close();
  return open.kind === "ready" ? { info: open.info, problem: null } : { info: null, problem: { ...open.problem, bytes: open.bytes } };
}

/** Forget checks of earlier versions (after an upload or removal). */
export function forgetInspections(): void {
  inspected.clear();
}
