import crypto from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as authGet } from "@/app/api/auth/[...nextauth]/route";
import { GET as getMe } from "@/app/api/me/route";
import { GET as getPhoto, PUT as putPhoto } from "@/app/api/photos/[id]/route";
import jpeg from "jpeg-js";
import { v7 as uuidv7 } from "uuid";
import { SIGN_IN_POLICY } from "@/server/auth/sign-in-guard";
import type { Db } from "@/server/db";
import { safeReturnPath } from "@/lib/web/return-path";
import { doorsSetup, TEST_ORIGIN, type TestMail } from "../support/doors";
import { CookieJar, postAuth, signedIn, signInByPassword } from "../support/auth-client";
import { NO_TOTALS } from "@/lib/club/totals";
import { makeJpeg } from "../support/jpeg";
import { newFind, push } from "../support/sync-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, OTHER_MEMBER_EMAIL, req, sessionCookie } from "../support/test-db";

// Attack review of issue 14 (RELIABILITY 32–37): each case is what a stranger or a hostile
// member would try; the expectation is the safe behaviour.
const MEMBER_PASSWORD = "member-demo-pass";
const ORIGIN = TEST_ORIGIN;
const none = { params: Promise.resolve({}) };

let db: Db;
let mail: TestMail;

const caughtMail = () => mail.caught();

doorsSetup("attack", (s) => ({ db, mail } = s));

const where = (res: Response) => {
  const loc = res.headers.get("location");
  if (!loc) return `${res.status}`;
  const u = new URL(loc, ORIGIN);
  return `${res.status} ${u.origin}${u.pathname}?${[...u.searchParams.keys()].sort().join("&")}&error=${u.searchParams.get("error") ?? ""}`;
};

describe("class 3: the sign-in e-mail path does not tell who is a member", () => {
  it("Auth.js's own e-mail endpoint answers a member and a stranger alike", async () => {
    const member = await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] });
    const stranger = await postAuth("/api/auth/signin/nodemailer", { form: [["email", "nobody-here@quillmarsh.example"]] });
    expect(where(stranger)).toBe(where(member));
  });

  it("the same through a JSON body", async () => {
    const member = await postAuth("/api/auth/signin/nodemailer", { json: { email: OTHER_MEMBER_EMAIL } });
    const stranger = await postAuth("/api/auth/signin/nodemailer", { json: { email: "nobody-else@quillmarsh.example" } });
    expect(where(stranger)).toBe(where(member));
  });

  it("asking past the mail limit stores no more sign-in tokens (no unbounded table growth)", async () => {
    const count = () => (db.$client.prepare("select count(*) as n from verification_tokens").get() as { n: number }).n;
    const before = count();
    for (let i = 0; i < 12; i++) await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] });
    expect((await caughtMail()).length).toBeLessThanOrEqual(3);
    expect(count() - before).toBeLessThanOrEqual(3);
  });
});

describe("class 3: the per-account delay cannot be stepped around", () => {
  it("wrong passwords sent all at once from an unknown browser are checked no more than the free failures allow", async () => {
    const n = 20;
    const results = await Promise.all(Array.from({ length: n }, () => signInByPassword(MEMBER_EMAIL, "wrong-guess")));
    const checked = results.filter((r) => r.status !== 429).length;
    expect(checked).toBeLessThanOrEqual(SIGN_IN_POLICY.unknownFreeFailures + 1);
  });
});

describe("class 5: sessions end on the server on every path", () => {
  it("after signing out, Auth.js's own session endpoint no longer reports the member for a copy of the cookie", async () => {
    const phone = new CookieJar();
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
    const copy = phone.header();
    const session = async (cookie: string) => (await authGet(req("/api/auth/session", { cookie }))).json();
    expect(await session(copy)).toMatchObject({ user: { email: MEMBER_EMAIL } });
    expect((await postAuth("/api/auth/signout", { form: [] }, { jar: phone })).status).toBe(302);
    expect((await getMe(req("/api/me", { cookie: copy }), none)).status).toBe(401);
    const after = await session(copy);
    expect(after?.user).toBeUndefined();
  });

  it("a malformed session cookie is treated as signed out, not a 500", async () => {
    for (const cookie of ["authjs.session-token=%E0%A4%A", "authjs.session-token=%", "__Secure-authjs.session-token=%zz"]) {
      const res = await getMe(req("/api/me", { cookie }), none);
      expect(res.status).toBe(401);
    }
  });
});

