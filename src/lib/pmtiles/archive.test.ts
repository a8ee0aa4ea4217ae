import { describe, expect, it } from "vitest";
import { checkDirectory, checkHeader, decodeDirectory, HEADER_BYTES, type ArchiveHeader } from "./archive";

/** A header as PMTiles v3 §3 lays it out: root directory, metadata, no leaves, tile data. */
function header(edit: (view: DataView, bytes: Uint8Array) => void = () => {}): Uint8Array {
  const bytes = new Uint8Array(HEADER_BYTES);
  bytes.set(new TextEncoder().encode("PMTiles"), 0);
  bytes[7] = 3;
  const view = new DataView(bytes.buffer);
  const u64 = (at: number, v: number) => view.setBigUint64(at, BigInt(v), true);
  u64(8, 127); // root
  u64(16, 20);
  u64(24, 147); // metadata
  u64(32, 10);
  u64(40, 157); // leaves
  u64(48, 0);
  u64(56, 157); // tiles
  u64(64, 1000);
  bytes.set([1, 2, 1, 2, 0], 96); // clustered, gzip directories, plain tiles, PNG, from zoom 0
  bytes[101] = 14;
  [-117.7, 41.7, -117.5, 41.9].forEach((deg, i) => view.setInt32(102 + 4 * i, deg * 1e7, true));
  edit(view, bytes);
  return bytes;
}
const SIZE = 1157;

describe("PMTiles v3 header and directory checks", () => {
  it("reads a sound header", () => {
    const checked = checkHeader(header(), SIZE);
    expect(checked).toMatchObject({ ok: true, header: { rootOffset: 127, rootLength: 20, tileDataLength: 1000, tileType: "png", minZoom: 0, maxZoom: 14 } });
    if (checked.ok) expect(checked.header.bounds.map((d) => d.toFixed(4))).toEqual(["-117.7000", "41.7000", "-117.5000", "41.9000"]);
  });

  it.each([
    ["a short file", header().subarray(0, 100), SIZE, "header"],
    ["another format", header((_, b) => b.set([0x47, 0x49, 0x46], 0)), SIZE, "magic"],
    ["version 2", header((_, b) => b.set([0x50, 0x4d, 2, 0], 0)), SIZE, "version"],
    ["an archive shorter than its tiles", header(), SIZE - 1, "tile_data"],
    ["a root directory past 16 kB", header((v) => v.setBigUint64(8, 20_000n, true)), 40_000, "root_directory"],
    ["a section inside the header", header((v) => v.setBigUint64(24, 10n, true)), SIZE, "metadata"],
    ["an offset past 2^53", header((v) => v.setUint32(60, 0x400000, true)), SIZE, "tile_data"],
    ["zstd directories", header((_, b) => (b[97] = 4)), SIZE, "internal_compression"],
    ["brotli tiles", header((_, b) => (b[98] = 3)), SIZE, "tile_compression"],
    ["vector tiles", header((_, b) => (b[99] = 1)), SIZE, "tile_type"],
    ["zoom 27", header((_, b) => (b[101] = 27)), SIZE, "zoom"],
    ["west east of east", header((v) => v.setInt32(102, -117.4 * 1e7, true)), SIZE, "bounds"],
  ])("names the field of %s", (_, bytes, size, field) => {
    const checked = checkHeader(bytes, size);
    expect(checked.ok).toBe(false);
    if (!checked.ok) expect(checked.problem.field).toBe(field);
  });

  it("decodes a directory: deltas, run lengths, lengths, and offsets where 0 means right after the last", () => {
    // Two entries: tiles 5 (run 2, 100 bytes at 0) and 9 (a leaf, 40 bytes at 100).
    expect(decodeDirectory(Uint8Array.from([2, 5, 4, 2, 0, 100, 40, 1, 0]))).toEqual([
      { tileId: 5, runLength: 2, length: 100, offset: 0 },
      { tileId: 9, runLength: 0, length: 40, offset: 100 },
    ]);
    expect(() => decodeDirectory(Uint8Array.from([3, 1, 1]))).toThrow(RangeError);
    // A hostile count (8.4 million entries) over a few kilobytes of zeros is refused before any
    // entry is made, not decoded into hundreds of megabytes.
    const hostile = new Uint8Array(8192);
    hostile.set([0x80, 0x80, 0x80, 0x04]);
    expect(() => decodeDirectory(hostile)).toThrow(/more entries than it has bytes/);
    // Four bytes an entry is the least there can be: exactly that is read.
    expect(decodeDirectory(Uint8Array.from([1, 7, 1, 3, 1]))).toEqual([{ tileId: 7, runLength: 1, length: 3, offset: 0 }]);
    expect(() => decodeDirectory(Uint8Array.from([200, 1]))).toThrow(RangeError);
  });

  it("holds entries to tile-id order and to the section they point into", () => {
    const h = { tileDataLength: 150, leafLength: 50 } as ArchiveHeader;
    const e = (tileId: number, runLength: number, offset: number, length: number) => ({ tileId, runLength, offset, length });
    expect(checkDirectory([e(1, 1, 0, 100), e(2, 0, 0, 50)], h)).toBeNull();
    expect(checkDirectory([], h)?.message).toMatch(/no entries/);
    expect(checkDirectory([e(2, 1, 0, 10), e(1, 1, 10, 10)], h)?.message).toMatch(/order/);
    expect(checkDirectory([e(1, 1, 100, 51)], h)?.message).toMatch(/tile data/);
    expect(checkDirectory([e(1, 0, 0, 51)], h)?.message).toMatch(/leaf/);
  });
});
