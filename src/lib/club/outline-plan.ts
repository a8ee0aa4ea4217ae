import type { Polygon } from "../entities/claim";

/**
 * A claim drawn on a plan: its rings as SVG path data, in plan units, and where its label goes:
 * centred under the outline (`y` its lowest point), or over it (`above`, at its highest) when
 * the outline is too near the plan's foot, so the label never covers the ground it names.
 */
export type PlannedClaim = { id: string; path: string; label: { x: number; y: number; above: boolean } };
export type OutlinePlan = { width: number; height: number; claims: PlannedClaim[]; scale: { metres: number; length: number } | null };

const METRES_PER_DEGREE = 111_320; // at the equator, per degree of latitude (WGS 84 mean; common practice for small areas)
/** Plan units kept under an outline for its label; nearer the foot, the label goes above. */
const LABEL_ROOM = 56;
const NICE_LENGTHS = [10, 20, 50, 100, 200, 500, 1000, 2000, 5000, 10_000, 20_000, 50_000];

function ringsOf(boundary: Polygon): number[][][] {
  return boundary.type === "Polygon" ? boundary.coordinates : boundary.coordinates.flat(1);
}

/** Twice the signed area of a ring (shoelace). */
function ringArea(points: [number, number][]): number {
  let area = 0;
  for (let i = 0; i < points.length - 1; i++) area += points[i][0] * points[i + 1][1] - points[i + 1][0] * points[i][1];
  return area;
}

/** Shoelace centroid of a ring (projected); the mean of its corners when it has no area. */
function ringCentroid(points: [number, number][]): [number, number] {
  let area = 0;
  let cx = 0;
  let cy = 0;
  for (let i = 0; i < points.length - 1; i++) {
    const [x0, y0] = points[i];
    const [x1, y1] = points[i + 1];
    const cross = x0 * y1 - x1 * y0;
    area += cross;
    cx += (x0 + x1) * cross;
    cy += (y0 + y1) * cross;
  }
  if (Math.abs(area) < 1e-12) {
    const n = Math.max(points.length - 1, 1);
    return [points.slice(0, n).reduce((s, p) => s + p[0], 0) / n, points.slice(0, n).reduce((s, p) => s + p[1], 0) / n];
  }
  return [cx / (3 * area), cy / (3 * area)];
}

/**
 * Lays the club's claim outlines on a flat plan of the given width: an equirectangular
 * projection at the outlines' mean latitude, which over a club's few kilometres distorts
 * less than a line's width. North is up. Claims without an outline are left out. The height
 * follows the outlines' shape (between a third and three quarters of the width), with a margin.
 */
export function planOutlines(claims: { id: string; boundary: Polygon | null }[], width = 800): OutlinePlan {
  const drawn = claims.filter((c): c is { id: string; boundary: Polygon } => c.boundary !== null && ringsOf(c.boundary).some((r) => r.length > 0));
  if (drawn.length === 0) return { width, height: Math.round(width / 2), claims: [], scale: null };
  const all = drawn.flatMap((c) => ringsOf(c.boundary).flat());
  // Loops, not Math.min(...): a club's outlines together can pass the engine's argument limit.
  let sumLat = 0;
  for (const p of all) sumLat += p[1];
  const k = Math.cos(((sumLat / all.length) * Math.PI) / 180);
  let [minX, maxX, minY, maxY] = [Infinity, -Infinity, Infinity, -Infinity];
  for (const p of all) {
    minX = Math.min(minX, p[0] * k);
    maxX = Math.max(maxX, p[0] * k);
    minY = Math.min(minY, p[1]);
    maxY = Math.max(maxY, p[1]);
  }
  const spanX = Math.max(maxX - minX, 1e-6);
  const spanY = Math.max(maxY - minY, 1e-6);
  const margin = 0.08;
  const height = Math.round(Math.min(width * 0.75, Math.max(width / 3, (width * spanY) / spanX)));
  const unit = Math.min((width * (1 - 2 * margin)) / spanX, (height * (1 - 2 * margin)) / spanY); // plan units per projected degree
  const offX = (width - spanX * unit) / 2;
  const offY = (height - spanY * unit) / 2;
  const project = (p: number[]): [number, number] => [offX + (p[0] * k - minX) * unit, offY + (maxY - p[1]) * unit];
  const round = (v: number) => Math.round(v * 10) / 10;

  const planned = drawn.map((c) => {
    const rings = ringsOf(c.boundary).map((r) => r.map(project));
    const path = rings.map((r) => `M${r.map(([x, y]) => `${round(x)},${round(y)}`).join("L")}Z`).join("");
    const outer = c.boundary.type === "Polygon" ? [rings[0]] : c.boundary.coordinates.map((poly) => poly[0].map(project));
    const biggest = outer.reduce((a, b) => (Math.abs(ringArea(b)) > Math.abs(ringArea(a)) ? b : a));
    const [x] = ringCentroid(biggest);
    let [top, foot] = [Infinity, -Infinity];
    for (const ring of rings) for (const p of ring) [top, foot] = [Math.min(top, p[1]), Math.max(foot, p[1])];
    const above = foot > height - LABEL_ROOM;
    return { id: c.id, path, label: { x: round(x), y: round(above ? top : foot), above } };
  });

  const metresPerUnit = METRES_PER_DEGREE / unit;
  const target = (width / 5) * metresPerUnit;
  const metres = [...NICE_LENGTHS].reverse().find((m) => m <= target) ?? NICE_LENGTHS[0];
  return { width, height, claims: planned, scale: { metres, length: round(metres / metresPerUnit) } };
}
