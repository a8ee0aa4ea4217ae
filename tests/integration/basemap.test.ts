import fs from "node:fs";
import zlib from "node:zlib";
import fc from "fast-check";
import { PMTiles, type Source } from "pmtiles";
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { DELETE, GET, HEAD } from "@/app/api/basemap/route";
import { GET as INFO } from "@/app/api/basemap/info/route";
import { GET as STATUS, PUT } from "@/app/api/basemap/upload/route";
import { basemapPath } from "@/server/basemap/files";
import type { Db } from "@/server/db";
import { LIMITS, resetLimits, spend } from "@/server/limits";
import { testArchive } from "../support/basemap";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let member: string;
let officer: string;
const archive = testArchive();

beforeAll(async () => {
  ({ db } = await seededDatabase());
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
});
beforeEach(() => {
  resetLimits();
  fs.rmSync(basemapPath(), { force: true });
});
afterEach(() => vi.unstubAllEnvs());

const put = (cookie: string, bytes: Uint8Array, offset: number, size: number, headers: Record<string, string> = {}) =>
  PUT(
    req(`/api/basemap/upload?offset=${offset}&size=${size}`, {
      method: "PUT",
      cookie,
      headers: { "content-type": "application/octet-stream", ...headers },
      body: new Uint8Array(bytes),
    }),
    {},
  );

/** Uploads in chunks as the console does; returns the last answer. */
type Answer = { received: number; complete: boolean; basemap?: unknown; error: { code: string; message: string; fields: Record<string, string[]> } };
async function upload(bytes: Uint8Array, chunk = 300, cookie = officer): Promise<{ status: number; body: Answer }> {
  let offset = 0;
  for (;;) {
    const res = await put(cookie, bytes.subarray(offset, offset + chunk), offset, bytes.length);
    const body = (await res.json()) as Answer;
    if (!res.ok || body.complete) return { status: res.status, body };
    offset = body.received;
  }
}

const read = (cookie: string, headers: Record<string, string> = {}) => GET(req("/api/basemap", { cookie, headers }), {});
const info = async (cookie: string) => (await INFO(req("/api/basemap/info", { cookie }), {})).json();

