"use client";
// The club's basemap for the map: the copy kept on this device, else (with signal) the one on
// the club's server, else none. Imported by map-view only, so the PMTiles reader rides in
// the map's own chunk with MapLibre.
import { addProtocol } from "maplibre-gl";
import { FetchSource, PMTiles, Protocol, type RangeResponse, type Source } from "pmtiles";
import { BASEMAP_URL, serverBasemap, storedBasemapBlob } from "@/client/basemap-store";

let protocol: Protocol | null = null;
/** One `pmtiles://` protocol for the page, registered with MapLibre on first use. */
function pmtilesProtocol(): Protocol {
  if (!protocol) {
    protocol = new Protocol();
    addProtocol("pmtiles", protocol.tile);
  }
  return protocol;
}

/** Reads ranges of the archive kept in this device's cache: slices of a disk-backed blob. */
class StoredSource implements Source {
  constructor(
    private readonly blob: Blob,
    private readonly key: string,
  ) {}
  getKey() {
    return this.key;
  }
  async getBytes(offset: number, length: number): Promise<RangeResponse> {
    return { data: await this.blob.slice(offset, offset + length).arrayBuffer() };
  }
}

/** The server's archive by range requests, under a key naming its version. */
class ServerSource implements Source {
  private readonly fetchSource = new FetchSource(new URL(BASEMAP_URL, location.origin).href, undefined, "same-origin");
  constructor(private readonly key: string) {}
  getKey() {
    return this.key;
  }
  getBytes(offset: number, length: number, signal?: AbortSignal, etag?: string) {
    return this.fetchSource.getBytes(offset, length, signal, etag);
  }
}

export type BasemapChoice = { kind: "offline" | "online"; url: string };

/** A protocol key names one version (and one download), so a replaced archive is never read through old directories. */
const keyOf = (kind: string, etag: string) => `lodebook-${kind}-${etag.replace(/[^a-z0-9]/gi, "") || "unversioned"}`;

export async function chooseBasemap(): Promise<BasemapChoice | null> {
  const stored = await storedBasemapBlob().catch(() => null);
  if (stored) {
    const key = keyOf("offline", stored.etag + stored.savedAt);
    if (!pmtilesProtocol().get(key)) pmtilesProtocol().add(new PMTiles(new StoredSource(stored.blob, key)));
    return { kind: "offline", url: `pmtiles://${key}` };
  }
  if (!navigator.onLine) return null;
  // A weak link must not hold the map back: the outlines draw meanwhile, the ground after.
  const server = await serverBasemap(AbortSignal.timeout(10_000)).catch(() => null);
  if (!server) return null;
  const key = keyOf("online", server.etag);
  if (!pmtilesProtocol().get(key)) pmtilesProtocol().add(new PMTiles(new ServerSource(key)));
  return { kind: "online", url: `pmtiles://${key}` };
}
