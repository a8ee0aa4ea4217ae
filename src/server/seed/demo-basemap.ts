import "server-only";
import { writeBasemap } from "../basemap/files";
import { claimPolygon } from "./demo-club";
import { DEMO_CLAIMS } from "./people";
import { encodeIndexedPng, type Rgb } from "./png";
import { writePmtiles, type Tile } from "./pmtiles-writer";

// The demo club's basemap: invented ground painted from formulas (no real map, elevation
// model or imagery is used), shaded relief with contours, the dry wash the Tinderbox Wash
// claim is named for, and a two-track road between the claims. Raster tiles at zoom 9–15: from the whole district down to a spot.

const LAT0 = 41.803;
const LON0 = -117.616;
const M_PER_DEG_LAT = 111_320;
const M_PER_DEG_LON = M_PER_DEG_LAT * Math.cos((LAT0 * Math.PI) / 180);
export const DEMO_BASEMAP_ZOOMS = [9, 10, 11, 12, 13, 14, 15] as const;

const gauss = (dx: number, dy: number, r: number) => Math.exp(-(dx * dx + dy * dy) / (2 * r * r));

/** The wash's centre line: north of the Tinderbox Wash claim's axis, running west-northwest. */
const washY = (x: number) => 356 - 0.42 * (x - 954) + 60 * Math.sin((x - 954) / 260);
/** The road's centre line, running north-northwest between the claims. */
const trackX = (y: number) => 120 + 150 * Math.sin(y / 520) - 0.5 * y;

/** Invented ground height in metres at x metres east and y north of the area's centre. */
function height(x: number, y: number): number {
  const wash = y - washY(x);
  const reefAlong = (x - 349) * Math.cos(0.6) + (y + 1058) * Math.sin(0.6);
  const reefAcross = -(x - 349) * Math.sin(0.6) + (y + 1058) * Math.cos(0.6);
  return (
    1480 +
    0.035 * y -
    0.012 * x +
    110 * gauss(x - 1500, y - 1400, 700) +
    80 * gauss(x + 1400, y + 900, 600) +
    45 * Math.exp(-((reefAcross / 150) ** 2) - (reefAlong / 900) ** 2) +
    9 * Math.sin(x / 230 + y / 410 + Math.sin(y / 170)) * Math.cos(y / 330 - x / 800) -
    28 * Math.exp(-((wash / 200) ** 2))
  );
}

// Palette: 3 height bands × 7 shades of dry ground, 3 shades of wash sand, then the wash's
// channel, the road, contours and every fifth contour.
const SHADES = 7;
const LAND: Rgb[] = [
  [222, 205, 166],
  [208, 190, 150],
  [190, 174, 140],
];
const SAND: Rgb = [238, 226, 196];
const tint = (c: Rgb, k: number): Rgb => [c[0], c[1], c[2]].map((v) => Math.max(0, Math.min(255, Math.round(v * k)))) as unknown as Rgb;
const shadeFactor = (level: number) => 0.78 + (0.34 * level) / (SHADES - 1);
const PALETTE: Rgb[] = [
  ...LAND.flatMap((c) => Array.from({ length: SHADES }, (_, l) => tint(c, shadeFactor(l)))),
  ...[0.9, 1, 1.06].map((k) => tint(SAND, k)),
  [160, 176, 184],
  [112, 78, 50],
  [176, 152, 112],
  [140, 114, 78],
];
const SAND_AT = LAND.length * SHADES;
const [CHANNEL, TRACK, CONTOUR, INDEX_CONTOUR] = [SAND_AT + 3, SAND_AT + 4, SAND_AT + 5, SAND_AT + 6];

const TILE = 256;
const lonOf = (px: number, z: number) => (px / (TILE * 2 ** z)) * 360 - 180;
const latOf = (py: number, z: number) => (Math.atan(Math.sinh(Math.PI * (1 - (2 * py) / (TILE * 2 ** z)))) * 180) / Math.PI;
const tileX = (lon: number, z: number) => Math.floor(((lon + 180) / 360) * 2 ** z);
const tileY = (lat: number, z: number) => {
  const r = (lat * Math.PI) / 180;
  return Math.floor(((1 - Math.log(Math.tan(r) + 1 / Math.cos(r)) / Math.PI) / 2) * 2 ** z);
};

