import { eq } from "drizzle-orm";
import { encode } from "next-auth/jwt";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { GET as getMembers } from "@/app/api/club/members/route";
import { GET as getMe } from "@/app/api/me/route";
import { members } from "@/server/db/schema";
import { hashPassword } from "@/server/auth/password";
import { openSession } from "@/server/auth/sessions";
import { seedDemoClub } from "@/server/seed/demo-club";
import { databaseChecksum, freshDatabase, MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, req, seededDatabase, sessionCookie } from "../support/test-db";

const noCtx = {} as never;

describe("database", () => {
  it("applies every migration to an empty file, with WAL, foreign keys and a busy timeout", () => {
    const { db } = freshDatabase();
    const tables = db.$client
      .prepare("select name from sqlite_master where type = 'table'")
      .all()
      .map((r) => (r as { name: string }).name);
    for (const t of [
      "members",
      "invitations",
      "claims",
      "outings",
      "finds",
      "photos",
      "weigh_ins",
      "reviews",
      "reference_prices",
      "sync_clients",
      "sequences",
      "audit_log",
      "record_history",
    ]) {
      expect(tables).toContain(t);
    }
    expect(db.$client.pragma("journal_mode", { simple: true })).toBe("wal");
    expect(db.$client.pragma("foreign_keys", { simple: true })).toBe(1);
    expect(db.$client.pragma("busy_timeout", { simple: true })).toBe(5000);
  });

  it("seeds the demo club once: a second seed changes nothing", async () => {
    const { db } = await seededDatabase();
    const before = databaseChecksum(db);
    expect(db.select().from(members).all()).toHaveLength(8);
    const again = seedDemoClub(db, { passwordHashes: { officer: await hashPassword("x"), member: await hashPassword("y") } });
    expect(again.seeded).toBe(false);
    expect(databaseChecksum(db)).toBe(before);
  });

  it("shows a whole query thread from the demo member's first sign-in: one query answered, the find's state answered", async () => {
    const { db } = await seededDatabase();
    const rows = db.$client
      .prepare(
        "select f.review_state state, r.action, a.note from answers a join reviews r on r.id = a.review_id join finds f on f.id = a.find_id join members m on m.id = a.member_id where m.email = 'ines@quillmarsh.example' and r.find_id = a.find_id",
      )
      .all() as { state: string; action: string; note: string }[];
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ state: "answered", action: "query" });
    expect(rows[0].note).toMatch(/weighed it again/);
  });

  it("gives the demo club 2 officers, 6 members, 4 claims with closed polygon boundaries, and weigh-ins", async () => {
    const { db } = await seededDatabase();
    const roles = db.$client.prepare("select role, count(*) as n from members group by role order by role").all();
    expect(roles).toEqual([
      { role: "member", n: 6 },
      { role: "officer", n: 2 },
    ]);
    const claims = db.$client.prepare("select boundary from claims").all() as { boundary: string }[];
    expect(claims).toHaveLength(4);
    for (const c of claims) {
      const ring = JSON.parse(c.boundary).coordinates[0];
      expect(ring.length).toBeGreaterThanOrEqual(4);
      expect(ring[0]).toEqual(ring[ring.length - 1]);
    }
    const counts = db.$client.prepare("select (select count(*) from outings) o, (select count(*) from finds) f, (select count(*) from weigh_ins) w").get() as {
      o: number;
      f: number;
      w: number;
    };
    expect(counts.o).toBeGreaterThan(40);
    expect(counts.f).toBeGreaterThan(40);
    expect(counts.w).toBeGreaterThan(5);
  });
});

