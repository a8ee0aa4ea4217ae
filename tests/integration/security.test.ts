import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import fc from "fast-check";
import { v7 as uuidv7 } from "uuid";
import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import { resetLimits } from "@/server/limits";
import type { Db } from "@/server/db";
import { basemapPath } from "@/server/basemap/files";
import { testArchive } from "../support/basemap";
import { makeJpeg } from "../support/jpeg";
import { newFind, push } from "../support/sync-client";
import { discoverHandlers } from "../support/handlers";
import { databaseChecksum, MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, OTHER_MEMBER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

type Role = "anonymous" | "member" | "other" | "officer";
const ROLES: Role[] = ["anonymous", "member", "other", "officer"];
type Handler = (req: Request, ctx: unknown) => Response | Promise<Response>;

let db: Db;
const cookies: Record<Role, string> = { anonymous: "", member: "", other: "", officer: "" };
const fixture = {
  photoToUpload: "",
  photoToRead: "",
  photoBytes: Buffer.alloc(0) as Buffer,
  readBytes: Buffer.alloc(0) as Buffer,
  find: "",
  invitation: "",
  claim: "",
  claimName: "",
  bystander: "",
  otherLat: "",
  memberLat: "",
};

const sha = (b: Buffer) => crypto.createHash("sha256").update(b).digest("hex");
const json = (method: string, body: unknown) => ({ method, headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

async function photoRecord(cookie: string, bytes: Buffer, withFind = true) {
  const find = newFind();
  const photo = {
    id: uuidv7(),
    findId: find.id,
    sha256: sha(bytes),
    contentType: "image/jpeg",
    bytes: bytes.length,
    width: 64,
    height: 48,
    takenAt: null,
    lat: null,
    lon: null,
  };
  const muts = [...(withFind ? [{ id: 1, name: "find.put", args: find }] : []), { id: withFind ? 2 : 1, name: "photo.put", args: photo }];
  const res = await push(cookie, uuidv7(), muts);
  expect(res.body.results.every((r) => r.status === "applied")).toBe(true);
  return photo.id;
}

beforeAll(async () => {
  ({ db } = await seededDatabase());
  process.env.LODEBOOK_PHOTO_DIR = fs.mkdtempSync(path.join((await import("node:os")).tmpdir(), "lodebook-photos-"));
  const m = memberByEmail(db, MEMBER_EMAIL);
  cookies.member = await sessionCookie(m);
  cookies.other = await sessionCookie(memberByEmail(db, OTHER_MEMBER_EMAIL));
  cookies.officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
  // Changing a member ends their sessions: the matrix changes one who signs in nowhere here.
  fixture.bystander = memberByEmail(db, "hugo@quillmarsh.example").id;
  fixture.photoBytes = makeJpeg({ width: 64, height: 48 });
  fixture.readBytes = makeJpeg({ width: 64, height: 48, lat: 41.801234, lon: -117.612345, takenAt: new Date(2026, 5, 1) });
  fixture.photoToUpload = await photoRecord(cookies.member, fixture.photoBytes);
  fixture.photoToRead = await photoRecord(cookies.member, fixture.readBytes);
  const { PUT } = await import("@/app/api/photos/[id]/route");
  expect(
    (
      await PUT(req("/x", { method: "PUT", cookie: cookies.member, headers: { "content-type": "image/jpeg" }, body: new Uint8Array(fixture.readBytes) }), {
        params: Promise.resolve({ id: fixture.photoToRead }),
      })
    ).status,
  ).toBe(201);
  fixture.find = (db.$client.prepare("select id from finds where member_id = ? limit 1").get(m.id) as { id: string }).id;
  ({ id: fixture.claim, name: fixture.claimName } = db.$client.prepare("select id, name from claims limit 1").get() as { id: string; name: string });
  const other = memberByEmail(db, OTHER_MEMBER_EMAIL);
  const latOf = (id: string) =>
    String((db.$client.prepare("select lat from finds where member_id = ? and lat is not null limit 1").get(id) as { lat: number }).lat);
  fixture.otherLat = latOf(other.id);
  fixture.memberLat = latOf(m.id);
});
beforeEach(() => resetLimits());

/**
 * RELIABILITY 30: every route handler, discovered from the file system, against anonymous, a
 * member, another member and an officer. A handler without a row here fails the suite.
 */
type Row = { expect: Record<Role, number | number[]>; request: (role: Role) => { url?: string; init?: RequestInit; id?: string } };
const ALL = (n: number | number[]) => ({ anonymous: n, member: n, other: n, officer: n });
const OFFICER_ONLY = (ok: number | number[]) => ({ anonymous: 401, member: 403, other: 403, officer: ok });
const SIGNED_IN = (ok: number | number[]) => ({ anonymous: 401, member: ok, other: ok, officer: ok });

const MATRIX: Record<string, Row> = {
  "GET /api/auth/[...nextauth]": { expect: ALL(200), request: () => ({ url: "/api/auth/csrf" }) },
  "POST /api/auth/[...nextauth]": {
    expect: ALL([302, 400]),
    request: () => ({
      url: "/api/auth/callback/credentials",
      init: { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: "email=x%40y.example&password=nope" },
    }),
  },
  "GET /api/me": { expect: SIGNED_IN(200), request: () => ({}) },
  "POST /api/estimate": { expect: ALL(200), request: () => ({ init: json("POST", { method: "hanging", airGrams: [10], waterGrams: [6] }) }) },
  "POST /api/sync/push": {
    expect: SIGNED_IN(200),
    request: () => ({ init: json("POST", { protocolVersion: 1, clientId: uuidv7(), mutations: [{ id: 1, name: "find.put", args: newFind() }] }) }),
  },
  "GET /api/sync/pull": { expect: SIGNED_IN(200), request: () => ({ url: `/api/sync/pull?protocolVersion=1&clientId=${uuidv7()}&cursor=0&limit=50` }) },
  "PUT /api/photos/[id]": {
    expect: { anonymous: 401, member: [200, 201], other: 404, officer: 404 },
    request: () => ({
      id: fixture.photoToUpload,
      init: { method: "PUT", headers: { "content-type": "image/jpeg" }, body: new Uint8Array(fixture.photoBytes) },
    }),
  },
  // A chunk of another's photo, or an officer's, is as unknown as a guessed id (404).
  "PUT /api/photos/[id]/upload": {
    expect: { anonymous: 401, member: [200, 201], other: 404, officer: 404 },
    request: () => ({
      id: fixture.photoToUpload,
      url: `/api/photos/${fixture.photoToUpload}/upload?offset=0`,
      init: { method: "PUT", headers: { "content-type": "application/octet-stream" }, body: new Uint8Array(fixture.photoBytes) },
    }),
  },
  "GET /api/photos/[id]/upload": {
    expect: { anonymous: 401, member: 200, other: 404, officer: 404 },
    request: () => ({ id: fixture.photoToRead, url: `/api/photos/${fixture.photoToRead}/upload` }),
  },
  "GET /api/photos/[id]": { expect: { anonymous: 401, member: 200, other: 404, officer: 200 }, request: () => ({ id: fixture.photoToRead }) },
  // The basemap: any member reads it (put in place before each read, whatever ran before); officers change it.
  "GET /api/basemap": {
    expect: SIGNED_IN(200),
    request: () => {
      fs.writeFileSync(basemapPath(), testArchive().bytes);
      return {};
    },
  },
  "HEAD /api/basemap": {
    expect: SIGNED_IN(200),
    request: () => {
      fs.writeFileSync(basemapPath(), testArchive().bytes);
      return { init: { method: "HEAD" } };
    },
  },
  "GET /api/basemap/info": { expect: SIGNED_IN(200), request: () => ({}) },
  "DELETE /api/basemap": { expect: OFFICER_ONLY(200), request: () => ({ init: { method: "DELETE" } }) },
  "PUT /api/basemap/upload": {
    expect: OFFICER_ONLY(201),
    request: () => {
      const { bytes } = testArchive();
      return {
        url: `/api/basemap/upload?offset=0&size=${bytes.length}`,
        init: { method: "PUT", headers: { "content-type": "application/octet-stream" }, body: new Uint8Array(bytes) },
      };
    },
  },
  "GET /api/basemap/upload": { expect: OFFICER_ONLY(200), request: () => ({ url: "/api/basemap/upload?size=1000" }) },
  "GET /api/club/members": { expect: OFFICER_ONLY(200), request: () => ({}) },
  "PATCH /api/club/members/[id]": { expect: OFFICER_ONLY(200), request: () => ({ id: fixture.bystander, init: json("PATCH", { active: true }) }) },
  "GET /api/club/ledger": { expect: OFFICER_ONLY(200), request: () => ({ url: "/api/club/ledger?pageSize=200" }) },
  "GET /api/club/ledger/csv": { expect: OFFICER_ONLY(200), request: () => ({}) },
  "GET /api/club/ledger/geojson": { expect: OFFICER_ONLY(200), request: () => ({}) },
  "GET /api/club/finds/[id]": { expect: OFFICER_ONLY(200), request: () => ({ id: fixture.find }) },
  "POST /api/club/finds/[id]/reviews": {
    expect: OFFICER_ONLY(201),
    request: () => ({ id: fixture.find, init: json("POST", { action: "note", note: "looked at it" }) }),
  },
  "GET /api/club/claims": { expect: OFFICER_ONLY(200), request: () => ({}) },
  "POST /api/club/claims": { expect: OFFICER_ONLY(201), request: () => ({ init: json("POST", { name: `Matrix ${uuidv7()}`, kind: "placer" }) }) },
  "PUT /api/club/claims/[id]": {
    expect: OFFICER_ONLY(200),
    request: () => ({ id: fixture.claim, init: json("PUT", { name: fixture.claimName, kind: "placer" }) }),
  },
  "PUT /api/club/claims/[id]/profile": {
    expect: OFFICER_ONLY(200),
    request: () => ({
      id: fixture.claim,
      init: json("PUT", {
        finenessLow: 700,
        finenessHigh: 950,
        finenessSource: "Club preset",
        hostDensityLow: 2.62,
        hostDensityHigh: 2.68,
        hostDensitySource: "Club preset",
      }),
    }),
  },
  "POST /api/club/claims/[id]/refigure": { expect: OFFICER_ONLY(200), request: () => ({ id: fixture.claim, init: json("POST", { season: 2026 }) }) },
  "GET /api/club/prices": { expect: OFFICER_ONLY(200), request: () => ({}) },
  "POST /api/club/prices": {
    expect: OFFICER_ONLY(201),
    request: () => ({ init: json("POST", { effectiveOn: "2026-12-01", pricePerTroyOunce: 2600, currency: "USD" }) }),
  },
  "POST /api/club/prices/[id]": {
    expect: OFFICER_ONLY(404),
    request: () => ({ id: uuidv7(), init: json("POST", { action: "withdraw", note: "entered twice" }) }),
  },
  "GET /api/club/recoveries": { expect: OFFICER_ONLY(200), request: () => ({ url: `/api/club/recoveries?claimId=${fixture.claim}&season=2026` }) },
  "POST /api/club/recoveries": {
    expect: OFFICER_ONLY(400),
    request: () => ({ init: json("POST", { kind: "melt", claimId: fixture.claim, recordedOn: "2026-11-20", fineGrams: 5, findIds: [uuidv7()] }) }),
  },
  "PUT /api/club/recoveries/[id]/document": {
    expect: OFFICER_ONLY(404),
    request: () => ({ id: uuidv7(), init: { method: "PUT", headers: { "content-type": "application/pdf" }, body: "%PDF-1.4" } }),
  },
  "GET /api/club/recoveries/[id]/document": { expect: OFFICER_ONLY(404), request: () => ({ id: uuidv7() }) },
  "GET /api/club/barren-rock": { expect: OFFICER_ONLY(200), request: () => ({ url: `/api/club/barren-rock?claimId=${fixture.claim}&season=2026` }) },
  "GET /api/club/settings": { expect: OFFICER_ONLY(200), request: () => ({}) },
  "PUT /api/club/settings": {
    expect: OFFICER_ONLY(200),
    request: () => ({ init: json("PUT", { name: "Quillmarsh Gulch Prospectors", currency: "USD", timeZone: "America/Los_Angeles" }) }),
  },
  "GET /api/club/invitations": { expect: OFFICER_ONLY(200), request: () => ({}) },
  // No mail relay in this test: the invitation is kept and the officer is told to resend (503).
  "POST /api/club/invitations": { expect: OFFICER_ONLY([201, 503]), request: () => ({ init: json("POST", { email: `m${Date.now()}@quillmarsh.example` }) }) },
  "POST /api/club/invitations/[id]": { expect: OFFICER_ONLY(404), request: () => ({ id: uuidv7(), init: json("POST", { action: "resend" }) }) },
  "DELETE /api/club/invitations/[id]": { expect: OFFICER_ONLY(404), request: () => ({ id: uuidv7(), init: { method: "DELETE" } }) },
  "GET /api/club/production": { expect: OFFICER_ONLY(200), request: () => ({ url: "/api/club/production?season=2026" }) },
  "GET /api/club/backup": { expect: OFFICER_ONLY(200), request: () => ({}) },
  // Any address no handler answers: a 404 in the API's JSON, whoever asks, however.
  ...Object.fromEntries(
    ["GET", "POST", "PUT", "PATCH", "DELETE"].map((m) => [
      `${m} /api/[...unknown]`,
      { expect: ALL(404), request: () => ({ url: "/api/club/nothing/here", init: { method: m, ...(m === "GET" || m === "DELETE" ? {} : { body: "{" }) } }) },
    ]),
  ),
};

describe("authorization matrix (RELIABILITY 23–25, 30)", () => {
  const handlers = discoverHandlers();
  it("has a row for every route handler in the tree", () => {
    const missing = handlers.map((h) => h.key).filter((k) => !MATRIX[k]);
    expect(missing).toEqual([]);
    expect(handlers.length).toBeGreaterThanOrEqual(25);
  });
  it.each(handlers.map((h) => [h.key, h] as const))("%s", async (key, h) => {
    const row = MATRIX[key];
    const mod = (await import(/* @vite-ignore */ h.file)) as Record<string, Handler>;
    const handler = mod[h.method];
    for (const role of ROLES) {
      const r = row.request(role);
      const route = key.split(" ")[1];
      const url = r.url ?? route.replace("[id]", r.id ?? "x");
      const headers = new Headers(r.init?.headers);
      if (cookies[role]) headers.set("cookie", cookies[role]);
      const res = await handler(new Request(new URL(url, "http://localhost:3000"), { ...r.init, headers }), {
        params: Promise.resolve({ id: r.id ?? "x", nextauth: url.split("/").slice(3) }),
      });
      const expected = ([] as number[]).concat(row.expect[role]);
      expect(expected, `${key} as ${role} answered ${res.status}`).toContain(res.status);
      expect(res.status, `${key} as ${role}`).not.toBe(500);
      // Photos, the basemap and the officers' database backup are binary by design (the backup is the whole database).
      const binary = /image|sqlite|pmtiles/.test(res.headers.get("content-type") ?? "");
      const text = binary ? "" : await res.text();
      expect(text).not.toMatch(/password_?hash|\$2[aby]\$\d\d\$/i);
      const theirs = role === "other" ? fixture.memberLat : fixture.otherLat;
      if (role !== "officer") expect(text.includes(theirs), `${key} as ${role} leaks another member's position`).toBe(false);
    }
  });
});

// Who is asking comes first: a stranger learns nothing of what a handler accepts (its limits,
// its fields, its query) and costs it no reading of a body; a member learns nothing of an
// officer's handler. Every handler whose answer depends on the session, asked with a body
// that is not JSON, one over every limit and a query that is all wrong, answers as the matrix
// says it answers that caller a good request.
describe("the session is checked before the request is read (RELIABILITY 30)", () => {
  const handlers = discoverHandlers();
  const junkQuery = "?season=zz&page=-1&pageSize=zz&offset=-1&size=zz&scope=zz&protocolVersion=zz&clientId=zz&cursor=zz&limit=zz&from=zz&to=zz";
  it.each(handlers.map((h) => [h.key, h] as const).filter(([key]) => [401, 403].includes(MATRIX[key].expect.anonymous as number)))("%s", async (key, h) => {
    const handler = ((await import(/* @vite-ignore */ h.file)) as Record<string, Handler>)[h.method];
    const method = key.split(" ")[0];
    const path = key.split(" ")[1].replace("[id]", fixture.find);
    const withBody = !["GET", "HEAD", "DELETE"].includes(method);
    for (const role of ["anonymous", "member"] as const) {
      const expected = MATRIX[key].expect[role];
      if (expected !== 401 && expected !== 403) continue;
      for (const body of withBody ? ["{", "x".repeat(9_000_000)] : [undefined]) {
        const headers = new Headers({ "content-type": "application/json" });
        if (cookies[role]) headers.set("cookie", cookies[role]);
        const res = await handler(new Request(new URL(path + junkQuery, "http://localhost:3000"), { method, headers, body }), {
          params: Promise.resolve({ id: fixture.find, nextauth: [] }),
        });
        expect(res.status, `${key} as ${role}${body ? ` with ${body.length} bytes` : ""}`).toBe(expected);
      }
    }
  });
});

describe("hostile input (RELIABILITY 31)", () => {
  const jsonEndpoints: [string, string, string | undefined][] = [
    ["POST /api/estimate", "/api/estimate", undefined],
    ["POST /api/sync/push", "/api/sync/push", undefined],
    ["POST /api/club/finds/[id]/reviews", "/api/club/finds/[id]/reviews", "find"],
    ["POST /api/club/claims", "/api/club/claims", undefined],
    ["POST /api/club/prices", "/api/club/prices", undefined],
    ["POST /api/club/invitations", "/api/club/invitations", undefined],
    ["PATCH /api/club/members/[id]", "/api/club/members/[id]", "member"],
    ["PUT /api/club/claims/[id]/profile", "/api/club/claims/[id]/profile", "claim"],
    ["PUT /api/club/settings", "/api/club/settings", undefined],
    ["POST /api/club/recoveries", "/api/club/recoveries", undefined],
    ["POST /api/club/prices/[id]", "/api/club/prices/[id]", undefined],
  ];
  const handler = async (key: string) => {
    const h = discoverHandlers().find((x) => x.key === key)!;
    return ((await import(/* @vite-ignore */ h.file)) as Record<string, Handler>)[h.method];
  };
  // Bodies that are anything but a valid request: random JSON values, objects with random keys, and near-misses.
  const badBody = fc.oneof(
    fc.jsonValue(),
    fc.dictionary(fc.string({ maxLength: 12 }), fc.jsonValue({ maxDepth: 2 })),
    fc.record({ method: fc.string(), airGrams: fc.array(fc.oneof(fc.double(), fc.string())), waterGrams: fc.jsonValue() }),
    fc.record({
      protocolVersion: fc.integer(),
      clientId: fc.string(),
      mutations: fc.array(fc.record({ id: fc.integer(), name: fc.string(), args: fc.jsonValue() }), { maxLength: 3 }),
    }),
  );

  it.each(jsonEndpoints)("%s answers generated bad bodies with 4xx and field errors, and changes nothing", async (key, route, idKind) => {
    const h = await handler(key);
    const before = databaseChecksum(db);
    const id = idKind === "find" ? fixture.find : idKind === "member" ? fixture.bystander : idKind === "claim" ? fixture.claim : "x";
    await fc.assert(
      fc.asyncProperty(badBody, async (body) => {
        const method = key.split(" ")[0];
        const res = await h(
          req(route.replace("[id]", id), { method, cookie: cookies.officer, headers: { "content-type": "application/json" }, body: JSON.stringify(body) }),
          { params: Promise.resolve({ id }) },
        );
        if (key === "POST /api/estimate" && res.status === 200) return; // a random body can be a valid specimen
        expect(res.status).toBeGreaterThanOrEqual(400);
        expect(res.status).toBeLessThan(500);
        const err = (await res.json()).error;
        expect(typeof err.message).toBe("string");
      }),
      { numRuns: 1000 },
    );
    const strip = (s: string) =>
      s
        .split("\n")
        .filter((l) => !l.startsWith("sync_clients:"))
        .join("\n");
    expect(strip(databaseChecksum(db))).toBe(strip(before));
  });

  it("query strings that are not filters get 4xx, never 500", async () => {
    const ledger = await handler("GET /api/club/ledger");
    const pull = await handler("GET /api/sync/pull");
    await fc.assert(
      fc.asyncProperty(
        fc.dictionary(
          fc.constantFrom(
            "season",
            "page",
            "pageSize",
            "sort",
            "dir",
            "claimId",
            "from",
            "to",
            "kind",
            "state",
            "price",
            "cursor",
            "limit",
            "clientId",
            "protocolVersion",
            "zzz",
          ),
          fc.string({ maxLength: 20 }),
        ),
        async (q) => {
          const qs = new URLSearchParams(q).toString();
          for (const [h, p] of [
            [ledger, "/api/club/ledger"],
            [pull, "/api/sync/pull"],
          ] as const) {
            const res = await h(req(`${p}?${qs}`, { cookie: cookies.officer }), {});
            expect(res.status === 200 || (res.status >= 400 && res.status < 500), `${p}?${qs} → ${res.status}`).toBe(true);
          }
        },
      ),
      { numRuns: 1000 },
    );
  });

  // Thousands of levels fit under the byte limit; code that walks the value (the push's digest,
  // a geometry check) would run out of stack on them. Refused whole, at the door, by path.
  it.each([...jsonEndpoints, ["PUT /api/club/claims/[id]", "/api/club/claims/[id]", "claim"] as [string, string, string]])(
    "%s refuses a body nested thousands deep with 400 naming where, and changes nothing",
    async (key, route, idKind) => {
      const h = await handler(key);
      const id = idKind === "find" ? fixture.find : idKind === "member" ? fixture.bystander : idKind === "claim" ? fixture.claim : "x";
      const deep = (n: number) => "[".repeat(n) + "0" + "]".repeat(n);
      const bodies = [
        deep(2_000),
        // Good changes first, then one nested deep: none of them is applied.
        `{"protocolVersion":1,"clientId":"${uuidv7()}","mutations":[{"id":1,"name":"find.put","args":${JSON.stringify(newFind())}},{"id":2,"name":"find.delete","args":{"id":${deep(2_000)}}}]}`,
        `{"name":"Deep","kind":"placer","boundary":{"type":"Polygon","coordinates":${deep(3_000)}}}`,
      ];
      const before = databaseChecksum(db);
      for (const body of bodies) {
        const method = key.split(" ")[0];
        const res = await h(
          req(route.replace("[id]", id), {
            method,
            cookie: key.includes("/club/") ? cookies.officer : cookies.member,
            headers: { "content-type": "application/json" },
            body,
          }),
          {
            params: Promise.resolve({ id }),
          },
        );
        expect(res.status, body.slice(0, 60)).toBe(400);
        const err = (await res.json()).error;
        expect(err.message).toMatch(/nested more than 64 levels deep/);
        const where = Object.keys(err.fields)[0];
        expect(err.message).toContain(`Check ${where}:`);
      }
      expect(databaseChecksum(db)).toBe(before);
      // The path names where it went too deep: inside the second change's id, inside the boundary.
      const push = await handler("POST /api/sync/push");
      const res = await push(
        req("/api/sync/push", { method: "POST", cookie: cookies.member, headers: { "content-type": "application/json" }, body: bodies[1] }),
        {},
      );
      expect(Object.keys((await res.json()).error.fields)).toEqual([`mutations.1.args.id.${Array(60).fill(0).join(".")}`]);
    },
  );

  // Dates the ledger filters by, and an officer's price and recovery dates: an impossible day
  // rolled over into another, and the last day a date holds has no next day (a 500).
  it("dates that are not real calendar days, or outside the club's years, get 400 naming the field", async () => {
    for (const key of ["GET /api/club/ledger", "GET /api/club/ledger/csv", "GET /api/club/ledger/geojson"]) {
      const h = await handler(key);
      const path = key.split(" ")[1];
      for (const [q, field] of [
        ["to=9999-12-31", "to"],
        ["from=9999-12-31", "from"],
        ["from=2024-13-45", "from"],
        ["to=2025-02-29", "to"],
        ["from=0001-01-01", "from"],
      ]) {
        const res = await h(req(`${path}?${q}`, { cookie: cookies.officer }), {});
        expect(res.status, `${path}?${q}`).toBe(400);
        expect(Object.keys((await res.json()).error.fields), `${path}?${q}`).toContain(field);
      }
      expect((await h(req(`${path}?from=2024-02-29&to=2999-12-31`, { cookie: cookies.officer }), {})).status).toBe(200);
    }
    const prices = await handler("POST /api/club/prices");
    const before = databaseChecksum(db);
    for (const effectiveOn of ["9999-12-31", "2025-02-30"]) {
      const res = await prices(
        req("/api/club/prices", { cookie: cookies.officer, ...json("POST", { effectiveOn, pricePerTroyOunce: 2000, currency: "USD" }) }),
        {},
      );
      expect(res.status, effectiveOn).toBe(400);
      expect(Object.keys((await res.json()).error.fields)).toContain("effectiveOn");
    }
    expect(databaseChecksum(db)).toBe(before);
  });

  it("refuses an oversized body early with 413", async () => {
    const h = await handler("POST /api/estimate");
    const res = await h(req("/api/estimate", { method: "POST", headers: { "content-type": "application/json", "content-length": "5000000" }, body: "{}" }), {});
    expect(res.status).toBe(413);
  });
});

describe("uploads (RELIABILITY 28)", () => {
  const put = async (id: string, body: Buffer, type = "image/jpeg") => {
    const { PUT } = await import("@/app/api/photos/[id]/route");
    return PUT(req("/x", { method: "PUT", cookie: cookies.member, headers: { "content-type": type }, body: new Uint8Array(body) }), {
      params: Promise.resolve({ id }),
    });
  };
  it("refuses HTML named as a photo, SVG with script, a polyglot and a pixel bomb; stores nothing", async () => {
    const html = Buffer.from("<!doctype html><script>alert(1)</script>");
    const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>alert(1)</script></svg>');
    const polyglot = Buffer.concat([Buffer.from([0xff, 0xd8, 0xff]), Buffer.from("<html><script>alert(1)</script></html>")]);
    const bomb = makeJpeg({ width: 16, height: 16 });
    // Rewrite the frame header to claim 60000 × 60000 pixels.
    const sof = bomb.indexOf(Buffer.from([0xff, 0xc0]));
    bomb.writeUInt16BE(60000, sof + 5);
    bomb.writeUInt16BE(60000, sof + 7);
    for (const [bytes, status] of [
      [html, 415],
      [svg, 415],
      [polyglot, 415],
      [bomb, 413],
    ] as const) {
      const id = await photoRecord(cookies.member, bytes);
      expect((await put(id, bytes)).status).toBe(status);
      expect(db.$client.prepare("select storage_key k from photos where id = ?").get(id)).toEqual({ k: null });
    }
  });
  it("refuses bytes that do not match the record's SHA-256 (a cut upload) and an oversized file", async () => {
    const good = makeJpeg({ width: 32, height: 32 });
    const id = await photoRecord(cookies.member, good);
    expect((await put(id, good.subarray(0, good.length - 100))).status).toBe(400);
    expect((await put(id, Buffer.alloc(5 * 1024 * 1024))).status).toBe(413);
    expect((await put(id, good)).status).toBe(201);
    expect((await put(id, good)).status).toBe(200); // again: idempotent
  });
  it("serves photos without EXIF (no GPS), as image/jpeg with nosniff", async () => {
    const { GET } = await import("@/app/api/photos/[id]/route");
    const res = await GET(req("/x", { cookie: cookies.officer }), { params: Promise.resolve({ id: fixture.photoToRead }) });
    expect(res.headers.get("content-type")).toBe("image/jpeg");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    const served = Buffer.from(await res.arrayBuffer());
    expect(fixture.readBytes.includes(Buffer.from("Exif"))).toBe(true);
    expect(served.includes(Buffer.from("Exif"))).toBe(false);
    expect(served[0]).toBe(0xff);
    expect(served[1]).toBe(0xd8);
    const { readPhotoMeta } = await import("@/client/photos");
    expect((await readPhotoMeta(new Blob([new Uint8Array(served)]))).lat).toBeNull();
  });
});

describe("abuse limits (RELIABILITY 29)", () => {
  it("pushes: 429 with Retry-After for the busy account only", async () => {
    const { POST } = await import("@/app/api/sync/push/route");
    const send = (cookie: string) =>
      POST(
        req("/api/sync/push", {
          cookie,
          ...json("POST", { protocolVersion: 1, clientId: uuidv7(), mutations: [{ id: 1, name: "settings.put", args: { locationSharing: "exact" } }] }),
        }),
        {},
      );
    let limited: Response | undefined;
    for (let i = 0; i < 130 && !limited; i++) {
      const res = await send(cookies.member);
      if (res.status === 429) limited = res;
    }
    expect(limited?.status).toBe(429);
    expect(Number(limited?.headers.get("retry-after"))).toBeGreaterThan(0);
    expect((await send(cookies.other)).status).toBe(200);
  });
  // Sign-in limits: tests/integration/doors.test.ts.
});

describe("cross-site requests (RELIABILITY 27)", () => {
  const attempt = async (headers: Record<string, string>) => {
    const { POST } = await import("@/app/api/sync/push/route");
    return POST(
      req("http://localhost:3000/api/sync/push", {
        method: "POST",
        cookie: cookies.member,
        headers: { "content-type": "application/json", ...headers },
        body: JSON.stringify({ protocolVersion: 1, clientId: uuidv7(), mutations: [{ id: 1, name: "find.put", args: newFind() }] }),
      }),
      {},
    );
  };
  it("refuses a foreign Origin, a null Origin, a cross-site fetch and a text/plain form post", async () => {
    expect((await attempt({ origin: "https://evil.example" })).status).toBe(403);
    expect((await attempt({ origin: "null" })).status).toBe(403);
    expect((await attempt({ "sec-fetch-site": "cross-site" })).status).toBe(403);
    expect((await attempt({ "content-type": "text/plain" })).status).toBe(415);
    expect((await attempt({ origin: "http://localhost:3000", "sec-fetch-site": "same-origin" })).status).toBe(200);
  });
});
