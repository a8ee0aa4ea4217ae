import crypto from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import jpeg from "jpeg-js";
import { v7 as uuidv7 } from "uuid";
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET, PUT } from "@/app/api/photos/[id]/route";
import { readPhotoMeta } from "@/client/photos";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { deletePurgedPhotoBytes, purgeTombstones } from "@/server/sync/tombstones";
import { makeJpeg } from "../support/jpeg";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

let db: Db;
let member: string;
let officer: string;
let photoDir: string;
const sha = (b: Buffer) => crypto.createHash("sha256").update(b).digest("hex");
const ctx = (id: string) => ({ params: Promise.resolve({ id }) });

beforeAll(async () => {
  ({ db } = await seededDatabase());
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
});
beforeEach(() => {
  resetLimits();
  photoDir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-uploads-"));
  vi.stubEnv("LODEBOOK_PHOTO_DIR", photoDir);
});
afterEach(() => {
  vi.unstubAllEnvs();
  fs.rmSync(photoDir, { recursive: true, force: true });
});

/** A photo record (declaring whatever size it likes) pushed with its find, then its bytes uploaded. */
async function recordPhoto(bytes: Buffer, declared = bytes.length) {
  const find = newFind();
  const photo = {
    id: uuidv7(),
    findId: find.id,
    sha256: sha(bytes),
    contentType: "image/jpeg",
    bytes: declared,
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
  return { photo, find };
}
const upload = (id: string, bytes: Buffer) =>
  PUT(req("/x", { method: "PUT", cookie: member, headers: { "content-type": "image/jpeg" }, body: new Uint8Array(bytes) }), ctx(id));
const serve = (id: string, cookie = member) => GET(req("/x", { cookie }), ctx(id));

/** Noise compresses badly: a few hundred kB of real JPEG. */
function noisyJpeg(seed: number): Buffer {
  const width = 400;
  const height = 300;
  const data = Buffer.alloc(width * height * 4);
  let x = seed;
  for (let i = 0; i < data.length; i++) data[i] = (x = (x * 1103515245 + 12345) >>> 0) >>> 24;
  return Buffer.from(jpeg.encode({ data, width, height }, 95).data);
}

describe("the photo quota counts the bytes actually stored (RELIABILITY 36)", () => {
  it("a record that declares a tiny size is counted at its real size", async () => {
    vi.stubEnv("LODEBOOK_PHOTO_QUOTA_MB", "0.7");
    const first = noisyJpeg(1);
    const second = noisyJpeg(2);
    const third = noisyJpeg(3);
    expect(first.length + second.length).toBeLessThan(0.7 * 1024 * 1024);
    expect(first.length + second.length + third.length).toBeGreaterThan(0.7 * 1024 * 1024);
    for (const bytes of [first, second]) {
      const { photo } = await recordPhoto(bytes, 1);
      expect((await upload(photo.id, bytes)).status).toBe(201);
    }
    const { photo } = await recordPhoto(third, 1);
    const res = await upload(photo.id, third);
    expect(res.status).toBe(413);
    expect((await res.json()).error.code).toBe("too_large:quota");
    const stored = db.$client
      .prepare("select stored_bytes as n from photos where member_id = ? and stored_bytes is not null order by uploaded_at desc limit 2")
      .all(memberByEmail(db, MEMBER_EMAIL).id) as { n: number }[];
    expect(stored.map((r) => r.n).sort()).toEqual([first.length, second.length].sort());
  });
});

describe("deleting a photo removes it from view at once, and its bytes once final (RELIABILITY 36)", () => {
  it("a deleted photo, or a photo of a deleted find, is never served again; the purge removes their bytes", async () => {
    const alone = makeJpeg({ width: 64, height: 48 });
    const withFind = makeJpeg({ width: 48, height: 64 });
    const a = await recordPhoto(alone);
    const b = await recordPhoto(withFind);
    expect((await upload(a.photo.id, alone)).status).toBe(201);
    expect((await upload(b.photo.id, withFind)).status).toBe(201);
    const onDisk = (id: string) => fs.existsSync(path.join(photoDir, "p", id));
    expect(onDisk(a.photo.id) && onDisk(b.photo.id)).toBe(true);
    const res = await push(member, uuidv7(), [
      { id: 1, name: "photo.delete", args: { id: a.photo.id } },
      { id: 2, name: "find.delete", args: { id: b.find.id } },
    ]);
    expect(res.body.results.map((r) => r.status)).toEqual(["applied", "applied"]);
    for (const id of [a.photo.id, b.photo.id]) {
      expect((await serve(id)).status).toBe(404);
      expect((await serve(id, officer)).status).toBe(404);
    }
    // Kept while devices may still need the deletion; gone from storage once it is final.
    expect(onDisk(a.photo.id) && onDisk(b.photo.id)).toBe(true);
    purgeTombstones(Date.now() + 200 * 86_400_000, 180);
    expect(await deletePurgedPhotoBytes()).toEqual({ deleted: 2, failed: 0 });
    expect(onDisk(a.photo.id) || onDisk(b.photo.id)).toBe(false);
    expect(db.$client.prepare("select count(*) as n from photo_bytes_to_delete").get()).toEqual({ n: 0 });
  });
});

// Segments built here: EXIF with GPS (piexif, through makeJpeg), XMP with GPS, a comment.
const APP1 = 0xe1;
function segment(marker: number, payload: Buffer): Buffer {
  const head = Buffer.from([0xff, marker, 0, 0]);
  head.writeUInt16BE(payload.length + 2, 2);
  return Buffer.concat([head, payload]);
}
function exifSegment(): Buffer {
  const withGps = makeJpeg({ width: 8, height: 8, lat: 41.801234, lon: -117.612345, takenAt: new Date(2026, 5, 1) });
  let i = 2;
  while (withGps[i + 1] !== APP1) i += 2 + withGps.readUInt16BE(i + 2);
  return withGps.subarray(i, i + 2 + withGps.readUInt16BE(i + 2));
}
const xmpSegment = () =>
  segment(
    APP1,
    Buffer.from(
      'http://ns.adobe.com/xap/1.0/\0<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"><rdf:Description xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="41,48.074N" exif:GPSLongitude="117,36.7407W"/></rdf:RDF></x:xmpmeta>',
      "latin1",
    ),
  );
const comment = () => segment(0xfe, Buffer.from("taken at 41.801234 -117.612345", "latin1"));

function layouts(): [string, Buffer][] {
  const base = makeJpeg({ width: 64, height: 48 });
  const soi = base.subarray(0, 2);
  const rest = base.subarray(2);
  const body = rest.subarray(0, rest.length - 2); // without EOI
  const eoi = Buffer.from([0xff, 0xd9]);
  const exif = exifSegment();
  const firstSegment = 2 + rest.readUInt16BE(2);
  return [
    ["EXIF with GPS first", Buffer.concat([soi, exif, rest])],
    ["fill bytes before the EXIF segment", Buffer.concat([soi, Buffer.from([0xff, 0xff, 0xff]), exif, rest])],
    ["two APP1 segments: EXIF and XMP", Buffer.concat([soi, exif, xmpSegment(), rest])],
    ["XMP alone, after the first segment", Buffer.concat([soi, rest.subarray(0, firstSegment), xmpSegment(), rest.subarray(firstSegment)])],
    ["EXIF after the scan, before the end", Buffer.concat([soi, body, exif, eoi])],
    ["EXIF after the end of image", Buffer.concat([base, exif])],
    ["a comment naming the place", Buffer.concat([soi, comment(), rest])],
  ];
}

describe("served photos carry no location, whatever the JPEG's segment layout (RELIABILITY 36)", () => {
  it.each(layouts())("%s", async (_name, bytes) => {
    const { photo } = await recordPhoto(bytes);
    expect((await upload(photo.id, bytes)).status).toBe(201);
    const res = await serve(photo.id, officer);
    expect(res.status).toBe(200);
    const served = Buffer.from(await res.arrayBuffer());
    const text = served.toString("latin1");
    for (const needle of ["Exif\0", "GPS", "xap/1.0", "41,48", "41.80", "117.6"]) expect(text.includes(needle), needle).toBe(false);
    expect((await readPhotoMeta(new Blob([new Uint8Array(served)]))).lat).toBeNull();
    // Still the same picture.
    const decoded = jpeg.decode(served);
    expect([decoded.width, decoded.height]).toEqual([64, 48]);
  });
});
