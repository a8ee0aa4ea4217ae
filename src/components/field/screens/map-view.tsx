"use client";
import "maplibre-gl/dist/maplibre-gl.css";
import type { FeatureCollection } from "geojson";
import { LngLatBounds, Map as MapLibre, Marker, setWorkerUrl, type GeoJSONSource, type StyleSpecification } from "maplibre-gl";
import { useEffect, useRef } from "react";
import type { LocalFind } from "@/client/device-db";
import { claimLabelAnchor } from "@/lib/claim-label";
import type { ClaimView } from "@/lib/entities/claim";
import { chooseBasemap } from "./map-basemap";

type Props = {
  claims: ClaimView[];
  finds: Pick<LocalFind, "id" | "lat" | "lon" | "kind">[];
  /** Text on each claim (by id); its name when absent. */
  labels?: Record<string, string>;
  me: { lat: number; lon: number } | null;
  tileUrl: string;
  onPick?: (lat: number, lon: number) => void;
  onOpenFind?: (id: string) => void;
};

const GRID_STEP = 0.005; // degrees: about 550 m of latitude

function gridLines(bounds: LngLatBounds): FeatureCollection {
  const features: FeatureCollection["features"] = [];
  const [w, s, e, n] = [bounds.getWest(), bounds.getSouth(), bounds.getEast(), bounds.getNorth()];
  for (let lon = Math.floor(w / GRID_STEP) * GRID_STEP; lon <= e; lon += GRID_STEP)
    features.push({
      type: "Feature",
      properties: {},
      geometry: {
        type: "LineString",
        coordinates: [
          [lon, s],
          [lon, n],
        ],
      },
    });
  for (let lat = Math.floor(s / GRID_STEP) * GRID_STEP; lat <= n; lat += GRID_STEP)
    features.push({
      type: "Feature",
      properties: {},
      geometry: {
        type: "LineString",
        coordinates: [
          [w, lat],
          [e, lat],
        ],
      },
    });
  return { type: "FeatureCollection", features };
}

const css = (name: string) => getComputedStyle(document.documentElement).getPropertyValue(name).trim() || "#888";

type Drawn = Pick<Props, "claims" | "finds" | "me" | "labels">;

/** The claims, finds and position with a margin around them: what the map opens on. */
function areaOf({ claims, finds, me }: Drawn): LngLatBounds {
  const bounds = new LngLatBounds();
  claims.forEach((c) =>
    (c.boundary?.type === "Polygon" ? c.boundary.coordinates[0] : (c.boundary?.coordinates.flat(1)[0] ?? [])).forEach((p) => bounds.extend([p[0], p[1]])),
  );
  finds.forEach((f) => f.lat !== null && f.lon !== null && bounds.extend([f.lon, f.lat]));
  if (me) bounds.extend([me.lon, me.lat]);
  if (bounds.isEmpty()) bounds.extend([0, 0]);
  return new LngLatBounds([bounds.getWest() - 0.01, bounds.getSouth() - 0.01], [bounds.getEast() + 0.01, bounds.getNorth() + 0.01]);
}

const claimsData = (claims: ClaimView[]): FeatureCollection => ({
  type: "FeatureCollection",
  features: claims.filter((c) => c.boundary).map((c) => ({ type: "Feature", properties: { id: c.id, name: c.name }, geometry: c.boundary! })),
});

const findsData = (finds: Props["finds"]): FeatureCollection => ({
  type: "FeatureCollection",
  features: finds
    .filter((f) => f.lat !== null && f.lon !== null)
    .map((f) => ({ type: "Feature", properties: { id: f.id, kind: f.kind }, geometry: { type: "Point", coordinates: [f.lon!, f.lat!] } })),
});

const meData = (me: Props["me"]): FeatureCollection => ({
  type: "FeatureCollection",
  features: me ? [{ type: "Feature", properties: {}, geometry: { type: "Point", coordinates: [me.lon, me.lat] } }] : [],
});

/**
 * Names are HTML, not a symbol layer: the style carries no glyphs, which would need a
 * network. Each hangs above its claim's northern edge (never over its finds) and lets taps
 * through to the map.
 */
function nameClaims(map: MapLibre, { claims, labels }: Drawn): Marker[] {
  return claims.flatMap((c) => {
    const anchor = claimLabelAnchor(c.boundary);
    if (!anchor) return [];
    const el = document.createElement("div");
    el.className = "pointer-events-none whitespace-nowrap rounded bg-sheet px-1 text-sm font-bold text-ink shadow";
    el.dataset.claimLabel = c.id;
    el.textContent = labels?.[c.id] ?? c.name;
    return [new Marker({ element: el, anchor: "bottom", offset: [0, -3] }).setLngLat(anchor).addTo(map)];
  });
}

