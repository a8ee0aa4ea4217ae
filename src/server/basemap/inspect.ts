import "server-only";
import type { FileHandle } from "node:fs/promises";
import zlib from "node:zlib";
import {
  checkDirectory,
  checkHeader,
  COMPRESSION,
  decodeDirectory,
  HEADER_BYTES,
  ROOT_SPAN_BYTES,
  type ArchiveHeader,
  type ArchiveProblem,
} from "@/lib/pmtiles/archive";

export type Inspection = { ok: true; header: ArchiveHeader } | { ok: false; problem: ArchiveProblem };

/**
 * A root directory is at most 16 kB packed (spec §3); unpacked, a few times that. 512 kB (32
 * times) is ample, and bounds what a hostile file can make the server decode: at four bytes an
 * entry at least, 131 072 entries.
 */
const MAX_UNPACKED_BYTES = 512 * 1024;
const MAX_METADATA_BYTES = 1024 * 1024;

async function readAt(handle: FileHandle, offset: number, length: number): Promise<Uint8Array> {
  const buffer = Buffer.alloc(length);
  const { bytesRead } = await handle.read(buffer, 0, length, offset);
  return buffer.subarray(0, bytesRead);
}

function unpack(bytes: Uint8Array, compression: number, limit = MAX_UNPACKED_BYTES): Uint8Array {
  if (compression !== COMPRESSION.gzip) return bytes;
  return zlib.gunzipSync(bytes, { maxOutputLength: limit });
}

/** The header alone, from an archive's first bytes (an upload checks it as soon as they arrive). */
export async function inspectHeader(handle: FileHandle, size: number): Promise<Inspection> {
  return checkHeader(await readAt(handle, 0, HEADER_BYTES), size);
}

/**
 * The header, then the root directory (unpacked, decoded, every entry inside its section) and
 * the metadata (JSON when it is small enough to read): what a reader needs before its first
 * tile. Tiles themselves are not opened: a bad tile costs one blank square, not the map.
 */
export async function inspectArchive(handle: FileHandle, size: number): Promise<Inspection> {
  const first = await readAt(handle, 0, Math.min(size, ROOT_SPAN_BYTES));
  const checked = checkHeader(first, size);
  if (!checked.ok) return checked;
  const { header } = checked;
  const problem = (field: string, message: string): Inspection => ({ ok: false, problem: { field, message } });

  let root: Uint8Array;
  try {
    root = unpack(first.subarray(header.rootOffset, header.rootOffset + header.rootLength), header.internalCompression);
  } catch {
    return problem("root_directory", "cannot be unpacked with the compression the header names");
  }
  try {
    const wrong = checkDirectory(decodeDirectory(root), header);
    if (wrong) return { ok: false, problem: wrong };
  } catch (error) {
    return problem("root_directory", error instanceof RangeError ? error.message : "cannot be read");
  }

  if (header.metadataLength > 0 && header.metadataLength <= MAX_METADATA_BYTES) {
    try {
      const text = new TextDecoder("utf-8", { fatal: true }).decode(
        unpack(await readAt(handle, header.metadataOffset, header.metadataLength), header.internalCompression, MAX_METADATA_BYTES),
      );
      const meta: unknown = JSON.parse(text);
      if (typeof meta !== "object" || meta === null || Array.isArray(meta)) return problem("metadata", "is not a JSON object");
    } catch {
      return problem("metadata", "is not JSON (after unpacking)");
    }
  }
  return { ok: true, header };
}
