import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import jpeg from "jpeg-js";
import { v7 as uuidv7 } from "uuid";
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as serveGet } from "@/app/api/photos/[id]/route";
import { GET, PUT } from "@/app/api/photos/[id]/upload/route";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { PARTIAL_KEEP_MS, sweepAbandonedPartials } from "@/server/photo-partials";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OTHER_MEMBER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let member: string;
let other: string;
let memberId: string;
let photoDir: string;
const sha = (b: Buffer) => crypto.createHash("sha256").update(b).digest("hex");
const ctx = (id: string) => ({ params: Promise.resolve({ id }) });

beforeAll(async () => {
  ({ db } = await seededDatabase());
  memberId = memberByEmail(db, MEMBER_EMAIL).id;
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  other = await sessionCookie(memberByEmail(db, OTHER_MEMBER_EMAIL));
});
beforeEach(() => {
  resetLimits();
  photoDir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-resume-"));
  vi.stubEnv("LODEBOOK_PHOTO_DIR", photoDir);
});
afterEach(() => {
  vi.unstubAllEnvs();
  fs.rmSync(photoDir, { recursive: true, force: true });
});

/** A real JPEG of a few hundred kB (noise compresses badly), so it takes several chunks. */
function bigJpeg(seed: number, width = 500, height = 400): Buffer {
  const data = Buffer.alloc(width * height * 4);
  let x = seed;
  for (let i = 0; i < data.length; i++) data[i] = (x = (x * 1103515245 + 12345) >>> 0) >>> 24;
  return Buffer.from(jpeg.encode({ data, width, height }, 95).data);
}

async function recordPhoto(bytes: Buffer, opts: { sha256?: string } = {}) {
  const find = newFind();
  const photo = {
    id: uuidv7(),
    findId: find.id,
    sha256: opts.sha256 ?? sha(bytes),
    contentType: "image/jpeg",
    bytes: bytes.length,
    width: 10,
    height: 10,
    takenAt: null,
    lat: null,
    lon: null,
  };
  const res = await push(member, uuidv7(), [
    { id: 1, name: "find.put", args: find },
    { id: 2, name: "photo.put", args: photo },
  ]);
  expect(res.body.results.map((r) => r.status)).toEqual(["applied", "applied"]);
  return photo.id;
}

const chunk = (id: string, offset: number | string, body: Uint8Array | ReadableStream<Uint8Array>, cookie = member) =>
  PUT(
    req(`/api/photos/${id}/upload?offset=${offset}`, {
      method: "PUT",
      cookie,
      headers: { "content-type": "application/octet-stream", ...(body instanceof Uint8Array ? { "content-length": String(body.byteLength) } : {}) },
      body,
      duplex: "half",
    } as RequestInit & { cookie: string }),
    ctx(id),
  );
const status = async (id: string, cookie = member) => GET(req(`/api/photos/${id}/upload`, { cookie }), ctx(id));
const partialFile = (id: string) => path.join(photoDir, ".partial", memberId, id);

/** A body that delivers `bytes` and then fails, as a request does when the link is cut. */
function cutBody(bytes: Uint8Array): ReadableStream<Uint8Array> {
  let sent = false;
  return new ReadableStream({
    pull(controller) {
      if (!sent) {
        sent = true;
        controller.enqueue(bytes);
      } else controller.error(new Error("connection reset"));
    },
  });
}

const CHUNK = 64 * 1024;