/**
 * Tiles appear at once instead of fading in: each fade redraws the map for 300 ms, and a
 * phone's battery (or a phone without a graphics chip worth the name) pays for every frame.
 */
const RASTER_PAINT = { "raster-fade-duration": 0 } as const;

function styleFor(data: Drawn, area: LngLatBounds, tileUrl: string): StyleSpecification {
  return {
    version: 8,
    sources: {
      ...(tileUrl ? { tiles: { type: "raster", tiles: [tileUrl], tileSize: 256 } } : {}),
      grid: { type: "geojson", data: gridLines(area) },
      claims: { type: "geojson", data: claimsData(data.claims) },
      finds: { type: "geojson", cluster: true, clusterRadius: 40, data: findsData(data.finds) },
      me: { type: "geojson", data: meData(data.me) },
    },
    layers: [
      { id: "paper", type: "background", paint: { "background-color": css("--paper") } },
      ...(tileUrl ? [{ id: "tiles", type: "raster" as const, source: "tiles", paint: RASTER_PAINT }] : []),
      { id: "grid", type: "line", source: "grid", paint: { "line-color": css("--rule"), "line-width": 1 } },
      { id: "claims-fill", type: "fill", source: "claims", paint: { "fill-color": css("--ochre"), "fill-opacity": 0.15 } },
      { id: "claims-line", type: "line", source: "claims", paint: { "line-color": css("--ochre"), "line-width": 3 } },
      {
        id: "clusters",
        type: "circle",
        source: "finds",
        filter: ["has", "point_count"],
        paint: { "circle-color": css("--ink"), "circle-opacity": 0.75, "circle-radius": ["step", ["get", "point_count"], 12, 10, 16, 50, 22] },
      },
      {
        id: "finds",
        type: "circle",
        source: "finds",
        filter: ["!", ["has", "point_count"]],
        paint: { "circle-color": "#e0aa22", "circle-radius": 7, "circle-stroke-color": css("--ink"), "circle-stroke-width": 2 },
      },
      {
        id: "me",
        type: "circle",
        source: "me",
        paint: { "circle-color": "#2f6fd6", "circle-radius": 8, "circle-stroke-color": "#fff", "circle-stroke-width": 3 },
      },
    ],
  };
}

const setData = (map: MapLibre, source: string, data: FeatureCollection) => (map.getSource(source) as GeoJSONSource | undefined)?.setData(data);

type Shown = { data: Drawn; markers: Marker[]; moved: boolean; pending: boolean };

/** The position drawn, on the map's box: for tests and the curious. */
function markPosition(box: HTMLElement | null, me: Props["me"]) {
  if (me) box?.setAttribute("data-me", `${me.lat.toFixed(5)},${me.lon.toFixed(5)}`);
  else box?.removeAttribute("data-me");
}

/** Where grid lines go: the data's area and the view, unless the view is wider than a degree (too many lines). */
function gridArea(map: MapLibre, area: LngLatBounds): LngLatBounds {
  const view = map.getBounds();
  if (view.getEast() - view.getWest() > 1 || view.getNorth() - view.getSouth() > 1) return area;
  return new LngLatBounds(area.getSouthWest(), area.getNorthEast()).extend(view);
}

/** Draws what changed since the map last drew: sources in place, fitted until the member moves it. */
function redraw(map: MapLibre, now: Shown, next: Drawn) {
  const was = now.data;
  if (was.claims !== next.claims) setData(map, "claims", claimsData(next.claims));
  if (was.claims !== next.claims || was.labels !== next.labels) {
    now.markers.forEach((m) => m.remove());
    now.markers = nameClaims(map, next);
  }
  if (was.finds !== next.finds) setData(map, "finds", findsData(next.finds));
  if (was.me !== next.me) {
    setData(map, "me", meData(next.me));
    markPosition(map.getContainer(), next.me);
  }
  now.data = next;
  // Fitted again only when the area changed: a sync that brings nothing new draws no frame.
  const area = areaOf(next);
  if (!now.moved) {
    if (area.toArray().join() !== areaOf(was).toArray().join()) map.fitBounds(area, { animate: false });
  } else if (next.me && next.me !== was.me && !map.getBounds().contains([next.me.lon, next.me.lat])) map.easeTo({ center: [next.me.lon, next.me.lat] });
}

/**
 * MapLibre with an inline style: needs no tile server, no glyphs, no network. The club's
 * basemap (kept on the device, else from the server) goes under everything once it is found;
 * a tile address from Settings draws above it, so with no signal the basemap shows through.
 *
 * The map is made once (again only for a new tile address). Finds arriving from camp sync and
 * each new position fix change its sources in place: the member's pan and zoom stay, and a
 * phone does not build a WebGL map again for every change.
 */