describe("route handlers check the session and the role themselves", () => {
  let officerCookie: string;
  let memberCookie: string;
  beforeAll(async () => {
    const { db } = await seededDatabase();
    officerCookie = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
    memberCookie = await sessionCookie(memberByEmail(db, MEMBER_EMAIL));
  });

  it("club roll: anonymous 401, member 403, officer 200 without any password hash", async () => {
    expect((await getMembers(req("/api/club/members"), noCtx)).status).toBe(401);
    const asMember = await getMembers(req("/api/club/members", { cookie: memberCookie }), noCtx);
    expect(asMember.status).toBe(403);
    expect(await asMember.json()).toMatchObject({ error: { code: "forbidden:club" } });
    const asOfficer = await getMembers(req("/api/club/members", { cookie: officerCookie }), noCtx);
    expect(asOfficer.status).toBe(200);
    const text = await asOfficer.text();
    expect(JSON.parse(text).members).toHaveLength(8);
    expect(text).not.toMatch(/password|\$2[aby]\$/i);
  });

  it("me: answers with the member and the capabilities of the role, never the hash", async () => {
    const res = await getMe(req("/api/me", { cookie: memberCookie }), noCtx);
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(JSON.parse(text)).toMatchObject({ member: { email: MEMBER_EMAIL, role: "member" }, capabilities: { viewLedger: false, logFinds: true } });
    expect(text).not.toMatch(/password|\$2[aby]\$/i);
  });

  it("me: sends the date pattern of the browser's first language, and none for a tag it cannot serve", async () => {
    const ask = async (language: string) => {
      const res = await getMe(req("/api/me", { cookie: memberCookie, headers: { "accept-language": language } }), noCtx);
      expect(res.status).toBe(200);
      return ((await res.json()) as { datePattern: { locale: string } | null }).datePattern;
    };
    expect(await ask("de-CH,de;q=0.9,en;q=0.8")).toMatchObject({ locale: "de-CH" });
    expect(await ask("en-US")).toMatchObject({ locale: "en-US" });
    // Whatever a client puts in the header: a 200 with no pattern, never a 500.
    for (const hostile of [
      "x".repeat(10_000),
      "*",
      "",
      ";q=1",
      "../../etc/passwd",
      "zz-ZZ",
      "ar-EG",
      "en-US-u-nu-thai",
      "de-DE-u-ca-buddhist-hc-h11",
      "en-x-private",
      "\u00e9\u00e9-\u00e9\u00e9",
    ]) {
      expect(await ask(hostile)).toBeNull();
    }
  });

  it("a forged or foreign cookie is anonymous", async () => {
    const forged = memberCookie.slice(0, -6) + "AAAAAA";
    expect((await getMe(req("/api/me", { cookie: forged }), noCtx)).status).toBe(401);
  });

  it("deactivation and a role change end the old session on the next request", async () => {
    const { db } = await seededDatabase();
    const member = memberByEmail(db, MEMBER_EMAIL);
    const cookie = await sessionCookie(member, member.sv);
    expect((await getMe(req("/api/me", { cookie }), noCtx)).status).toBe(200);
    db.update(members).set({ active: false }).where(eq(members.id, member.id)).run();
    expect((await getMe(req("/api/me", { cookie }), noCtx)).status).toBe(401);
    db.update(members)
      .set({ active: true, sessionVersion: member.sv + 1 })
      .where(eq(members.id, member.id))
      .run();
    expect((await getMe(req("/api/me", { cookie }), noCtx)).status).toBe(401);
  });

  it("a session that expires after its token was first read is anonymous from then on", async () => {
    const { db } = await seededDatabase();
    const member = memberByEmail(db, MEMBER_EMAIL);
    const name = "authjs.session-token";
    const token = await encode({
      token: { sub: member.id, sv: member.sv, sid: openSession(member.id) },
      secret: process.env.AUTH_SECRET!,
      salt: name,
      maxAge: 60,
    });
    const cookie = `${name}=${token}`;
    expect((await getMe(req("/api/me", { cookie }), noCtx)).status).toBe(200);
    expect((await getMe(req("/api/me", { cookie }), noCtx)).status).toBe(200);
    const later = Date.now() + 120_000;
    vi.spyOn(Date, "now").mockReturnValue(later);
    expect((await getMe(req("/api/me", { cookie }), noCtx)).status).toBe(401);
    vi.restoreAllMocks();
  });
});
