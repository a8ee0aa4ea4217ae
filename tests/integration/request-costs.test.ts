import crypto from "node:crypto";
import { v7 as uuidv7 } from "uuid";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { HASH_CONCURRENCY, HASH_QUEUE, hashPassword } from "@/server/auth/password";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { CookieJar, signedIn, signInByPassword } from "../support/auth-client";
import { discoverHandlers, loadHandler } from "../support/handlers";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, seededDatabase, sessionCookie } from "../support/test-db";

// Every password hash goes through the real argon2 binding, watched.
vi.mock("@node-rs/argon2", async (importOriginal) => {
  const real = await importOriginal<typeof import("@node-rs/argon2")>();
  return { ...real, hash: vi.fn(real.hash) };
});
const argon2 = await import("@node-rs/argon2");

let db: Db;
let officer: string;
let member: string;
let photoId: string;
const CHUNK = 64 * 1024;
const HOSTILE_BYTES = 12 * 1024 * 1024;

beforeAll(async () => {
  ({ db } = await seededDatabase());
  officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  member = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  const find = newFind();
  photoId = uuidv7();
  const photo = {
    id: photoId,
    findId: find.id,
    sha256: "0".repeat(64),
    contentType: "image/jpeg",
    bytes: 1000,
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
});
beforeEach(() => resetLimits());

/** A chunked body with no declared length, counting what the server pulls from it. */
function hostileStream(total: number) {
  let sent = 0;
  const body = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (sent >= total) return controller.close();
      sent += CHUNK;
      controller.enqueue(new Uint8Array(CHUNK).fill(0x20));
    },
  });
  return { body, sent: () => sent };
}

describe("bodies are limited while they stream, on every handler (RELIABILITY 34)", () => {
  const writers = discoverHandlers().filter((h) => !["GET", "HEAD", "OPTIONS", "DELETE"].includes(h.method));

  it("covers every handler that takes a body", () => {
    expect(writers.map((h) => h.key).sort()).toMatchInlineSnapshot(`
      [
        "PATCH /api/[...unknown]",
        "PATCH /api/club/members/[id]",
        "POST /api/[...unknown]",
        "POST /api/auth/[...nextauth]",
        "POST /api/club/claims",
        "POST /api/club/claims/[id]/refigure",
        "POST /api/club/finds/[id]/reviews",
        "POST /api/club/invitations",
        "POST /api/club/invitations/[id]",
        "POST /api/club/prices",
        "POST /api/club/prices/[id]",
        "POST /api/club/recoveries",
        "POST /api/estimate",
        "POST /api/sync/push",
        "PUT /api/[...unknown]",
        "PUT /api/basemap/upload",
        "PUT /api/club/claims/[id]",
        "PUT /api/club/claims/[id]/profile",
        "PUT /api/club/recoveries/[id]/document",
        "PUT /api/club/settings",
        "PUT /api/photos/[id]",
        "PUT /api/photos/[id]/upload",
      ]
    `);
  });

  it.each(writers.map((h) => [h.key, h] as const))("%s refuses a 12 MB chunked body after reading no more than its limit", async (key, h) => {
    const handler = await loadHandler(h);
    const { body, sent } = hostileStream(HOSTILE_BYTES);
    const isPhoto = key.startsWith("PUT /api/photos");
    const isChunk = key.endsWith("/upload");
    const path =
      key
        .split(" ")[1]
        .replace("[id]", isPhoto ? photoId : uuidv7())
        .replace("[...nextauth]", "callback/credentials") +
      (isChunk ? "?offset=0" : "") +
      // A basemap chunk names the archive's size: one as large as the hostile body.
      (key.includes("basemap") ? `&size=${HOSTILE_BYTES}` : "");
    const type = isChunk
      ? "application/octet-stream"
      : isPhoto
        ? "image/jpeg"
        : key.includes("nextauth")
          ? "application/x-www-form-urlencoded"
          : "application/json";
    const request = new Request(new URL(path, "http://localhost:3000"), {
      method: h.method,
      headers: { "content-type": type, cookie: isPhoto ? member : officer },
      body,
      duplex: "half",
    } as RequestInit);
    const res = await handler(request, { params: Promise.resolve({ id: isPhoto ? photoId : uuidv7(), nextauth: ["callback", "credentials"] }) });
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
    // The largest body any handler accepts is 4 MB (a photo, a basemap chunk); nothing reads far past its limit.
    expect(sent()).toBeLessThanOrEqual(4 * 1024 * 1024 + 2 * CHUNK);
  });
});

