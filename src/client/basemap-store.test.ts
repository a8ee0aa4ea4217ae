import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { downloadBasemap, storedBasemap } from "./basemap-store";

// A download that does not bring the whole archive never replaces the copy the phone keeps.
// The stand-in cache stores a response only once its body has been read to the end, as the
// Cache API does; a body that fails makes `put` fail.

const store = new Map<string, { body: ArrayBuffer; headers: Headers }>();
const fakeCaches = {
  open: async () => ({
    put: async (key: string, res: Response) => {
      const body = await res.arrayBuffer();
      store.set(key, { body, headers: res.headers });
    },
    match: async (key: string) => {
      const hit = store.get(key);
      return hit ? new Response(hit.body, { headers: hit.headers }) : undefined;
    },
    delete: async (key: string) => store.delete(key),
  }),
};

const archive = (n: number) => {
  const bytes = new Uint8Array(n);
  bytes.set(new TextEncoder().encode("PMTiles"));
  bytes[7] = 3;
  return bytes;
};
function serve(body: Uint8Array, declared: number, contentType = "application/vnd.pmtiles", etag = '"v2"') {
  vi.stubGlobal(
    "fetch",
    vi.fn(async () => new Response(new Uint8Array(body), { headers: { "content-type": contentType, "x-basemap-bytes": String(declared), etag } })),
  );
}

beforeEach(async () => {
  store.clear();
  vi.stubGlobal("caches", fakeCaches);
  vi.stubGlobal("navigator", { storage: { estimate: async () => ({ quota: 1e9, usage: 0 }) } });
  serve(archive(1000), 1000, "application/vnd.pmtiles", '"v1"');
  await downloadBasemap(() => {});
});
afterEach(() => vi.unstubAllGlobals());

describe("keeping the basemap on the phone", () => {
  it("keeps a whole archive with its size and version", async () => {
    serve(archive(2000), 2000);
    await downloadBasemap(() => {});
    expect(await storedBasemap()).toMatchObject({ bytes: 2000, etag: '"v2"' });
  });

  it("keeps the old copy when the body ends short", async () => {
    serve(archive(1500), 2000);
    await expect(downloadBasemap(() => {})).rejects.toThrow(/stopped at/);
    expect(await storedBasemap()).toMatchObject({ bytes: 1000, etag: '"v1"' });
  });

  it("keeps the old copy when what arrives is not a basemap (a network's sign-in page)", async () => {
    serve(new TextEncoder().encode("<html>Sign in to the Wi-Fi</html>"), 0, "text/html");
    await expect(downloadBasemap(() => {})).rejects.toThrow(/not the club's basemap/);
    serve(new TextEncoder().encode("<html>Sign in to the Wi-Fi</html>".padEnd(200)), 200);
    await expect(downloadBasemap(() => {})).rejects.toThrow(/not a PMTiles archive/);
    expect(await storedBasemap()).toMatchObject({ bytes: 1000, etag: '"v1"' });
  });
});
