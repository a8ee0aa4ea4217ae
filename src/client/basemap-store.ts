"use client";
// The club's basemap kept on this device for the map with no signal. Plain fetch and the
// Cache API only: the PMTiles reader loads with the map screen, never with Settings.
//
// Why the Cache API (not the origin private file system): `cache.put` streams a response to
// disk and replaces the stored entry only once the whole body has arrived, so a download cut
// by the link leaves the previous copy whole; the size and version ride with it as headers;
// every browser that runs the app has it (writable OPFS streams came to Safari late); and it
// counts in the origin's storage estimate and lasting-storage grant like the logbook. Reading
// a range is `blob.slice`, which in Chromium reads from disk, not from a copy in memory.

const CACHE = "lodebook-basemap";
// A cache key only, never fetched: no route answers it.
const KEY = "/__lodebook/basemap.pmtiles";
export const BASEMAP_URL = "/api/basemap";

export type ServerBasemap = {
  bytes: number;
  etag: string;
  updatedAt: string;
  minZoom: number;
  maxZoom: number;
  bounds: [number, number, number, number];
};
export type StoredBasemap = { bytes: number; etag: string; savedAt: string };

export const canKeepBasemap = () => typeof caches !== "undefined";

/** The club's basemap as its server describes it; null when the club has none. Throws without a link. */
export async function serverBasemap(signal?: AbortSignal): Promise<ServerBasemap | null> {
  const res = await fetch(`${BASEMAP_URL}/info`, { cache: "no-store", credentials: "same-origin", signal });
  if (!res.ok) throw new Error(`The club's server answered ${res.status}.`);
  return ((await res.json()) as { basemap: ServerBasemap | null }).basemap;
}

async function storedResponse(): Promise<Response | null> {
  if (!canKeepBasemap()) return null;
  return (await (await caches.open(CACHE)).match(KEY)) ?? null;
}

export async function storedBasemap(): Promise<StoredBasemap | null> {
  const res = await storedResponse();
  if (!res) return null;
  return {
    bytes: Number(res.headers.get("x-basemap-bytes")),
    etag: res.headers.get("x-basemap-etag") ?? "",
    savedAt: res.headers.get("x-basemap-saved-at") ?? "",
  };
}

/** The stored archive's bytes (read by range, not loaded whole) and its version. */
export async function storedBasemapBlob(): Promise<{ blob: Blob; etag: string; savedAt: string } | null> {
  const res = await storedResponse();
  return res ? { etag: res.headers.get("x-basemap-etag") ?? "", savedAt: res.headers.get("x-basemap-saved-at") ?? "", blob: await res.blob() } : null;
}

export class BasemapError extends Error {}

/**
 * Downloads the club's basemap into this device's cache, reporting bytes as they arrive. The
 * previous copy stays until the new one is whole.
 */
export async function downloadBasemap(onProgress: (received: number, total: number) => void, signal?: AbortSignal): Promise<StoredBasemap> {
  if (!canKeepBasemap()) throw new BasemapError("This browser cannot keep files for Lodebook here (it needs the club's https address).");
  const res = await fetch(BASEMAP_URL, { cache: "no-store", credentials: "same-origin", signal });
  if (!res.ok || !res.body) {
    const message = ((await res.json().catch(() => null)) as { error?: { message?: string } } | null)?.error?.message;
    throw new BasemapError(message ?? `The club's server answered ${res.status}.`);
  }
  // The server names the size itself: Next drops Content-Length from a handler's answer.
  const total = Number(res.headers.get("x-basemap-bytes") ?? res.headers.get("content-length") ?? "0");
  const etag = res.headers.get("etag") ?? "";
  const estimate = await navigator.storage?.estimate?.();
  if (estimate?.quota !== undefined && estimate.usage !== undefined && estimate.quota - estimate.usage < total * 1.1)
    throw new BasemapError(`This device has ${mb(estimate.quota - estimate.usage)} free for Lodebook; the basemap needs ${mb(total)}.`);
  // A captive portal's page or a proxy's error is not a basemap: refused before anything is kept.
  if (!(res.headers.get("content-type") ?? "").startsWith("application/vnd.pmtiles"))
    throw new BasemapError("What arrived is not the club's basemap (a sign-in page of the network?). The copy kept before, if any, is unchanged.");
  let received = 0;
  const counted = res.body.pipeThrough(
    new TransformStream<Uint8Array, Uint8Array>({
      transform(chunk, out) {
        if (received === 0 && chunk.byteLength >= 7 && new TextDecoder().decode(chunk.subarray(0, 7)) !== "PMTiles") throw new Error("not a PMTiles archive");
        received += chunk.byteLength;
        onProgress(received, total);
        out.enqueue(chunk);
      },
      // A body that ends short fails the stream, so the cache never replaces the copy it holds.
      flush() {
        if (total > 0 && received !== total) throw new Error(`only ${received} of ${total} bytes arrived`);
      },
    }),
  );
  const stored: StoredBasemap = { bytes: total, etag, savedAt: new Date().toISOString() };
  const cache = await caches.open(CACHE);
  try {
    await cache.put(
      KEY,
      new Response(counted, {
        headers: { "content-type": "application/vnd.pmtiles", "x-basemap-bytes": String(total), "x-basemap-etag": etag, "x-basemap-saved-at": stored.savedAt },
      }),
    );
  } catch (error) {
    if (signal?.aborted) throw new BasemapError("Stopped. The copy kept before, if any, is unchanged.");
    throw new BasemapError(
      `The download stopped at ${mb(received)} of ${mb(total)} (${error instanceof Error ? error.message : "the link dropped"}). Try again.`,
    );
  }
  return stored;
}

export async function removeStoredBasemap(): Promise<void> {
  if (canKeepBasemap()) await (await caches.open(CACHE)).delete(KEY);
}

export function mb(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(bytes < 10 * 1024 * 1024 ? 1 : 0)} MB`;
}