describe("resumable photo uploads (issue 17: camp sync over a poor link)", () => {
  it("a chunk cut mid-way keeps what arrived; the device resumes from the server's offset and the stored bytes are exact", async () => {
    const bytes = bigJpeg(1);
    expect(bytes.length).toBeGreaterThan(3 * CHUNK);
    const id = await recordPhoto(bytes);
    expect(await (await status(id)).json()).toEqual({ received: 0, total: bytes.length, complete: false });
    expect((await chunk(id, 0, bytes.subarray(0, CHUNK))).status).toBe(200);
    // The second chunk is cut after 10 000 of its bytes.
    await chunk(id, CHUNK, cutBody(new Uint8Array(bytes.subarray(CHUNK, CHUNK + 10_000))));
    const held = (await (await status(id)).json()) as { received: number };
    expect(held.received).toBe(CHUNK + 10_000);
    let offset = held.received;
    while (offset < bytes.length) {
      const res = await chunk(id, offset, bytes.subarray(offset, offset + CHUNK));
      const body = (await res.json()) as { received: number; complete: boolean };
      offset = body.received;
      expect(res.status).toBe(offset === bytes.length ? 201 : 200);
    }
    const served = await serveGet(req(`/api/photos/${id}`, { cookie: member }), ctx(id));
    expect(served.status).toBe(200);
    expect(jpeg.decode(Buffer.from(await served.arrayBuffer())).width).toBe(500);
    expect(fs.readFileSync(path.join(photoDir, "p", id)).equals(bytes)).toBe(true);
    expect(fs.existsSync(partialFile(id))).toBe(false);
    // Sent again: the photo is there, nothing changes.
    expect(await (await chunk(id, 0, bytes.subarray(0, CHUNK))).json()).toMatchObject({ complete: true, stored: false });
  });

  it("a chunk at the wrong offset is refused with the server's offset", async () => {
    const bytes = bigJpeg(2);
    const id = await recordPhoto(bytes);
    await chunk(id, 0, bytes.subarray(0, CHUNK));
    const res = await chunk(id, 2 * CHUNK, bytes.subarray(2 * CHUNK, 3 * CHUNK));
    expect(res.status).toBe(409);
    const body = (await res.json()) as { error: { code: string; message: string; fields: { offset: string[] } } };
    expect(body.error.code).toBe("conflict:offset");
    expect(body.error.fields.offset).toEqual([String(CHUNK)]);
    expect(body.error.message).toContain(String(CHUNK));
    expect(fs.statSync(partialFile(id)).size).toBe(CHUNK);
  });

  it("bad input names its field, never a 500", async () => {
    const bytes = bigJpeg(3);
    const id = await recordPhoto(bytes);
    for (const offset of ["-1", "abc", "1.5"]) {
      const res = await chunk(id, offset, bytes.subarray(0, 10));
      expect(res.status).toBe(400);
      expect(Object.keys(((await res.json()) as { error: { fields: object } }).error.fields)).toContain("offset");
    }
    // Past the photo's declared size.
    const past = await chunk(id, 0, Buffer.concat([bytes, Buffer.alloc(10)]));
    expect(past.status).toBe(400);
    expect(((await past.json()) as { error: { fields: object } }).error.fields).toHaveProperty("offset");
    const wrongType = await PUT(
      req(`/api/photos/${id}/upload?offset=0`, { method: "PUT", cookie: member, headers: { "content-type": "text/plain" }, body: "x" }),
      ctx(id),
    );
    expect(wrongType.status).toBe(415);
    expect((await status(uuidv7())).status).toBe(404);
  });

  it("another member's photo is refused as unknown, and its partial is untouched", async () => {
    const bytes = bigJpeg(4);
    const id = await recordPhoto(bytes);
    await chunk(id, 0, bytes.subarray(0, CHUNK));
    expect((await chunk(id, CHUNK, bytes.subarray(CHUNK, 2 * CHUNK), other)).status).toBe(404);
    expect((await status(id, other)).status).toBe(404);
    expect((await status(uuidv7(), "")).status).toBe(401);
    expect(fs.statSync(partialFile(id)).size).toBe(CHUNK);
  });

  it("partial uploads count toward the member's photo space", async () => {
    const first = bigJpeg(5);
    const second = bigJpeg(6);
    const stored = (
      db.$client.prepare("select coalesce(sum(stored_bytes), 0) as n from photos where member_id = ? and storage_key is not null").get(memberId) as {
        n: number;
      }
    ).n;
    vi.stubEnv("LODEBOOK_PHOTO_QUOTA_MB", String((stored + first.length + CHUNK) / 1024 / 1024));
    const a = await recordPhoto(first);
    const b = await recordPhoto(second);
    // All but the last bytes of the first photo, held as a partial.
    let offset = 0;
    while (offset < first.length - 100) {
      const end = Math.min(offset + CHUNK, first.length - 100);
      offset = ((await (await chunk(a, offset, first.subarray(offset, end))).json()) as { received: number }).received;
    }
    expect((await chunk(b, 0, second.subarray(0, CHUNK))).status).toBe(200);
    const over = await chunk(b, CHUNK, second.subarray(CHUNK, 2 * CHUNK));
    expect(over.status).toBe(413);
    expect(((await over.json()) as { error: { code: string } }).error.code).toBe("too_large:quota");
  });

  it("a hash mismatch at the end discards the partial, so the device starts again from 0", async () => {
    const bytes = bigJpeg(7);
    const id = await recordPhoto(bytes, { sha256: sha(Buffer.from("something else")) });
    let offset = 0;
    let last: Response | undefined;
    while (offset < bytes.length) {
      last = await chunk(id, offset, bytes.subarray(offset, offset + CHUNK));
      if (!last.ok) break;
      offset = ((await last.json()) as { received: number }).received;
    }
    expect(last!.status).toBe(400);
    expect(((await last!.json()) as { error: { fields: object } }).error.fields).toHaveProperty("sha256");
    expect(fs.existsSync(partialFile(id))).toBe(false);
    expect(await (await status(id)).json()).toMatchObject({ received: 0, complete: false });
  });

  it("partials abandoned for a day are removed", async () => {
    const bytes = bigJpeg(8);
    const id = await recordPhoto(bytes);
    await chunk(id, 0, bytes.subarray(0, CHUNK));
    expect(await sweepAbandonedPartials(Date.now())).toBe(0);
    expect(await sweepAbandonedPartials(Date.now() + PARTIAL_KEEP_MS + 60_000)).toBe(1);
    expect(fs.existsSync(partialFile(id))).toBe(false);
  });
});
