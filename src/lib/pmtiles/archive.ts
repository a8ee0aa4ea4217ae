/**
 * The parts of a PMTiles version 3 archive that Lodebook checks before it keeps or serves one:
 * the 127-byte header and the directories (PMTiles v3 specification, protomaps/PMTiles
 * `spec/v3/spec.md`). Pure: bytes in, facts or a named problem out.
 */

export const HEADER_BYTES = 127;
/** The header and the root directory lie within the first 16 384 bytes (spec §3), read in one request. */
export const ROOT_SPAN_BYTES = 16_384;

/** Header byte 97/98: how directories and tiles are compressed (spec §3.9). */
export const COMPRESSION = { unknown: 0, none: 1, gzip: 2, brotli: 3, zstd: 4 } as const;
/** Header byte 99 (spec §3.10). */
export const TILE_TYPE = { unknown: 0, mvt: 1, png: 2, jpeg: 3, webp: 4, avif: 5, mlt: 6 } as const;

export type RasterType = "png" | "jpeg" | "webp" | "avif";
const RASTER: Record<number, RasterType> = { 2: "png", 3: "jpeg", 4: "webp", 5: "avif" };
const COMPRESSION_NAME = ["unknown", "none", "gzip", "brotli", "zstd"];

export type ArchiveHeader = {
  rootOffset: number;
  rootLength: number;
  metadataOffset: number;
  metadataLength: number;
  leafOffset: number;
  leafLength: number;
  tileDataOffset: number;
  tileDataLength: number;
  addressedTiles: number;
  internalCompression: number;
  tileCompression: number;
  tileType: RasterType;
  minZoom: number;
  maxZoom: number;
  /** West, south, east, north in degrees. */
  bounds: [number, number, number, number];
};

/** What is wrong, with the header field (or part of the archive) it concerns. */
export type ArchiveProblem = { field: string; message: string };

export type HeaderCheck = { ok: true; header: ArchiveHeader } | { ok: false; problem: ArchiveProblem };

const fail = (field: string, message: string): HeaderCheck => ({ ok: false, problem: { field, message } });

/** A little-endian 64-bit unsigned integer, or null past 2^53 (no real archive is that large). */
function u64(view: DataView, at: number): number | null {
  const high = view.getUint32(at + 4, true);
  if (high >= 0x200000) return null;
  return high * 2 ** 32 + view.getUint32(at, true);
}

/**
 * Reads and checks a header against the size of the whole archive (`archiveBytes`): the magic
 * and version, every section inside the archive (the root directory within the first 16 kB),
 * compressions a browser can undo, raster tiles, zoom levels and bounds.
 */
export function checkHeader(bytes: Uint8Array, archiveBytes: number): HeaderCheck {
  if (bytes.length < HEADER_BYTES || archiveBytes < HEADER_BYTES)
    return fail("header", `is shorter than the ${HEADER_BYTES} bytes every PMTiles version 3 archive starts with`);
  const magic = String.fromCharCode(...bytes.subarray(0, 7));
  if (magic !== "PMTiles") {
    // Versions 1 and 2 began "PM" and a two-byte version number.
    if (bytes[0] === 0x50 && bytes[1] === 0x4d && (bytes[2] === 1 || bytes[2] === 2) && bytes[3] === 0)
      return fail("version", `is PMTiles version ${bytes[2]}; Lodebook reads version 3 (convert it with the pmtiles tool's "convert" command)`);
    return fail("magic", `does not start with "PMTiles": this file is not a PMTiles archive`);
  }
  if (bytes[7] !== 3) return fail("version", `is ${bytes[7]}; Lodebook reads PMTiles version 3`);

  const view = new DataView(bytes.buffer, bytes.byteOffset, HEADER_BYTES);
  const at = (offset: number) => u64(view, offset);
  const sections = [
    ["root_directory", 8],
    ["metadata", 24],
    ["leaf_directories", 40],
    ["tile_data", 56],
  ] as const;
  const spans: Record<string, [number, number]> = {};
  for (const [field, offset] of sections) {
    const start = at(offset);
    const length = at(offset + 8);
    if (start === null || length === null) return fail(field, "has an offset or length too large to be real");
    if (start + length > archiveBytes) return fail(field, `runs to byte ${start + length}, past the archive's end at ${archiveBytes}`);
    if (length > 0 && start < HEADER_BYTES) return fail(field, "starts inside the header");
    spans[field] = [start, length];
  }
  const [rootOffset, rootLength] = spans.root_directory;
  if (rootLength === 0) return fail("root_directory", "is empty");
  if (rootOffset + rootLength > ROOT_SPAN_BYTES)
    return fail("root_directory", `must end within the first ${ROOT_SPAN_BYTES} bytes (it ends at ${rootOffset + rootLength})`);
  if (spans.tile_data[1] === 0) return fail("tile_data", "is empty: the archive holds no tiles");

  const internalCompression = bytes[97];
  if (internalCompression !== COMPRESSION.none && internalCompression !== COMPRESSION.gzip)
    return fail(
      "internal_compression",
      `is ${COMPRESSION_NAME[internalCompression] ?? internalCompression}; a browser reads only gzip or uncompressed directories`,
    );
  const tileCompression = bytes[98];
  if (tileCompression !== COMPRESSION.none && tileCompression !== COMPRESSION.gzip && tileCompression !== COMPRESSION.unknown)
    return fail("tile_compression", `is ${COMPRESSION_NAME[tileCompression] ?? tileCompression}; Lodebook reads tiles stored plain or gzipped`);
  const tileType = RASTER[bytes[99]];
  if (!tileType)
    return fail(
      "tile_type",
      bytes[99] === TILE_TYPE.mvt || bytes[99] === TILE_TYPE.mlt
        ? "is vector tiles, which need a map style and fonts Lodebook does not carry offline: make the archive of raster tiles (PNG, JPEG or WebP)"
        : `is ${bytes[99]}; Lodebook shows raster tiles (PNG, JPEG, WebP or AVIF)`,
    );
  const minZoom = bytes[100];
  const maxZoom = bytes[101];
  if (minZoom > maxZoom || maxZoom > 26) return fail("zoom", `runs from ${minZoom} to ${maxZoom}; it must rise from min to max, at most 26`);
  const e7 = (offset: number) => view.getInt32(offset, true) / 1e7;
  const bounds: [number, number, number, number] = [e7(102), e7(106), e7(110), e7(114)];
  const [w, s, e, n] = bounds;
  if (!(w >= -180 && e <= 180 && w < e && s >= -90 && n <= 90 && s < n))
    return fail("bounds", `are ${bounds.join(", ")}: not a box west-south-east-north on the globe`);

  return {
    ok: true,
    header: {
      rootOffset,
      rootLength,
      metadataOffset: spans.metadata[0],
      metadataLength: spans.metadata[1],
      leafOffset: spans.leaf_directories[0],
      leafLength: spans.leaf_directories[1],
      tileDataOffset: spans.tile_data[0],
      tileDataLength: spans.tile_data[1],
      addressedTiles: at(72) ?? 0,
      internalCompression,
      tileCompression,
      tileType,
      minZoom,
      maxZoom,
      bounds,
    },
  };
}