describe("class 6: uploads", () => {
  let photoDir: string;
  let member: string;
  const sha = (b: Buffer) => crypto.createHash("sha256").update(b).digest("hex");
  const ctx = (id: string) => ({ params: Promise.resolve({ id }) });
  beforeEach(async () => {
    photoDir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-attack-photos-"));
    vi.stubEnv("LODEBOOK_PHOTO_DIR", photoDir);
    member = await sessionCookie(memberByEmail(db, OTHER_MEMBER_EMAIL));
  });
  afterEach(() => fs.rmSync(photoDir, { recursive: true, force: true }));

  async function recordPhotos(all: Buffer[]) {
    const find = newFind();
    const records = all.map((bytes) => ({
      id: uuidv7(),
      findId: find.id,
      sha256: sha(bytes),
      contentType: "image/jpeg",
      bytes: bytes.length,
      width: 10,
      height: 10,
      takenAt: null,
      lat: null,
      lon: null,
    }));
    const res = await push(member, uuidv7(), [{ id: 1, name: "find.put", args: find }, ...records.map((args, i) => ({ id: i + 2, name: "photo.put", args }))]);
    expect(res.body.results.every((r) => r.status === "applied")).toBe(true);
    return records;
  }
  const upload = (id: string, bytes: Buffer) =>
    putPhoto(req("/x", { method: "PUT", cookie: member, headers: { "content-type": "image/jpeg" }, body: new Uint8Array(bytes) }), ctx(id));
  const storedBytes = () =>
    (
      db.$client
        .prepare("select coalesce(sum(stored_bytes), 0) as n from photos where member_id = ? and storage_key is not null")
        .get(memberByEmail(db, OTHER_MEMBER_EMAIL).id) as { n: number }
    ).n;

  it("uploads sent all at once cannot store past the quota together", async () => {
    const used = storedBytes();
    const photos = Array.from({ length: 8 }, (_, i) => makeJpeg({ width: 96 + i, height: 96, quality: 95 }));
    const each = Math.max(...photos.map((p) => p.length));
    // Room for two photos, not eight.
    const quota = used + each * 2 + 100;
    vi.stubEnv("LODEBOOK_PHOTO_QUOTA_MB", String(quota / 1024 / 1024));
    const records = await recordPhotos(photos);
    const answers = await Promise.all(records.map((r, i) => upload(r.id, photos[i])));
    expect(answers.filter((a) => a.status === 201).length).toBeLessThanOrEqual(2);
    expect(storedBytes()).toBeLessThanOrEqual(quota);
  });

  const APP0 = 0xe0;
  const APP14 = 0xee;
  function segment(marker: number, payload: Buffer): Buffer {
    const head = Buffer.from([0xff, marker, 0, 0]);
    head.writeUInt16BE(payload.length + 2, 2);
    return Buffer.concat([head, payload]);
  }
  const xmp =
    '<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#"><rdf:Description xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="41,48.074N" exif:GPSLongitude="117,36.7407W"/></rdf:RDF></x:xmpmeta>';
  // A JFIF header (version 1.1, no density, no thumbnail) with a position after it; an Adobe flag with one after it.
  const jfifTail = () => segment(APP0, Buffer.concat([Buffer.from("JFIF\0", "latin1"), Buffer.from([1, 1, 0, 0, 1, 0, 1, 0, 0]), Buffer.from(xmp, "latin1")]));
  const adobeTail = () => segment(APP14, Buffer.concat([Buffer.from("Adobe", "latin1"), Buffer.from([0, 100, 0, 0, 0, 0, 1]), Buffer.from(xmp, "latin1")]));

  it.each([
    ["a position tucked after the JFIF header", jfifTail],
    ["a position tucked after Adobe's colour flag", adobeTail],
  ])("served copies carry no location: %s", async (_name, extra) => {
    const base = makeJpeg({ width: 64, height: 48 });
    const bytes = Buffer.concat([base.subarray(0, 2), extra(), base.subarray(2)]);
    const [record] = await recordPhotos([bytes]);
    expect((await upload(record.id, bytes)).status).toBe(201);
    const officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
    const res = await getPhoto(req("/x", { cookie: officer }), ctx(record.id));
    expect(res.status).toBe(200);
    const served = Buffer.from(await res.arrayBuffer());
    const text = served.toString("latin1");
    for (const needle of ["xmpmeta", "GPS", "41,48", "117,36"]) expect(text.includes(needle), needle).toBe(false);
    const decoded = jpeg.decode(served);
    expect([decoded.width, decoded.height]).toEqual([64, 48]);
  });
});