function paintTile(z: number, tx: number, ty: number): Uint8Array {
  // Heights on a grid one pixel wider on every side, for slopes and contour crossings.
  const G = TILE + 2;
  const h = new Float64Array(G * G);
  const xs = new Float64Array(G);
  const ys = new Float64Array(G);
  for (let i = 0; i < G; i++) {
    xs[i] = (lonOf(tx * TILE + i - 0.5, z) - LON0) * M_PER_DEG_LON;
    ys[i] = (latOf(ty * TILE + i - 0.5, z) - LAT0) * M_PER_DEG_LAT;
  }
  for (let j = 0; j < G; j++) for (let i = 0; i < G; i++) h[j * G + i] = height(xs[i], ys[j]);
  const metresPerPixel = xs[2] - xs[1];
  const light = [-1 / 2, 1 / 2, Math.SQRT1_2]; // from the north-west, 45° up
  const pixels = new Uint8Array(TILE * TILE);
  for (let py = 0; py < TILE; py++) {
    for (let px = 0; px < TILE; px++) {
      const at = (py + 1) * G + px + 1;
      const x = xs[px + 1];
      const y = ys[py + 1];
      // Slope ×3 so gentle ground still reads; rows run south as they go down.
      const dzdx = (3 * (h[at + 1] - h[at - 1])) / (2 * metresPerPixel);
      const dzdy = (3 * (h[at - G] - h[at + G])) / (2 * metresPerPixel);
      const norm = Math.hypot(dzdx, dzdy, 1);
      const lit = (-dzdx * light[0] - dzdy * light[1] + light[2]) / norm;
      const level = Math.max(0, Math.min(SHADES - 1, Math.round((lit - 0.45) / 0.08)));
      const band = h[at] < 1470 ? 0 : h[at] < 1530 ? 1 : 2;
      let index = band * SHADES + level;
      const wash = Math.abs(y - washY(x));
      if (wash < 45) index = SAND_AT + Math.min(2, Math.floor(level / 3));
      // The contour interval is 20 m, every fifth bolder; too close together to read below zoom 14.
      if (metresPerPixel < 12 && wash >= 45) {
        const c = Math.floor(h[at] / 20);
        if (c !== Math.floor(h[at + 1] / 20) || c !== Math.floor(h[at + G] / 20)) index = c % 5 === 4 ? INDEX_CONTOUR : CONTOUR;
      }
      const braid = Math.abs(y - washY(x) - 9 * Math.sin(x / 70));
      if (braid < Math.max(0.6 * metresPerPixel, 5)) index = CHANNEL;
      if (Math.abs(x - trackX(y)) < Math.max(0.8 * metresPerPixel, 4)) index = TRACK;
      pixels[py * TILE + px] = index;
    }
  }
  return pixels;
}

/** West, south, east, north: the demo claims with 1.2 km or so around them. */
export function demoBasemapBounds(): [number, number, number, number] {
  const points = DEMO_CLAIMS.flatMap((c) => claimPolygon(c).coordinates[0] as number[][]);
  const margin = 0.012;
  return [
    Math.min(...points.map((p) => p[0])) - margin,
    Math.min(...points.map((p) => p[1])) - margin,
    Math.max(...points.map((p) => p[0])) + margin,
    Math.max(...points.map((p) => p[1])) + margin,
  ];
}

/** The demo club's invented basemap as a PMTiles archive. */
export function makeDemoBasemap(zooms: readonly number[] = DEMO_BASEMAP_ZOOMS): Buffer {
  const bounds = demoBasemapBounds();
  const [w, s, e, n] = bounds;
  const tiles: Tile[] = [];
  for (const z of zooms)
    for (let x = tileX(w, z); x <= tileX(e, z); x++)
      for (let y = tileY(n, z); y <= tileY(s, z); y++) tiles.push({ z, x, y, data: encodeIndexedPng(TILE, TILE, PALETTE, paintTile(z, x, y)) });
  return writePmtiles(tiles, {
    tileType: "png",
    bounds,
    metadata: { name: "Quillmarsh Gulch (invented)", description: "Invented ground for the Lodebook demo club", attribution: "Invented for the Lodebook demo" },
  });
}

/** Writes the demo basemap into the data folder, beside the database. Returns its size. */
export async function writeDemoBasemap(): Promise<number> {
  const bytes = makeDemoBasemap();
  await writeBasemap(bytes);
  return bytes.length;
}
