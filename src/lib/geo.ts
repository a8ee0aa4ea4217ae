import pointInRing from "point-in-polygon";
import type { Polygon } from "./entities/claim";

/** Degrees, minutes and seconds with the hemisphere, e.g. 41° 48′ 0.0″ N. */
export function toDms(value: number, axis: "lat" | "lon"): string {
  const hemisphere = axis === "lat" ? (value >= 0 ? "N" : "S") : value >= 0 ? "E" : "W";
  const abs = Math.abs(value);
  let degrees = Math.floor(abs);
  let minutes = Math.floor((abs - degrees) * 60);
  let seconds = Math.round(((abs - degrees) * 60 - minutes) * 60 * 10) / 10;
  if (seconds >= 60) {
    seconds = 0;
    minutes += 1;
  }
  if (minutes >= 60) {
    minutes = 0;
    degrees += 1;
  }
  return `${degrees}° ${minutes}′ ${seconds.toFixed(1)}″ ${hemisphere}`;
}

/**
 * Decimal degrees to five places, about 1 m on the ground: finer than a phone's fix (3–15 m)
 * claims, coarser hides where a find was (common practice for handheld GPS). The stored
 * position keeps every digit the device gave.
 */
export function formatDecimal(lat: number, lon: number): string {
  return `${lat.toFixed(5)}, ${lon.toFixed(5)}`;
}

type ClaimShape = { id: string; name: string; boundary: Polygon | null; active?: boolean };

/** Inside the outer ring and in none of its holes (GeoJSON rings: [lon, lat]). */
function inPolygon(point: [number, number], rings: number[][][]): boolean {
  return pointInRing(point, rings[0]) && !rings.slice(1).some((hole) => pointInRing(point, hole));
}

/** Whether a point lies within a claim's boundary (holes excepted). */
export function inBoundary(lat: number, lon: number, boundary: Polygon): boolean {
  const point: [number, number] = [lon, lat];
  return boundary.type === "Polygon" ? inPolygon(point, boundary.coordinates) : boundary.coordinates.some((p) => inPolygon(point, p));
}

/**
 * The claim whose boundary holds the point, if any (boundaries are the club's drawing, not a
 * survey: a point on a corner line may fall either side, well inside a GPS fix's error).
 */
export function claimAt<T extends ClaimShape>(lat: number, lon: number, claims: T[]): T | undefined {
  const point: [number, number] = [lon, lat];
  return claims.find((c) => {
    if (!c.boundary || c.active === false) return false;
    return c.boundary.type === "Polygon" ? inPolygon(point, c.boundary.coordinates) : c.boundary.coordinates.some((p) => inPolygon(point, p));
  });
}