/** One directory entry (spec §4): a run of tiles, or (run length 0) a leaf directory. */
export type DirectoryEntry = { tileId: number; runLength: number; length: number; offset: number };

function readVarint(bytes: Uint8Array, pos: { at: number }): number {
  let value = 0;
  for (let shift = 0; shift < 53; shift += 7) {
    if (pos.at >= bytes.length) throw new RangeError("directory ends inside a number");
    const b = bytes[pos.at++];
    value += (b & 0x7f) * 2 ** shift;
    if (b < 0x80) return value;
  }
  throw new RangeError("directory holds a number too large to be real");
}

/** Decodes an (uncompressed) directory: entry count, then tile-id deltas, run lengths, lengths, offsets. */
export function decodeDirectory(bytes: Uint8Array): DirectoryEntry[] {
  const pos = { at: 0 };
  const count = readVarint(bytes, pos);
  // Each entry takes at least four bytes (four numbers of at least one byte each): a count
  // beyond what the bytes left can hold is a corrupt or hostile directory, refused before any
  // entry is made.
  if (count * 4 > bytes.length - pos.at) throw new RangeError("directory claims more entries than it has bytes");
  const entries: DirectoryEntry[] = [];
  let tileId = 0;
  for (let i = 0; i < count; i++) {
    tileId += readVarint(bytes, pos);
    entries.push({ tileId, runLength: 1, length: 0, offset: 0 });
  }
  for (const e of entries) e.runLength = readVarint(bytes, pos);
  for (const e of entries) e.length = readVarint(bytes, pos);
  entries.forEach((e, i) => {
    const v = readVarint(bytes, pos);
    // 0 after the first entry: right after the previous one (spec §4.2).
    e.offset = v === 0 && i > 0 ? entries[i - 1].offset + entries[i - 1].length : v - 1;
  });
  return entries;
}

/** Entries in tile-id order, each pointing inside the section it belongs to. */
export function checkDirectory(entries: DirectoryEntry[], header: ArchiveHeader, field = "root_directory"): ArchiveProblem | null {
  if (entries.length === 0) return { field, message: "has no entries" };
  for (let i = 0; i < entries.length; i++) {
    const e = entries[i];
    if (e.offset < 0 || e.length === 0) return { field, message: `entry ${i} has no bytes` };
    if (i > 0 && e.tileId <= entries[i - 1].tileId) return { field, message: `entry ${i} is out of tile-id order` };
    const leaf = e.runLength === 0;
    const room = leaf ? header.leafLength : header.tileDataLength;
    if (e.offset + e.length > room)
      return { field, message: `entry ${i} points past the end of the ${leaf ? "leaf directories" : "tile data"} (${e.offset + e.length} > ${room})` };
  }
  return null;
}
