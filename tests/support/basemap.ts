import { solidPng } from "@/server/seed/png";
import { writePmtiles, type Tile } from "@/server/seed/pmtiles-writer";

/** Colours of the test archive's tiles, by "z/x/y". */
export const TEST_TILE_COLOURS: Record<string, [number, number, number]> = {
  "0/0/0": [200, 180, 140],
  "1/0/0": [190, 170, 130],
  "1/1/0": [180, 160, 120],
  "1/0/1": [170, 150, 110],
  "1/1/1": [170, 150, 110], // the same picture as 1/0/1: stored once
  "2/2/1": [120, 140, 160],
};

/** A small raster PMTiles archive of an invented area: a few one-colour PNG tiles at zoom 0–2. */
export function testArchive(): { bytes: Buffer; tiles: Tile[] } {
  const tiles = Object.entries(TEST_TILE_COLOURS).map(([key, colour]) => {
    const [z, x, y] = key.split("/").map(Number);
    return { z, x, y, data: solidPng(colour, 16) };
  });
  return { bytes: writePmtiles(tiles, { tileType: "png", bounds: [-120, 30, -110, 45], metadata: { name: "test ground" } }), tiles };
}
