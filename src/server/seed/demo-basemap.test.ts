import { PMTiles, type Source } from "pmtiles";
import { describe, expect, it } from "vitest";
import { makeDemoBasemap } from "./demo-basemap";

function reader(bytes: Buffer): PMTiles {
  const source: Source = {
    getKey: () => "memory",
    getBytes: async (offset, length) => ({ data: bytes.buffer.slice(bytes.byteOffset + offset, bytes.byteOffset + offset + length) as ArrayBuffer }),
  };
  return new PMTiles(source);
}

describe("the demo club's basemap", () => {
  it("makes the demo club's invented basemap small, over the demo claims, readable tile by tile", async () => {
    const bytes = makeDemoBasemap();
    expect(bytes.length).toBeLessThan(400 * 1024);
    const archive = reader(bytes);
    const header = await archive.getHeader();
    expect([header.minZoom, header.maxZoom]).toEqual([9, 15]);
    // Larkspur Bench's centre (41.8, -117.62) lies inside.
    expect(header.minLon).toBeLessThan(-117.62);
    expect(header.maxLon).toBeGreaterThan(-117.62);
    expect(header.minLat).toBeLessThan(41.8);
    expect(header.maxLat).toBeGreaterThan(41.8);
    const z = 15;
    const x = Math.floor(((-117.62 + 180) / 360) * 2 ** z);
    const r = (41.8 * Math.PI) / 180;
    const y = Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * 2 ** z);
    const tile = await archive.getZxy(z, x, y);
    expect(Buffer.from(tile!.data).subarray(0, 8)).toEqual(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
  });
});