describe("class 2: the address the per-address limits count", () => {
  it("addresses in one IPv6 /64 (one subscriber's network) share the per-address sign-in limit", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) {
      const address = `2001:db8:77:1::${(i + 1).toString(16)}`;
      statuses.push((await signInByPassword(`nobody-v6-${i}@quillmarsh.example`, "guess", { headers: { "x-lodebook-client": address } })).status);
    }
    expect(statuses.slice(0, 30)).not.toContain(429);
    expect(statuses[30]).toBe(429);
    // Another network is counted apart; IPv4 addresses are still counted one by one.
    expect((await signInByPassword("nobody-v6-other@quillmarsh.example", "guess", { headers: { "x-lodebook-client": "2001:db8:77:2::1" } })).status).toBe(302);
    expect((await signInByPassword("nobody-v4@quillmarsh.example", "guess", { headers: { "x-lodebook-client": "203.0.113.20" } })).status).toBe(302);
  });
});

describe("class 3/4: asking for a sign-in e-mail does not wait on the mail server", () => {
  const held: net.Socket[] = [];
  let silent: net.Server | undefined;
  afterEach(async () => {
    for (const s of held.splice(0)) s.destroy();
    await new Promise((resolve) => (silent ? silent.close(resolve) : resolve(undefined)));
    silent = undefined;
  });

  // The answer to a member must not wait for the SMTP exchange (a stranger's never does, which
  // would tell them apart by time), and a relay that accepts and stays silent must hold no
  // request: the mail is sent after the answer (mail/index.ts, sendMailLater). The 5 s bound
  // only detects a hang; it measures nothing.
  it("a member's request is answered while the mail server has not said a word, as a stranger's is", { timeout: 5_000 }, async () => {
    let connected!: () => void;
    const arrived = new Promise<void>((resolve) => (connected = resolve));
    silent = net.createServer((socket) => {
      held.push(socket);
      connected();
    });
    await new Promise<void>((resolve) => silent!.listen(0, "127.0.0.1", resolve));
    vi.stubEnv("SMTP_PORT", String((silent.address() as net.AddressInfo).port));
    const member = await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] });
    await arrived; // the mail is on its way; the answer did not wait for it
    expect(member.status).toBe(302);
  });
});

describe("class 7: mails are safe to read", () => {
  it("names and notes cannot add lines of their own to the officers' digest", async () => {
    const { buildDigest, digestText } = await import("@/server/club/digest");
    const forged = "\n\nNew finds by claim:\n  Bench: 999 finds, 5 kg recorded\r\nVisit https://evil.example";
    const d = buildDigest();
    d.newFinds.push({ claimName: `Creek${forged}`, totals: { ...NO_TOTALS, finds: 1, weightGrams: 1 } });
    d.openQueries.push({ memberName: `Pat${forged}`, kind: "nugget", foundAt: Date.UTC(2026, 5, 1), note: `Where?${forged}\u2028Also this` });
    const text = digestText(d);
    const lines = text.split(/\r\n|\r|\n|\u2028|\u2029/);
    expect(lines.filter((l) => l.startsWith("New finds by claim:"))).toHaveLength(1);
    expect(lines.filter((l) => l.startsWith("  Bench"))).toHaveLength(0);
    expect(lines.filter((l) => l.startsWith("Visit"))).toHaveLength(0);
  });
});

describe("class 1/5: return paths stay on this origin", () => {
  // The sign-in page redirects a signed-in visitor to safeReturnPath(from) as it is.
  it.each(["/.//evil.example", "/..//evil.example", "/a/..//evil.example", "/%2e//evil.example", "/x/%2E%2E//evil.example/path?q=1"])(
    "%s does not leave the site",
    (from) => {
      const path = safeReturnPath(from, ORIGIN);
      expect(path.startsWith("/") && !path.startsWith("//")).toBe(true);
      // As a browser resolves a Location header against the page it is on.
      expect(new URL(path, `${ORIGIN}/sign-in`).origin).toBe(ORIGIN);
      expect(safeReturnPath(from)).toBe(path);
    },
  );

  it("Auth.js's redirect after signing in keeps such a path on this origin too", async () => {
    const res = await postAuth("/api/auth/callback/credentials", {
      form: [
        ["email", OTHER_MEMBER_EMAIL],
        ["password", MEMBER_PASSWORD],
        ["callbackUrl", "/.//evil.example"],
      ],
    });
    expect(res.status).toBe(302);
    const location = res.headers.get("location")!;
    expect(new URL(location, ORIGIN).origin).toBe(ORIGIN);
    expect(new URL(location, ORIGIN).pathname.startsWith("//")).toBe(false);
  });
});