export default function MapView({ claims, finds, me, tileUrl, labels, onPick, onOpenFind }: Props) {
  const box = useRef<HTMLDivElement>(null);
  const mapRef = useRef<MapLibre | null>(null);
  const handlers = useRef({ onPick, onOpenFind });
  const latest = useRef<Drawn>({ claims, finds, me, labels });
  /** What the map draws now, and its claims' name tags. */
  const shown = useRef<Shown | null>(null);
  useEffect(() => {
    handlers.current = { onPick, onOpenFind };
    latest.current = { claims, finds, me, labels };
  });

  useEffect(() => {
    if (!box.current) return;
    setWorkerUrl("/maplibre-gl-worker.mjs");
    const data = latest.current;
    const area = areaOf(data);
    const map = new MapLibre({ container: box.current, style: styleFor(data, area, tileUrl), bounds: area, attributionControl: false, fadeDuration: 0 });
    mapRef.current = map;
    const now: Shown = { data, markers: nameClaims(map, data), moved: false, pending: false };
    shown.current = now;
    markPosition(box.current, data.me);
    // The grid follows the view: wherever the member pans or a fix takes the map, it has lines.
    map.on("moveend", () => setData(map, "grid", gridLines(gridArea(map, areaOf(now.data)))));
    // Once the member pans or zooms, new finds no longer move the map under their finger.
    map.on("movestart", (e) => {
      if (e.originalEvent) now.moved = true;
    });
    map.on("click", (e) => {
      const hit = map.queryRenderedFeatures(e.point, { layers: ["finds"] })[0];
      if (hit && handlers.current.onOpenFind) return handlers.current.onOpenFind(String(hit.properties.id));
      const cluster = map.queryRenderedFeatures(e.point, { layers: ["clusters"] })[0];
      if (cluster) {
        now.moved = true;
        return map.easeTo({ center: e.lngLat, zoom: map.getZoom() + 2 });
      }
      handlers.current.onPick?.(e.lngLat.lat, e.lngLat.lng);
    });
    map.once("load", () => box.current?.setAttribute("data-map-ready", "true"));
    let live = true;
    box.current.removeAttribute("data-basemap");
    box.current.removeAttribute("data-basemap-tiles");
    // The basemap joins once the style is in, not once every tile has ("load", which a tile
    // server that never answers holds back for good): the ground kept on the phone shows
    // whatever that server does, and its tiles are drawn in the outlines' frames, not after.
    const styled = new Promise<void>((resolve) => (map.getSource("me") ? resolve() : map.once("style.load", () => resolve())));
    void Promise.all([chooseBasemap(), styled])
      .then(([basemap]) => {
        if (!live || !basemap) return;
        map.addSource("basemap", { type: "raster", url: basemap.url, tileSize: 256 });
        map.addLayer({ id: "basemap", type: "raster", source: "basemap", paint: RASTER_PAINT }, tileUrl ? "tiles" : "grid");
        // For tests and the curious: which basemap drew, once its tiles have.
        let tiles = 0;
        map.on("sourcedata", (e) => {
          if (e.sourceId !== "basemap" || !e.tile) return;
          box.current?.setAttribute("data-basemap", basemap.kind);
          box.current?.setAttribute("data-basemap-tiles", String(++tiles));
        });
      })
      // Without its basemap the map is still whole: outlines, finds and grid on paper.
      .catch((error: unknown) => console.warn("basemap not shown", error));
    return () => {
      live = false;
      now.markers.forEach((m) => m.remove());
      map.remove();
      mapRef.current = null;
      shown.current = null;
    };
  }, [tileUrl]);

  // New finds, claims or a position fix: the sources change in place. They exist once the style
  // has loaded ("style.load"), long before every tile has ("load", which a slow tile server can
  // hold back for minutes); changes that come before wait for it together, drawn as the latest.
  useEffect(() => {
    const map = mapRef.current;
    const now = shown.current;
    if (!map || !now) return;
    if (map.getSource("me")) redraw(map, now, latest.current);
    else if (!now.pending) {
      now.pending = true;
      map.once("style.load", () => {
        now.pending = false;
        if (mapRef.current === map) redraw(map, now, latest.current);
      });
    }
  }, [claims, finds, me, labels]);

  return (
    <div
      ref={box}
      className="h-[65dvh] w-full overflow-hidden rounded-md border-2 border-rule"
      data-testid="map"
      role="application"
      aria-label="Map of the club's claims and your finds"
    />
  );
}
