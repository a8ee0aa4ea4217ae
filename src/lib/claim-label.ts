import type { Polygon } from "./entities/claim";

/**
 * Where a claim's name goes on the map: above its northernmost point, centred over its
 * width. A label hung there (its bottom edge on this point) lies wholly north of the claim,
 * so it never covers the claim's finds, at any zoom and whatever the claim's shape.
 */
export function claimLabelAnchor(boundary: Polygon | null | undefined): [number, number] | null {
  if (!boundary) return null;
  const rings = boundary.type === "Polygon" ? [boundary.coordinates[0]] : boundary.coordinates.map((p) => p[0]);
  const points = rings.flat().filter((p) => p && Number.isFinite(p[0]) && Number.isFinite(p[1]));
  if (points.length === 0) return null;
  let [west, east, north] = [Infinity, -Infinity, -Infinity];
  for (const [lon, lat] of points) {
    west = Math.min(west, lon);
    east = Math.max(east, lon);
    north = Math.max(north, lat);
  }
  return [(west + east) / 2, north];
}
