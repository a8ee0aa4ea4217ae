import "server-only";
import crypto from "node:crypto";
import zlib from "node:zlib";
import { COMPRESSION, HEADER_BYTES, ROOT_SPAN_BYTES, TILE_TYPE, type RasterType } from "@/lib/pmtiles/archive";

// A small writer of PMTiles version 3 archives (protomaps/PMTiles spec/v3/spec.md), for the
// demo's invented basemap and for tests: every tile in one root directory, so it suits
// archives of a few thousand tiles at most.

export type Tile = { z: number; x: number; y: number; data: Uint8Array };

/** The tile's position on the Hilbert curve of its zoom level, after every tile of the levels above (spec §2.2). */
export function tileIdOf(z: number, x: number, y: number): number {
  const n = 2 ** z;
  if (!Number.isInteger(z) || z < 0 || z > 26 || x < 0 || y < 0 || x >= n || y >= n) throw new RangeError(`no tile ${z}/${x}/${y}`);
  let d = 0;
  for (let s = n / 2; s >= 1; s /= 2) {
    const rx = (x & s) > 0 ? 1 : 0;
    const ry = (y & s) > 0 ? 1 : 0;
    d += s * s * ((3 * rx) ^ ry);
    // Rotate the quadrant so the curve's next order runs on from this one.
    if (ry === 0) {
      if (rx === 1) {
        x = n - 1 - x;
        y = n - 1 - y;
      }
      [x, y] = [y, x];
    }
  }
  return (4 ** z - 1) / 3 + d;
}

function varint(value: number, out: number[]): void {
  while (value >= 0x80) {
    out.push((value % 0x80) | 0x80);
    value = Math.floor(value / 0x80);
  }
  out.push(value);
}

type Entry = { tileId: number; offset: number; length: number; runLength: number };

/** Entry count, then tile-id deltas, run lengths, lengths and offsets (0: right after the previous entry) (spec §4). */
function encodeDirectory(entries: Entry[]): Uint8Array {
  const out: number[] = [];
  varint(entries.length, out);
  let last = 0;
  for (const e of entries) {
    varint(e.tileId - last, out);
    last = e.tileId;
  }
  for (const e of entries) varint(e.runLength, out);
  for (const e of entries) varint(e.length, out);
  entries.forEach((e, i) => varint(i > 0 && e.offset === entries[i - 1].offset + entries[i - 1].length ? 0 : e.offset + 1, out));
  return Uint8Array.from(out);
}

export type ArchiveOptions = {
  tileType: RasterType;
  /** West, south, east, north. */
  bounds: [number, number, number, number];
  metadata?: Record<string, unknown>;
};

/**
 * An archive of the tiles: header, gzipped root directory, gzipped JSON metadata, tile data.
 * Tiles are stored in tile-id order (clustered); identical tiles are stored once, and a run of
 * consecutive identical tiles is one entry.
 */
export function writePmtiles(tiles: Tile[], opts: ArchiveOptions): Buffer {
  if (tiles.length === 0) throw new RangeError("an archive needs at least one tile");
  const sorted = tiles.map((t) => ({ ...t, tileId: tileIdOf(t.z, t.x, t.y) })).sort((a, b) => a.tileId - b.tileId);
  const contents: Uint8Array[] = [];
  const byHash = new Map<string, { offset: number; length: number }>();
  const entries: Entry[] = [];
  let dataBytes = 0;
  for (const t of sorted) {
    const last = entries.at(-1);
    if (last && last.tileId + last.runLength - 1 === t.tileId) throw new RangeError(`tile ${t.z}/${t.x}/${t.y} is given twice`);
    const hash = crypto.createHash("sha256").update(t.data).digest("hex");
    let stored = byHash.get(hash);
    if (!stored) {
      stored = { offset: dataBytes, length: t.data.length };
      byHash.set(hash, stored);
      contents.push(t.data);
      dataBytes += t.data.length;
    }
    if (last && last.tileId + last.runLength === t.tileId && last.offset === stored.offset) last.runLength++;
    else entries.push({ tileId: t.tileId, offset: stored.offset, length: stored.length, runLength: 1 });
  }
  const root = zlib.gzipSync(encodeDirectory(entries));
  if (HEADER_BYTES + root.length > ROOT_SPAN_BYTES) throw new RangeError("too many tiles for one root directory: this writer makes small archives only");
  const metadata = zlib.gzipSync(Buffer.from(JSON.stringify(opts.metadata ?? {})));
  const zooms = sorted.map((t) => t.z);
  const [minZoom, maxZoom] = [Math.min(...zooms), Math.max(...zooms)];
  const [w, s, e, n] = opts.bounds;

  const header = Buffer.alloc(HEADER_BYTES);
  header.write("PMTiles", 0, "latin1");
  header[7] = 3;
  const u64 = (at: number, v: number) => header.writeBigUInt64LE(BigInt(v), at);
  const rootOffset = HEADER_BYTES;
  const metadataOffset = rootOffset + root.length;
  const dataOffset = metadataOffset + metadata.length;
  u64(8, rootOffset);
  u64(16, root.length);
  u64(24, metadataOffset);
  u64(32, metadata.length);
  u64(40, dataOffset); // no leaf directories
  u64(48, 0);
  u64(56, dataOffset);
  u64(64, dataBytes);
  u64(72, sorted.length); // addressed tiles
  u64(80, entries.length); // tile entries
  u64(88, contents.length); // tile contents
  header[96] = 1; // clustered
  header[97] = COMPRESSION.gzip;
  header[98] = COMPRESSION.none;
  header[99] = TILE_TYPE[opts.tileType];
  header[100] = minZoom;
  header[101] = maxZoom;
  const e7 = (at: number, v: number) => header.writeInt32LE(Math.round(v * 1e7), at);
  e7(102, w);
  e7(106, s);
  e7(110, e);
  e7(114, n);
  header[118] = minZoom; // centre zoom
  e7(119, (w + e) / 2);
  e7(123, (s + n) / 2);
  return Buffer.concat([header, root, metadata, ...contents]);
}
