import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { HEADER_BYTES, type ArchiveProblem } from "@/lib/pmtiles/archive";
import type { Actor } from "../auth/actor";
import { appendChunk } from "../append-chunk";
import { AppError } from "../errors";
import { describeBasemap, forgetInspections, type BasemapInfo } from "./archive-file";
import { basemapPath, basemapUploadDir, installBasemap, MAX_BASEMAP_CHUNK_BYTES, maxBasemapBytes } from "./files";
import { inspectArchive, inspectHeader } from "./inspect";

/** An upload nobody has added to for a day is abandoned, and removed at the next upload. */
const PARTIAL_KEEP_MS = 24 * 3600 * 1000;
/** Room left on the disk beyond the archive itself (the database and photos share it). */
const DISK_MARGIN_BYTES = 64 * 1024 * 1024;

export type BasemapUploadState = { received: number; total: number; complete: boolean; basemap?: BasemapInfo };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** One partial file per officer, named by their id and the archive's announced size. */
function partialPath(memberId: string, total: number): string {
  if (!UUID.test(memberId) || !Number.isSafeInteger(total)) throw new Error("unsafe partial upload name");
  return path.join(basemapUploadDir(), `${memberId}-${total}.partial`);
}

async function heldBytes(file: string): Promise<number> {
  return (await fs.stat(file).catch(() => null))?.size ?? 0;
}

export function refusal(problem: ArchiveProblem): AppError {
  return new AppError("bad_request:basemap", `This is not a basemap Lodebook can use: its ${problem.field} ${problem.message}.`, {
    [problem.field]: [problem.message],
  });
}

let queue: Promise<unknown> = Promise.resolve();
/** One chunk at a time for the whole club: two officers' uploads take turns, never write at once. */
function inTurn<T>(fn: () => Promise<T>): Promise<T> {
  const run = queue.catch(() => undefined).then(fn);
  queue = run.catch(() => undefined);
  return run;
}

/** Where an officer's upload of an archive of `total` bytes stands, so a cut upload goes on. */
export function basemapUploadStatus(actor: Actor, total: number): Promise<BasemapUploadState> {
  return inTurn(async () => ({ received: await heldBytes(partialPath(actor.id, total)), total, complete: false }));
}

/**
 * One chunk at `offset` of an archive of `total` bytes. Offset 0 starts the upload afresh;
 * any other must be what the server holds (else 409 with it). Bytes go to disk as they arrive.
 * The header is checked as soon as it is in, so a wrong file is refused at its first chunk;
 * the last chunk checks the directories and puts the archive in place by a rename.
 */
export function receiveBasemapChunk(actor: Actor, offset: number, total: number, req: Request): Promise<BasemapUploadState> {
  const limit = maxBasemapBytes();
  if (total > limit)
    throw new AppError(
      "too_large:basemap",
      `A basemap may be at most ${Math.round(limit / 1024 / 1024)} MB; this one is ${(total / 1024 / 1024).toFixed(1)} MB.`,
      {
        size: [`at most ${limit} bytes`],
      },
    );
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > MAX_BASEMAP_CHUNK_BYTES)
    throw new AppError("too_large:chunk", `A chunk may be at most ${MAX_BASEMAP_CHUNK_BYTES} bytes.`, { chunk: [String(declared)] });
  return inTurn(async () => {
    const file = partialPath(actor.id, total);
    if (offset === 0) await startAfresh(actor.id, total);
    const held = await heldBytes(file);
    if (offset !== held)
      throw new AppError("conflict:offset", `The server holds ${held} bytes of this upload: send from byte ${held}.`, { offset: [String(held)] });
    if (offset + declared > total)
      throw new AppError("bad_request:offset", `The archive has ${total} bytes; this chunk would end past them.`, { offset: [String(offset)] });
    const received = held + (await appendBody(req, file, total - held));
    try {
      if (held < HEADER_BYTES && received >= HEADER_BYTES) await checkPartial(file, total, "header");
      if (received < total) return { received, total, complete: false };
      await checkPartial(file, total, "archive");
    } catch (error) {
      await fs.rm(file, { force: true });
      throw error;
    }
    await installBasemap(file);
    forgetInspections();
    const { info } = await describeBasemap();
    return { received, total, complete: true, basemap: info ?? undefined };
  });
}

async function checkPartial(file: string, total: number, what: "header" | "archive"): Promise<void> {
  const handle = await fs.open(file, "r");
  try {
    const checked = what === "header" ? await inspectHeader(handle, total) : await inspectArchive(handle, total);
    if (!checked.ok) throw refusal(checked.problem);
  } finally {
    await handle.close();
  }
}

/** Drops the officer's earlier partials and any left for a day, and checks the disk has room. */
async function startAfresh(memberId: string, total: number): Promise<void> {
  const dir = basemapUploadDir();
  await fs.mkdir(dir, { recursive: true });
  const now = Date.now();
  for (const name of await fs.readdir(dir)) {
    const file = path.join(dir, name);
    const stat = await fs.stat(file).catch(() => null);
    if (name.startsWith(`${memberId}-`) || (stat && now - stat.mtimeMs > PARTIAL_KEEP_MS)) await fs.rm(file, { force: true });
  }
  // A file system that cannot say how much room it has is not checked (the write will say).
  const disk = await fs.statfs(dir).catch(() => null);
  const free = disk ? disk.bavail * disk.bsize : Infinity;
  if (free < total + DISK_MARGIN_BYTES)
    throw new AppError("unavailable:disk", `The server has ${Math.floor(free / 1024 / 1024)} MB free: too little for this basemap. Make room first.`, {
      size: ["more than the server's free space"],
    });
}

/** The chunk, appended as it streams; the archive is flushed once whole, when it is installed. */
function appendBody(req: Request, file: string, room: number): Promise<number> {
  return appendChunk(req, file, { room, maxChunk: MAX_BASEMAP_CHUNK_BYTES, pastEnd: "This chunk runs past the archive's announced size." });
}

/** Removes the club's basemap; devices keep their copies until their members remove them. */
export function removeBasemap(): Promise<boolean> {
  return inTurn(async () => {
    const existed = (await fs.stat(basemapPath()).catch(() => null)) !== null;
    await fs.rm(basemapPath(), { force: true });
    forgetInspections();
    return existed;
  });
}