describe("the club's basemap on its server", () => {
  it("is nothing until an officer uploads one; members are told so, strangers are asked to sign in", async () => {
    expect((await read(member)).status).toBe(404);
    expect(await info(member)).toEqual({ basemap: null });
    expect((await read("")).status).toBe(401);
    expect((await INFO(req("/api/basemap/info"), {})).status).toBe(401);
  });

  it("an officer uploads a PMTiles archive in chunks; members read it whole and by range, with its size and version", async () => {
    const first = await put(officer, archive.bytes.subarray(0, 100), 0, archive.bytes.length);
    expect(first.status).toBe(200);
    expect(await first.json()).toEqual({ received: 100, total: archive.bytes.length, complete: false });
    // Where it stands, after a cut: the console goes on from here.
    expect(await (await STATUS(req(`/api/basemap/upload?size=${archive.bytes.length}`, { cookie: officer }), {})).json()).toMatchObject({ received: 100 });
    // A chunk at the wrong offset is told where the server stands.
    const wrong = await put(officer, archive.bytes.subarray(200, 300), 200, archive.bytes.length);
    expect(wrong.status).toBe(409);
    expect((await wrong.json()).error.fields.offset).toEqual(["100"]);
    let offset = 100;
    let last: Response | undefined;
    while (offset < archive.bytes.length) {
      last = await put(officer, archive.bytes.subarray(offset, offset + 250), offset, archive.bytes.length);
      offset = (await last.clone().json()).received;
    }
    expect(last!.status).toBe(201);
    const stored = (await last!.json()).basemap;
    expect(stored).toMatchObject({ bytes: archive.bytes.length, tileType: "png", minZoom: 0, maxZoom: 2, bounds: [-120, 30, -110, 45] });
    expect(fs.readFileSync(basemapPath())).toEqual(archive.bytes);
    expect((await info(member)).basemap).toEqual(stored);

    const whole = await read(member);
    expect(whole.status).toBe(200);
    expect(whole.headers.get("content-length")).toBe(String(archive.bytes.length));
    expect(whole.headers.get("x-basemap-bytes")).toBe(String(archive.bytes.length));
    expect(whole.headers.get("etag")).toBe(stored.etag);
    expect(whole.headers.get("accept-ranges")).toBe("bytes");
    expect(whole.headers.get("cache-control")).toMatch(/no-store/);
    expect(Buffer.from(await whole.arrayBuffer())).toEqual(archive.bytes);
    const head = await HEAD(req("/api/basemap", { method: "HEAD", cookie: member }), {});
    expect([head.status, head.headers.get("etag"), head.headers.get("x-basemap-bytes"), head.body]).toEqual([
      200,
      stored.etag,
      String(archive.bytes.length),
      null,
    ]);
    expect((await HEAD(req("/api/basemap", { method: "HEAD" }), {})).status).toBe(401);

    // The reader's first request: 16 kB of a smaller archive is what there is (RFC 9110 §14.1.2).
    const opening = await read(member, { range: "bytes=0-16383" });
    expect(opening.status).toBe(206);
    expect(opening.headers.get("content-range")).toBe(`bytes 0-${archive.bytes.length - 1}/${archive.bytes.length}`);
    expect(Buffer.from(await opening.arrayBuffer())).toEqual(archive.bytes);
    const middle = await read(member, { range: "bytes=127-226" });
    expect(middle.headers.get("content-length")).toBe("100");
    expect(Buffer.from(await middle.arrayBuffer())).toEqual(archive.bytes.subarray(127, 227));
    const tail = await read(member, { range: "bytes=-10" });
    expect(Buffer.from(await tail.arrayBuffer())).toEqual(archive.bytes.subarray(-10));
    const beyond = await read(member, { range: `bytes=${archive.bytes.length}-` });
    expect(beyond.status).toBe(416);
    expect(beyond.headers.get("content-range")).toBe(`bytes */${archive.bytes.length}`);
    // A range asked of another version gets the whole of this one.
    expect((await read(member, { range: "bytes=0-9", "if-range": '"another-version"' })).status).toBe(200);
    expect((await read(member, { range: "bytes=0-9", "if-range": stored.etag })).status).toBe(206);
  });

  it("counts a member's whole downloads (ten an hour), however asked for; the ranges a map reads go on", async () => {
    const archive = testArchive().bytes;
    expect((await upload(archive)).body.complete).toBe(true);
    // Whole answers all: no range, a range it cannot read, another version's, one covering it all.
    const ways: Record<string, string>[] = [
      {},
      { range: "bytes=abc" },
      { range: "bytes=0-9", "if-range": '"another-version"' },
      { range: "bytes=0-" },
      { range: `bytes=0-${archive.length + 99}` },
    ];
    for (let i = 0; i < 10; i++) {
      const res = await read(member, ways[i % ways.length]);
      expect(res.status, JSON.stringify(ways[i % ways.length])).toBe(i % ways.length < 3 ? 200 : 206);
      await res.body?.cancel();
    }
    for (const way of ways) {
      const over = await read(member, way);
      expect(over.status, JSON.stringify(way)).toBe(429);
      expect(over.headers.get("retry-after")).toMatch(/^\d+$/);
    }
    const range = await read(member, { range: "bytes=0-126" });
    expect(range.status).toBe(206);
    await range.body?.cancel();
    expect((await read(officer)).status).toBe(200); // another account's count is its own
  });

  it("holds reading the archive piece by piece to a budget of bytes, far above a map's use", async () => {
    const archive = testArchive().bytes;
    expect((await upload(archive)).body.complete).toBe(true);
    expect(archive.length).toBeGreaterThan(300);
    // A map reads tiles of tens of kB: the hour's budget is 4 GiB. Spent but for 1 KiB here (the
    // test archive is small), one more piece is read, and the next is refused.
    await spend([["basemapRangeKiBPerAccount", memberByEmail(db, MEMBER_EMAIL).id, LIMITS.basemapRangeKiBPerAccount.points - 1]]);
    const last = await read(member, { range: "bytes=0-255" });
    expect(last.status).toBe(206);
    await last.body?.cancel();
    const more = await read(member, { range: "bytes=0-255" });
    expect(more.status).toBe(429);
    expect((await read(officer, { range: "bytes=0-255" })).status).toBe(206);
  });

  it("serves every tile to the pmtiles reader through range requests", async () => {
    expect((await upload(archive.bytes)).status).toBe(201);
    const source: Source = {
      getKey: () => "route",
      getBytes: async (offset, length) => {
        const res = await read(member, { range: `bytes=${offset}-${offset + length - 1}` });
        expect(res.status).toBe(206);
        return { data: await res.arrayBuffer(), etag: res.headers.get("etag") ?? undefined };
      },
    };
    const reader = new PMTiles(source);
    for (const t of archive.tiles) expect(Buffer.from((await reader.getZxy(t.z, t.x, t.y))!.data)).toEqual(Buffer.from(t.data));
  });

  it("refuses what is not a PMTiles v3 raster archive, naming the field, and keeps the one in place", async () => {
    expect((await upload(archive.bytes)).status).toBe(201);
    const kept = (await info(member)).basemap;
    const bytes = archive.bytes;
    const changed = (edit: (b: Buffer) => void) => {
      const copy = Buffer.from(bytes);
      edit(copy);
      return copy;
    };
    const rootAt = bytes.readUInt32LE(8);
    const rootLength = bytes.readUInt32LE(16);
    const cases: [string, Buffer, string][] = [
      ["a JPEG", Buffer.concat([Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.alloc(400)]), "magic"],
      ["a version 2 archive", changed((b) => b.set([0x50, 0x4d, 2, 0], 0)), "version"],
      ["version 4", changed((b) => (b[7] = 4)), "version"],
      ["vector tiles", changed((b) => (b[99] = 1)), "tile_type"],
      ["brotli directories", changed((b) => (b[97] = 3)), "internal_compression"],
      ["a root directory past the end", changed((b) => b.writeUInt32LE(bytes.length, 16)), "root_directory"],
      ["tile data past the end", changed((b) => b.writeUInt32LE(bytes.length * 2, 64)), "tile_data"],
      ["zooms upside down", changed((b) => ((b[100] = 9), (b[101] = 3))), "zoom"],
      ["bounds off the globe", changed((b) => b.writeInt32LE(200 * 1e7, 110)), "bounds"],
      ["a root directory that is not gzip", changed((b) => b.fill(7, rootAt, rootAt + rootLength)), "root_directory"],
      [
        "entries pointing past the tiles",
        (() => {
          // One entry (tile 0, run 1, length 1 000 000, offset 0): past the tile data.
          const dir = zlib.gzipSync(Buffer.from([1, 0, 1, 0xc0, 0x84, 0x3d, 1]));
          const copy = Buffer.from(bytes);
          copy.fill(0, rootAt, rootAt + rootLength);
          dir.copy(copy, rootAt);
          copy.writeUInt32LE(dir.length, 16);
          return copy;
        })(),
        "root_directory",
      ],
      ["a metadata section that is not JSON", changed((b) => b.fill(0x41, b.readUInt32LE(24), b.readUInt32LE(24) + b.readUInt32LE(32))), "metadata"],
    ];
    for (const [what, bad, field] of cases) {
      const { status, body } = await upload(bad);
      expect(status, what).toBe(400);
      expect(body.error.code, what).toBe("bad_request:basemap");
      expect(Object.keys(body.error.fields), what).toEqual([field]);
      expect(body.error.message, what).toContain(`its ${field} `);
    }
    expect((await info(member)).basemap).toEqual(kept);
    expect(fs.readFileSync(basemapPath())).toEqual(archive.bytes);
    // Whatever arrives, the answer is never a 500.
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ minLength: 127, maxLength: 2000 }), fc.boolean(), async (random, withMagic) => {
        const body = withMagic ? Buffer.concat([Buffer.from("PMTiles\x03"), random]) : Buffer.from(random);
        const { status } = await upload(body, 700);
        expect(status).toBeGreaterThanOrEqual(400);
        expect(status).toBeLessThan(500);
      }),
      { numRuns: 200 },
    );
  });

  it("bounds the upload: too large an archive, too large a chunk, too short a file", async () => {
    vi.stubEnv("LODEBOOK_BASEMAP_MAX_MB", "0.0005"); // 524 bytes
    const tooBig = await put(officer, archive.bytes.subarray(0, 300), 0, archive.bytes.length);
    expect(tooBig.status).toBe(413);
    expect((await tooBig.json()).error.fields.size).toBeDefined();
    vi.unstubAllEnvs();
    const chunk = await put(officer, new Uint8Array(10), 0, 10 * 1024 * 1024, { "content-length": String(5 * 1024 * 1024) });
    expect(chunk.status).toBe(413);
    const short = await put(officer, new Uint8Array(20), 0, 20);
    expect(short.status).toBe(400);
    expect((await short.json()).error.fields.size).toBeDefined();
    const notBytes = await PUT(
      req(`/api/basemap/upload?offset=0&size=500`, { method: "PUT", cookie: officer, headers: { "content-type": "application/json" }, body: "{}" }),
      {},
    );
    expect(notBytes.status).toBe(415);
  });

  it("only officers upload, replace or remove it; a cross-site request is refused", async () => {
    expect((await put(member, archive.bytes, 0, archive.bytes.length)).status).toBe(403);
    expect((await put("", archive.bytes, 0, archive.bytes.length)).status).toBe(401);
    expect((await STATUS(req(`/api/basemap/upload?size=500`, { cookie: member }), {})).status).toBe(403);
    expect((await put(officer, archive.bytes, 0, archive.bytes.length, { origin: "https://elsewhere.example" })).status).toBe(403);
    expect(fs.existsSync(basemapPath())).toBe(false);
    expect((await upload(archive.bytes)).status).toBe(201);
    expect((await DELETE(req("/api/basemap", { method: "DELETE", cookie: member }), {})).status).toBe(403);
    expect((await DELETE(req("/api/basemap", { method: "DELETE", cookie: officer, headers: { origin: "https://elsewhere.example" } }), {})).status).toBe(403);
    expect((await read(member)).status).toBe(200);
    const removed = await DELETE(req("/api/basemap", { method: "DELETE", cookie: officer }), {});
    expect(await removed.json()).toEqual({ removed: true });
    expect((await read(member)).status).toBe(404);
    const actions = db.$client.prepare("select action from audit_log where entity = 'basemap' order by id").all() as { action: string }[];
    expect(actions.map((a) => a.action).slice(-2)).toEqual(["basemap.upload", "basemap.remove"]);
  });

  it("replaces atomically: a reader of the old version finishes it, the new one has a new version", async () => {
    expect((await upload(archive.bytes)).status).toBe(201);
    const before = (await info(member)).basemap;
    const reading = await read(member);
    const other = testArchive();
    const replacement = Buffer.from(other.bytes);
    // The same tiles with other metadata: another archive of another size.
    const { writePmtiles } = await import("@/server/seed/pmtiles-writer");
    const newer = writePmtiles(other.tiles, { tileType: "png", bounds: [-121, 30, -110, 45], metadata: { name: "newer ground", note: "x".repeat(50) } });
    expect(replacement.length).not.toBe(newer.length);
    expect((await upload(newer)).status).toBe(201);
    expect(Buffer.from(await reading.arrayBuffer())).toEqual(archive.bytes);
    const after = (await info(member)).basemap;
    expect(after.etag).not.toBe(before.etag);
    expect(after.bounds[0]).toBe(-121);
    expect(Buffer.from(await (await read(member)).arrayBuffer())).toEqual(newer);
  });

  it("serves an archive placed in the data folder by hand, and tells officers (only) why a bad one is not served", async () => {
    fs.writeFileSync(basemapPath(), archive.bytes);
    expect((await read(member)).status).toBe(200);
    fs.rmSync(basemapPath());
    fs.writeFileSync(basemapPath(), Buffer.from("not a map at all, just some words in a file that is long enough to have a header".repeat(3)));
    expect((await read(member)).status).toBe(404);
    expect(await info(member)).toEqual({ basemap: null });
    expect((await info(officer)).problem).toMatchObject({ field: "magic" });
  });
});
