import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { setPhotoStorage } from "@/server/storage";
import { S3Storage } from "@/server/storage/s3";
import { makeJpeg } from "../support/jpeg";

let server: S3rver;
let storage: S3Storage;

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

beforeAll(async () => {
  const port = await freePort();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-s3-"));
  server = new S3rver({ port, address: "127.0.0.1", directory: dir, silent: true, configureBuckets: [{ name: "club-photos", configs: [] }] });
  await server.run();
  storage = new S3Storage({
    bucket: "club-photos",
    region: "us-east-1",
    endpoint: `http://127.0.0.1:${port}`,
    accessKeyId: "S3RVER",
    secretAccessKey: "S3RVER",
    prefix: "test/",
  });
});
afterAll(async () => {
  setPhotoStorage(undefined);
  await server?.close();
});

describe("photo storage on an S3-compatible bucket (a local fake on loopback)", () => {
  it("puts, gets back the same bytes, and deletes", async () => {
    const bytes = makeJpeg({ width: 40, height: 30 });
    await storage.put("p/one", bytes, "image/jpeg");
    expect(Buffer.compare((await storage.get("p/one"))!, bytes)).toBe(0);
    await storage.delete("p/one");
    expect(await storage.get("p/one")).toBeNull();
    expect(await storage.get("p/never")).toBeNull();
  });

  it("serves the photo handlers: upload and read back through the bucket", async () => {
    const { seededDatabase, sessionCookie, memberByEmail, MEMBER_EMAIL, req } = await import("../support/test-db");
    const { push } = await import("../support/sync-client");
    const { newFind } = await import("../support/sync-client");
    const crypto = await import("node:crypto");
    const { v7 } = await import("uuid");
    const { db } = await seededDatabase();
    setPhotoStorage(storage);
    const cookie = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
    const bytes = makeJpeg({ width: 64, height: 48 });
    const find = newFind();
    const photo = {
      id: v7(),
      findId: find.id,
      sha256: crypto.createHash("sha256").update(bytes).digest("hex"),
      contentType: "image/jpeg",
      bytes: bytes.length,
      width: 64,
      height: 48,
      takenAt: null,
      lat: null,
      lon: null,
    };
    await push(cookie, v7(), [
      { id: 1, name: "find.put", args: find },
      { id: 2, name: "photo.put", args: photo },
    ]);
    const { PUT, GET } = await import("@/app/api/photos/[id]/route");
    const ctx = { params: Promise.resolve({ id: photo.id }) };
    expect((await PUT(req("/x", { method: "PUT", cookie, headers: { "content-type": "image/jpeg" }, body: new Uint8Array(bytes) }), ctx)).status).toBe(201);
    const served = Buffer.from(await (await GET(req("/x", { cookie }), ctx)).arrayBuffer());
    expect(crypto.createHash("sha256").update(served).digest("hex")).toBe(photo.sha256);
  });
});
