import fc from "fast-check";
import { PMTiles, zxyToTileId, type Source } from "pmtiles";
import { describe, expect, it } from "vitest";
import { checkDirectory, checkHeader, decodeDirectory } from "@/lib/pmtiles/archive";
import { TEST_TILE_COLOURS, testArchive } from "../../../tests/support/basemap";
import { tileIdOf } from "./pmtiles-writer";
import zlib from "node:zlib";

/** The `pmtiles` package's reader over bytes in memory. */
function reader(bytes: Buffer): PMTiles {
  const source: Source = {
    getKey: () => "memory",
    getBytes: async (offset, length) => ({ data: bytes.buffer.slice(bytes.byteOffset + offset, bytes.byteOffset + offset + length) as ArrayBuffer }),
  };
  return new PMTiles(source);
}

describe("our PMTiles writer, read back by the pmtiles package", () => {
  it("numbers tiles on the Hilbert curve as the specification does", () => {
    // PMTiles v3 specification §2.2 (tile IDs): zoom 0 is 0, zoom 1 runs 1–4 in Hilbert order.
    expect([tileIdOf(0, 0, 0), tileIdOf(1, 0, 0), tileIdOf(1, 0, 1), tileIdOf(1, 1, 1), tileIdOf(1, 1, 0)]).toEqual([0, 1, 2, 3, 4]);
    expect(tileIdOf(2, 0, 0)).toBe(5);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 26 }).chain((z) => fc.tuple(fc.constant(z), fc.nat(2 ** z - 1), fc.nat(2 ** z - 1))),
        ([z, x, y]) => tileIdOf(z, x, y) === zxyToTileId(z, x, y),
      ),
    );
  });

  it("writes an archive whose every tile, header field and metadata the reader returns unchanged", async () => {
    const { bytes, tiles } = testArchive();
    const archive = reader(bytes);
    const header = await archive.getHeader();
    expect(header).toMatchObject({ specVersion: 3, tileType: 2, minZoom: 0, maxZoom: 2, minLon: -120, minLat: 30, maxLon: -110, maxLat: 45, clustered: true });
    expect(header.numAddressedTiles).toBe(tiles.length);
    expect(header.numTileContents).toBe(tiles.length - 1); // 1/0/1 and 1/1/1 share their bytes
    for (const t of tiles) expect(Buffer.from((await archive.getZxy(t.z, t.x, t.y))!.data)).toEqual(Buffer.from(t.data));
    expect(await archive.getZxy(2, 0, 0)).toBeUndefined();
    expect(await archive.getMetadata()).toEqual({ name: "test ground" });
    expect(Object.keys(TEST_TILE_COLOURS)).toHaveLength(tiles.length);
  });

  it("stores a run of identical tiles as one entry", async () => {
    const { solidPng } = await import("./png");
    const same = solidPng([1, 2, 3], 8);
    const { writePmtiles } = await import("./pmtiles-writer");
    const bytes = writePmtiles(
      [0, 1, 2, 3].map((x) => ({ z: 2, x, y: 0, data: same })),
      { tileType: "png", bounds: [-1, -1, 1, 1] },
    );
    const checked = checkHeader(bytes, bytes.length);
    expect(checked.ok).toBe(true);
    if (!checked.ok) return;
    const root = decodeDirectory(zlib.gunzipSync(bytes.subarray(checked.header.rootOffset, checked.header.rootOffset + checked.header.rootLength)));
    expect(checkDirectory(root, checked.header)).toBeNull();
    expect(root.reduce((n, e) => n + e.runLength, 0)).toBe(4);
    for (const x of [0, 1, 2, 3]) expect(Buffer.from((await reader(bytes).getZxy(2, x, 0))!.data)).toEqual(same);
  });

  it("refuses a tile given twice", async () => {
    const { writePmtiles } = await import("./pmtiles-writer");
    const data = new Uint8Array([1]);
    expect(() =>
      writePmtiles(
        [
          { z: 1, x: 0, y: 0, data },
          { z: 1, x: 0, y: 0, data },
        ],
        { tileType: "png", bounds: [-1, -1, 1, 1] },
      ),
    ).toThrow(/twice/);
  });
});