describe("password hashing: off the event loop, capped, and only after the cheap checks (RELIABILITY 34)", () => {
  it("a burst beyond the queue is refused with 'busy', the rest are hashed", async () => {
    const total = HASH_QUEUE + HASH_CONCURRENCY + 6;
    const outcomes = await Promise.allSettled(Array.from({ length: total }, (_, i) => hashPassword(`burst-${i}`)));
    const refused = outcomes.filter((o) => o.status === "rejected");
    expect(refused.length).toBeGreaterThan(0);
    expect(refused.length).toBeLessThanOrEqual(6 + HASH_CONCURRENCY);
    for (const r of refused) expect(String((r as PromiseRejectedResult).reason.message)).toMatch(/busy/);
    for (const o of outcomes) if (o.status === "fulfilled") expect(o.value).toMatch(/^\$argon2id\$/);
    // The burst is over: hashing works again.
    expect(await hashPassword("after the burst")).toMatch(/^\$argon2id\$/);
  });

  it("joining with a wrong or spent link never hashes the password", async () => {
    const { acceptInvitation } = await import("@/server/club/members");
    vi.mocked(argon2.hash).mockClear();
    for (const token of ["x".repeat(43), crypto.randomBytes(32).toString("base64url")]) {
      await expect(acceptInvitation(token, "Someone", "a-long-password-1")).rejects.toThrow(/used, withdrawn or has run out/);
    }
    expect(argon2.hash).not.toHaveBeenCalled();
  });

  it("a password stored as bcrypt still signs in, and is stored as argon2id from then on", async () => {
    const { hashSync } = await import("@node-rs/bcrypt");
    const legacy = hashSync("an-old-password-9", 10);
    db.$client.prepare("update members set password_hash = ? where email = ?").run(legacy, MEMBER_EMAIL);
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, "an-old-password-9", { jar: new CookieJar() }))).toBe(true);
    const stored = (db.$client.prepare("select password_hash as h from members where email = ?").get(MEMBER_EMAIL) as { h: string }).h;
    expect(stored).toMatch(/^\$argon2id\$/);
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, "an-old-password-9", { jar: new CookieJar() }))).toBe(true);
  });
});

describe("work proportional to a member's data is set-based and bounded (RELIABILITY 34)", () => {
  it("500 sharing changes in one push re-send the member's finds once, not 500 times", async () => {
    const m = memberByEmail(db, MEMBER_EMAIL);
    const sqlite = db.$client;
    // A member with a few thousand finds.
    const finds = Array.from({ length: 3000 }, () => newFind());
    for (let i = 0; i < finds.length; i += 500) {
      const res = await push(
        member,
        uuidv7(),
        finds.slice(i, i + 500).map((f, j) => ({ id: j + 1, name: "find.put", args: f })),
      );
      expect(res.status).toBe(200);
    }
    const owned = (sqlite.prepare("select count(*) as n from finds where member_id = ?").get(m.id) as { n: number }).n;
    const seqBefore = (sqlite.prepare("select value from sequences where name = 'change'").get() as { value: number }).value;
    const toggles = Array.from({ length: 500 }, (_, i) => ({ id: i + 1, name: "settings.put", args: { locationSharing: i % 2 === 0 ? "claim" : "exact" } }));
    const res = await push(member, uuidv7(), toggles);
    expect(res.body.results.every((r) => r.status === "applied")).toBe(true);
    const seqAfter = (sqlite.prepare("select value from sequences where name = 'change'").get() as { value: number }).value;
    // One block of numbers for the member's finds, not one per change.
    expect(seqAfter - seqBefore).toBe(owned);
    const rows = sqlite.prepare("select seq from finds where member_id = ?").all(m.id) as { seq: number }[];
    expect(rows.every((r) => r.seq > seqBefore && r.seq <= seqAfter)).toBe(true);
    expect(new Set(rows.map((r) => r.seq)).size).toBe(rows.length);
    expect((sqlite.prepare("select location_sharing as s from members where id = ?").get(m.id) as { s: string }).s).toBe("exact");
  });

  it("a setting sent again unchanged re-sends nothing", async () => {
    const seq = () => (db.$client.prepare("select value from sequences where name = 'change'").get() as { value: number }).value;
    const before = seq();
    await push(member, uuidv7(), [{ id: 1, name: "settings.put", args: { locationSharing: "exact" } }]);
    expect(seq()).toBe(before);
  });
});
