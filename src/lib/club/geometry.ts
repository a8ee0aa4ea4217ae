import kinks from "@turf/kinks";
import { polygonSchema, type Polygon } from "../entities/claim";

/**
 * The most positions a claim outline may have, all rings together. A claim is a handful of
 * corners; a traced outline of a few hundred is plenty. The crossing check compares every
 * edge with every other, so this also bounds the work one request can ask of the server.
 */
export const MAX_CLAIM_POSITIONS = 2000;

/** The largest GeoJSON file the claim editor takes; the server's limit on a claim's body is this plus room for its other fields. */
export const MAX_CLAIM_FILE_BYTES = 1_000_000;
export const MAX_CLAIM_BODY_BYTES = MAX_CLAIM_FILE_BYTES + 64_000;

export type GeometryResult = { ok: true; polygon: Polygon } | { ok: false; message: string };

const same = (a: number[], b: number[]) => a[0] === b[0] && a[1] === b[1];

function checkRings(rings: number[][][], where: string): string | null {
  for (const [i, ring] of rings.entries()) {
    const label = `${where}ring ${i + 1}`;
    if (ring.length < 4) return `${label} has ${ring.length} positions; a closed ring needs at least 4 (the first repeated last).`;
    if (!same(ring[0], ring[ring.length - 1])) return `${label} is not closed: its last position must repeat its first.`;
    for (const p of ring)
      if (Math.abs(p[0]) > 180 || Math.abs(p[1]) > 90)
        return `${label} has a position out of range (longitude ±180, latitude ±90; GeoJSON puts longitude first).`;
  }
  return null;
}

const AREA_TYPES = new Set(["Polygon", "MultiPolygon"]);

/** Every position of a geometry's coordinates, however deeply nested. */
function positionsOf(coordinates: unknown): unknown[][] {
  if (!Array.isArray(coordinates)) return [];
  if (coordinates.length > 0 && !Array.isArray(coordinates[0])) return [coordinates];
  return coordinates.flatMap(positionsOf);
}

/**
 * What is wrong with a geometry, in words an officer can act on, before the shape check:
 * a point or a line where an area is needed, no coordinates at all, positions out of range,
 * or latitude and longitude in each other's place (GeoJSON puts longitude first).
 */
function describeShape(g: { type?: string } | null): string | null {
  if (!g || typeof g !== "object" || typeof g.type !== "string") return "That file holds no GeoJSON geometry.";
  const type = g.type;
  if (!AREA_TYPES.has(type)) {
    if (type === "Point" || type === "MultiPoint") return `That is a ${type}: a claim needs an area (a Polygon), not a point. Draw its outline.`;
    if (type === "LineString" || type === "MultiLineString")
      return `That is a ${type}: a claim needs a closed area (a Polygon). Close the line into an outline.`;
    if (type === "GeometryCollection") return "That is a GeometryCollection: give the claim's outline alone, as one Polygon or MultiPolygon.";
    return `"${type}" is not a GeoJSON area: give a Polygon or MultiPolygon.`;
  }
  const positions = positionsOf((g as { coordinates?: unknown }).coordinates);
  if (positions.length === 0) return "That outline is empty: it has no positions.";
  const numeric = positions.filter((p) => p.length >= 2 && typeof p[0] === "number" && typeof p[1] === "number") as number[][];
  if (numeric.length !== positions.length) return "Some positions are not pairs of numbers.";
  const outOfRange = numeric.find(([lon, lat]) => Math.abs(lon) > 180 || Math.abs(lat) > 90);
  if (outOfRange) {
    const [lon, lat] = outOfRange;
    if (Math.abs(lat) > 90 && Math.abs(lat) <= 180 && Math.abs(lon) <= 90)
      return `A position reads ${lon}, ${lat}: latitude and longitude seem swapped (GeoJSON puts longitude first).`;
    return `A position (${lon}, ${lat}) is out of range: longitude is within ±180 and latitude within ±90.`;
  }
  return null;
}

/**
 * A claim boundary from GeoJSON: a Polygon or MultiPolygon, bare or in a Feature or a
 * FeatureCollection of one. Refuses unclosed or too-short rings and self-intersections.
 */
export function readBoundary(input: unknown): GeometryResult {
  let g = input as { type?: string; geometry?: unknown; features?: { geometry?: unknown }[] } | null;
  if (g?.type === "FeatureCollection") {
    if (!Array.isArray(g.features) || g.features.length !== 1) return { ok: false, message: "The file must hold exactly one claim outline (one feature)." };
    g = g.features[0]?.geometry as typeof g;
  } else if (g?.type === "Feature") g = g.geometry as typeof g;
  const shapeProblem = describeShape(g);
  if (shapeProblem) return { ok: false, message: shapeProblem };
  const parsed = polygonSchema.safeParse(g);
  if (!parsed.success) return { ok: false, message: "That is not a GeoJSON Polygon or MultiPolygon with [longitude, latitude] positions." };
  const polygon = parsed.data;
  const polys = polygon.type === "Polygon" ? [polygon.coordinates] : polygon.coordinates;
  const positions = polys.reduce((n, rings) => n + rings.reduce((m, r) => m + r.length, 0), 0);
  if (positions > MAX_CLAIM_POSITIONS) {
    return { ok: false, message: `The outline has ${positions} positions; at most ${MAX_CLAIM_POSITIONS} are accepted. Simplify it to the claim's corners.` };
  }
  for (const [i, rings] of polys.entries()) {
    const problem = checkRings(rings, polys.length > 1 ? `Part ${i + 1}, ` : "");
    if (problem) return { ok: false, message: problem.charAt(0).toUpperCase() + problem.slice(1) };
    const crossings = kinks({ type: "Polygon", coordinates: rings }).features.length;
    if (crossings > 0)
      return { ok: false, message: `The outline crosses itself (${crossings} crossing${crossings > 1 ? "s" : ""}). Check the order of the corners.` };
  }
  return { ok: true, polygon };
}

/** Corners typed one per line as "latitude, longitude" (decimal degrees), closed automatically. */
export function boundaryFromCorners(text: string): GeometryResult {
  const corners: number[][] = [];
  for (const [i, raw] of text.split(/\r?\n/).entries()) {
    const line = raw.trim();
    if (!line) continue;
    const parts = line.split(/[\s,;]+/).map(Number);
    if (parts.length !== 2 || parts.some((n) => !Number.isFinite(n)))
      return { ok: false, message: `Line ${i + 1}: write "latitude, longitude", e.g. 41.8012, -117.6203.` };
    corners.push([parts[1], parts[0]]);
  }
  if (corners.length < 3) return { ok: false, message: "Give at least three corners." };
  if (!same(corners[0], corners[corners.length - 1])) corners.push([...corners[0]]);
  return readBoundary({ type: "Polygon", coordinates: [corners] });
}
