import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import jpeg from "jpeg-js";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { LodebookDb, type LocalPhoto } from "@/client/device-db";
import { enqueue, newId, saveFind, stripLocal } from "@/client/logbook";
import { saveSettings } from "@/client/settings";
import { syncOnce } from "@/client/sync/engine";
import { CHUNK_BYTES } from "@/client/sync/photo-upload";
import type { SyncStatus } from "@/client/sync/status";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { fetchToSyncHandlers, newFind } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, seededDatabase, sessionCookie } from "../support/test-db";

// The device's own engine uploading photos in chunks to the real handlers: a cut link costs
// only what was in flight, and "records now, photos later" holds photos back.

let db: Db;
let memberId: string;
let cookie: string;
let photoDir: string;
const devices: LodebookDb[] = [];

beforeEach(async () => {
  ({ db } = await seededDatabase());
  const m = memberByEmail(db, MEMBER_EMAIL);
  memberId = m.id;
  cookie = await sessionCookie(m);
  resetLimits();
  photoDir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-device-photos-"));
  vi.stubEnv("LODEBOOK_PHOTO_DIR", photoDir);
  fetchToSyncHandlers(vi.stubGlobal, () => cookie);
});
afterEach(() => {
  vi.unstubAllGlobals();
  vi.unstubAllEnvs();
  for (const d of devices.splice(0)) d.close();
  fs.rmSync(photoDir, { recursive: true, force: true });
});

function device(): LodebookDb {
  const d = new LodebookDb(`device-photos-${newId()}`);
  devices.push(d);
  return d;
}

/** Noise compresses badly: a JPEG of several chunks. */
function bigJpeg(seed: number): Buffer {
  const width = 700;
  const height = 500;
  const data = Buffer.alloc(width * height * 4);
  let x = seed;
  for (let i = 0; i < data.length; i++) data[i] = (x = (x * 1103515245 + 12345) >>> 0) >>> 24;
  return Buffer.from(jpeg.encode({ data, width, height }, 95).data);
}

/** A find with a photo, stored as addPhoto stores it (the shrinking needs a browser). */
async function findWithPhoto(d: LodebookDb, bytes: Buffer): Promise<LocalPhoto> {
  const find = newFind();
  await saveFind(d, find);
  const blob = new Blob([new Uint8Array(bytes)], { type: "image/jpeg" });
  const photo: LocalPhoto = {
    id: newId(),
    findId: find.id,
    sha256: crypto.createHash("sha256").update(bytes).digest("hex"),
    contentType: "image/jpeg",
    bytes: bytes.length,
    width: 700,
    height: 500,
    takenAt: null,
    lat: null,
    lon: null,
    blob,
    thumb: blob,
    uploaded: 0,
    updatedAt: Date.now(),
  };
  await d.transaction("rw", [d.photos, d.outbox], async () => {
    const { blob: _b, thumb: _t, uploaded: _u, ...record } = photo;
    await d.photos.add(photo);
    await enqueue(d, "photo.put", stripLocal(record), photo.id);
  });
  return photo;
}

const storedOnServer = (id: string) => {
  const file = path.join(photoDir, "p", id);
  return fs.existsSync(file) ? fs.readFileSync(file) : null;
};

describe("photo uploads over a poor link (issue 17)", () => {
  it("a link cut in the middle of a chunk resumes from what the server holds; the server ends with the exact bytes", async () => {
    const phone = device();
    const bytes = bigJpeg(11);
    expect(bytes.length).toBeGreaterThan(2 * CHUNK_BYTES);
    const photo = await findWithPhoto(phone, bytes);
    // The second chunk gets half-way, then the link drops (fetch throws, as a browser's does).
    const handlers = globalThis.fetch;
    let chunks = 0;
    let sentBytes = 0;
    vi.stubGlobal("fetch", async (input: string, init?: RequestInit) => {
      if (init?.method === "PUT" && input.includes("/upload")) {
        const body = new Uint8Array(await (init.body as Blob).arrayBuffer());
        chunks++;
        if (chunks === 2) {
          const half = body.subarray(0, body.length >> 1);
          sentBytes += half.length;
          let given = false;
          const cut = new ReadableStream<Uint8Array>({
            pull(c) {
              if (given) c.error(new Error("reset"));
              else c.enqueue(half);
              given = true;
            },
          });
          await handlers(input, { ...init, body: cut, duplex: "half" } as RequestInit).catch(() => undefined);
          throw new TypeError("Failed to fetch");
        }
        sentBytes += body.length;
        return handlers(input, { ...init, body });
      }
      return handlers(input, init);
    });
    const seen: SyncStatus[] = [];
    const outcome = await syncOnce(phone, memberId, (s) => seen.push(s));
    expect(outcome.kind).toBe("done");
    expect(storedOnServer(photo.id)?.equals(bytes)).toBe(true);
    expect((await phone.photos.get(photo.id))?.uploaded).toBe(1);
    // Nothing was sent twice: the half chunk that arrived was kept.
    expect(sentBytes).toBe(bytes.length);
    const last = seen.filter((s) => s.kind === "syncing" && s.phase === "photos").at(-1);
    expect(last).toMatchObject({ done: 1, total: 1, bytesDone: bytes.length, bytesTotal: bytes.length });
  });

  it("records now, photos later: records go up and photos wait until the member sends them", async () => {
    const phone = device();
    const bytes = bigJpeg(12);
    const photo = await findWithPhoto(phone, bytes);
    await saveSettings(phone, { photosLater: true });
    expect((await syncOnce(phone, memberId, () => {})).kind).toBe("done");
    expect(db.$client.prepare("select storage_key as k from photos where id = ?").get(photo.id)).toEqual({ k: null });
    expect(await phone.outbox.count()).toBe(0);
    expect((await phone.photos.get(photo.id))?.uploaded).toBe(0);
    // "Send photos now".
    expect((await syncOnce(phone, memberId, () => {}, { photosNow: true })).kind).toBe("done");
    expect(storedOnServer(photo.id)?.equals(bytes)).toBe(true);
    expect((await phone.photos.get(photo.id))?.uploaded).toBe(1);
  });
});
