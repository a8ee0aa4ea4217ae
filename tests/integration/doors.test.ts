import crypto from "node:crypto";
import { describe, expect, it, vi } from "vitest";
import { POST as postInvitation } from "@/app/api/club/invitations/route";
import { GET as getMe } from "@/app/api/me/route";
import { SIGN_IN_POLICY, resetSignInGuard } from "@/server/auth/sign-in-guard";
import type { Db } from "@/server/db";
import { doorsSetup, TEST_ORIGIN, type TestMail } from "../support/doors";
import { CookieJar, postAuth, signedIn, signInByPassword } from "../support/auth-client";
import { MEMBER_EMAIL, memberByEmail, OFFICER_EMAIL, OTHER_MEMBER_EMAIL, req, sessionCookie } from "../support/test-db";

// The seeded members' passwords (tests/support/test-db.ts).
const MEMBER_PASSWORD = "member-demo-pass";
const ORIGIN = TEST_ORIGIN;
const none = { params: Promise.resolve({}) };

let db: Db;
let mail: TestMail;

const caughtMail = () => mail.caught();
const links = (text: string) => text.match(/https?:\/\/[^\s"<>]+/g) ?? [];

doorsSetup("doors", (s) => ({ db, mail } = s));

// A stranger's request names a host of their choosing in every header a server might read.
const HOSTILE_HEADERS = {
  host: "evil.example",
  "x-forwarded-host": "evil.example",
  "x-forwarded-proto": "https",
  forwarded: "host=evil.example;proto=https",
  "x-original-host": "evil.example",
};

describe("every link the server mails comes from the configured origin (RELIABILITY 32)", () => {
  it("a sign-in link asked for with a hostile Host and forwarding headers points at the club's origin", async () => {
    const res = await postAuth(
      "http://evil.example/api/auth/signin/nodemailer",
      {
        form: [
          ["email", MEMBER_EMAIL],
          ["callbackUrl", "https://evil.example/steal"],
        ],
      },
      { headers: HOSTILE_HEADERS },
    );
    expect(res.status).toBe(302);
    const mails = await caughtMail();
    expect(mails).toHaveLength(1);
    const found = links(mails[0].text);
    expect(found.length).toBeGreaterThan(0);
    for (const link of found) {
      const url = new URL(link);
      expect(url.origin).toBe(ORIGIN);
      expect(url.pathname).toBe("/api/auth/callback/nodemailer");
      // The return path inside the link stays on this site.
      expect(url.searchParams.get("callbackUrl")?.startsWith("/")).toBe(true);
      expect(link).not.toContain("evil.example");
    }
  });

  it("the same through a JSON body and a doubled e-mail field", async () => {
    await postAuth("http://evil.example/api/auth/signin/nodemailer", { json: { email: MEMBER_EMAIL } }, { headers: HOSTILE_HEADERS });
    await postAuth(
      "http://evil.example/api/auth/signin/nodemailer",
      {
        form: [
          ["email", OTHER_MEMBER_EMAIL],
          ["email", MEMBER_EMAIL],
        ],
      },
      { headers: HOSTILE_HEADERS },
    );
    const all = (await caughtMail()).flatMap((m) => links(m.text));
    expect(all.length).toBeGreaterThan(0);
    for (const link of all) expect(new URL(link).origin).toBe(ORIGIN);
  });

  it("an invitation made through a hostile Host links to the club's origin", async () => {
    const officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
    const res = await postInvitation(
      req("http://evil.example/api/club/invitations", {
        method: "POST",
        cookie: officer,
        headers: { "content-type": "application/json", ...HOSTILE_HEADERS },
        body: JSON.stringify({ email: "newcomer@quillmarsh.example" }),
      }),
      none,
    );
    expect(res.status).toBe(201);
    const [mail] = await caughtMail();
    const link = links(mail.text)[0] ?? "";
    expect(new URL(link).origin).toBe(ORIGIN);
    expect(new URL(link).pathname).toBe("/join");
  });

  it("in production with no origin configured, nothing carrying a link is sent, and the officer is told why", async () => {
    vi.stubEnv("NODE_ENV", "production");
    vi.stubEnv("LODEBOOK_ORIGIN", "");
    const officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
    const before = db.$client.prepare("select count(*) as n from invitations").get();
    const res = await postInvitation(
      req("http://localhost:3000/api/club/invitations", {
        method: "POST",
        cookie: officer,
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ email: "late@quillmarsh.example" }),
      }),
      none,
    );
    expect(res.status).toBe(503);
    expect((await res.json()).error.message).toMatch(/LODEBOOK_ORIGIN/);
    expect(db.$client.prepare("select count(*) as n from invitations").get()).toEqual(before);
    await postAuth("http://localhost:3000/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] });
    expect(await caughtMail()).toHaveLength(0);
  });
});

describe("sign-in limits (RELIABILITY 29, 33)", () => {
  const free = SIGN_IN_POLICY.unknownFreeFailures;

  it("an unknown browser is held back after a few wrong passwords, for that account only", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < free + 1; i++) statuses.push((await signInByPassword(MEMBER_EMAIL, "wrong")).status);
    expect(statuses.slice(0, free)).toEqual(Array(free).fill(302));
    expect(statuses[free]).toBe(429);
    const held = await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD);
    expect(held.status).toBe(429);
    expect(Number(held.headers.get("retry-after"))).toBeGreaterThan(0);
    // Another account is answered as usual.
    expect(signedIn(await signInByPassword(OTHER_MEMBER_EMAIL, MEMBER_PASSWORD))).toBe(true);
  });

  it("whatever shape the body takes, the account that is checked is the account that is counted", async () => {
    for (let i = 0; i < free; i++) await signInByPassword(MEMBER_EMAIL, "wrong");
    const shapes = [
      () => postAuth("/api/auth/callback/credentials", { json: { email: MEMBER_EMAIL, password: MEMBER_PASSWORD } }),
      () =>
        postAuth("/api/auth/callback/credentials", {
          form: [
            ["email", OTHER_MEMBER_EMAIL],
            ["email", MEMBER_EMAIL],
            ["password", MEMBER_PASSWORD],
          ],
        }),
      () =>
        postAuth("/api/auth/callback/credentials", {
          form: [
            ["email", `  ${MEMBER_EMAIL.toUpperCase()} `],
            ["password", MEMBER_PASSWORD],
          ],
        }),
      () =>
        postAuth("/api/auth/callback/credentials?email=someone%40else.example", {
          form: [
            ["email", MEMBER_EMAIL],
            ["password", MEMBER_PASSWORD],
          ],
        }),
    ];
    for (const send of shapes) {
      const res = await send();
      expect(signedIn(res)).toBe(false);
      expect(res.status).toBe(429);
    }
  });

  it("a stranger failing on purpose cannot lock out the member's own browser (device cookie)", async () => {
    const phone = new CookieJar();
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
    expect(phone.has("lodebook-known-")).toBe(true);
    // The stranger, from their own browser, runs the account into its delay.
    for (let i = 0; i < free + 3; i++) await signInByPassword(MEMBER_EMAIL, "guess");
    expect((await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD)).status).toBe(429);
    // The member's phone still signs in.
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
  });

  it("a forged, altered or borrowed device cookie counts as an unknown browser", async () => {
    const other = new CookieJar();
    expect(signedIn(await signInByPassword(OTHER_MEMBER_EMAIL, MEMBER_PASSWORD, { jar: other }))).toBe(true);
    for (let i = 0; i < free; i++) await signInByPassword(MEMBER_EMAIL, "wrong");
    // Another account's cookie does not vouch for this one.
    expect((await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: other })).status).toBe(429);
    // A cookie with this account's name but a made-up value neither.
    const phone = new CookieJar();
    resetSignInGuard();
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
    const name = phone.header().match(/(lodebook-known-[\w-]+)=([^;]+)/)!;
    const [nonce, issued, sig] = name[2].split(".");
    for (let i = 0; i < free; i++) await signInByPassword(MEMBER_EMAIL, "wrong");
    for (const value of [`${nonce}.${Number(issued) + 1}.${sig}`, `${nonce}x.${issued}.${sig}`, `${nonce}.${issued}.${sig.slice(0, -2)}AA`, "a.b.c"]) {
      const jar = new CookieJar();
      jar.take(new Response(null, { headers: { "set-cookie": `${name[1]}=${value}` } }));
      expect((await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar })).status).toBe(429);
    }
  });

  it("a known browser that keeps failing stops counting as known for a while", async () => {
    const phone = new CookieJar();
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
    for (let i = 0; i < SIGN_IN_POLICY.deviceFailures; i++) expect((await signInByPassword(MEMBER_EMAIL, "wrong", { jar: phone })).status).toBe(302);
    // Now it is an unknown browser, and unknown browsers have failures of their own to count.
    for (let i = 0; i < free; i++) await signInByPassword(MEMBER_EMAIL, "wrong", { jar: phone });
    expect((await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone })).status).toBe(429);
  });

  it("the delay runs out, grows with further failures, and a success clears it", async () => {
    const start = Date.now();
    const clock = vi.spyOn(Date, "now");
    clock.mockReturnValue(start);
    for (let i = 0; i < free; i++) await signInByPassword(MEMBER_EMAIL, "wrong");
    clock.mockReturnValue(start + 1_500); // past the first delay (1 s)
    expect((await signInByPassword(MEMBER_EMAIL, "wrong")).status).toBe(302);
    clock.mockReturnValue(start + 3_000); // the next delay is 2 s after that failure
    expect((await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD)).status).toBe(429);
    clock.mockReturnValue(start + 4_000);
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD))).toBe(true);
    // Cleared: the free failures are free again.
    expect((await signInByPassword(MEMBER_EMAIL, "wrong")).status).toBe(302);
  });

  it("one address trying many accounts is limited, other addresses are not", async () => {
    const from = (address: string) => ({ headers: { "x-lodebook-client": address } });
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) statuses.push((await signInByPassword(`nobody${i}@quillmarsh.example`, "guess", from("203.0.113.9"))).status);
    expect(statuses.slice(0, 30)).not.toContain(429);
    expect(statuses[30]).toBe(429);
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, from("198.51.100.4")))).toBe(true);
  });

  it("sign-in e-mails are limited per account and address, silently (the answer never tells who is a member)", async () => {
    const answers: string[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] });
      answers.push(`${res.status} ${new URL(res.headers.get("location")!, ORIGIN).pathname}`);
    }
    expect(await caughtMail()).toHaveLength(3);
    // Limited or not, known or not: the same answer.
    const unknown = await postAuth("/api/auth/signin/nodemailer", { form: [["email", "stranger@quillmarsh.example"]] });
    expect(new Set(answers).size).toBe(1);
    expect(unknown.status).toBe(302);
  });
});

describe("the mail limits cannot be spent against a member (RELIABILITY 33)", () => {
  it("strangers using up an account's hourly sign-in mails do not stop the member's own browser", async () => {
    const phone = new CookieJar();
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
    // From many addresses, past the account's hourly count.
    for (let i = 0; i < 8; i++)
      await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] }, { headers: { "x-lodebook-client": `203.0.113.${i}` } });
    const before = (await caughtMail()).length;
    expect(before).toBe(6);
    await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] }, { headers: { "x-lodebook-client": "203.0.113.99" } });
    expect((await caughtMail()).length).toBe(before);
    await postAuth("/api/auth/signin/nodemailer", { form: [["email", MEMBER_EMAIL]] }, { jar: phone, headers: { "x-lodebook-client": "198.51.100.4" } });
    expect((await caughtMail()).length).toBe(before + 1);
  });
});

describe("sessions (RELIABILITY 35)", () => {
  it("signing out ends that session on the server; the member's other device stays signed in", async () => {
    const phone = new CookieJar();
    const laptop = new CookieJar();
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: phone }))).toBe(true);
    expect(signedIn(await signInByPassword(MEMBER_EMAIL, MEMBER_PASSWORD, { jar: laptop }))).toBe(true);
    const me = (jar: string) => getMe(req("/api/me", { cookie: jar }), none);
    const phoneCookie = phone.header();
    expect((await me(phoneCookie)).status).toBe(200);
    const out = await postAuth("/api/auth/signout", { form: [] }, { jar: phone });
    expect(out.status).toBe(302);
    // A copy of the phone's old cookie no longer works; the laptop's does.
    expect((await me(phoneCookie)).status).toBe(401);
    expect((await me(laptop.header())).status).toBe(200);
  });

  it("after signing in, only paths on this site are followed", async () => {
    for (const callbackUrl of ["https://evil.example/", "//evil.example", "/\\evil.example", "/%09/evil.example", "/finds\n/x"]) {
      const res = await postAuth("/api/auth/callback/credentials", {
        form: [
          ["email", OTHER_MEMBER_EMAIL],
          ["password", MEMBER_PASSWORD],
          ["callbackUrl", callbackUrl],
        ],
      });
      expect(res.status).toBe(302);
      expect(new URL(res.headers.get("location")!).origin).toBe(ORIGIN);
    }
  });
});

describe("exports and mails are safe to open (RELIABILITY 37)", () => {
  it("member and claim names that look like formulas or carry bidi controls come out inert", async () => {
    const { GET: getCsv } = await import("@/app/api/club/ledger/csv/route");
    const { buildDigest, digestText } = await import("@/server/club/digest");
    const Papa = (await import("papaparse")).default;
    const m = memberByEmail(db, MEMBER_EMAIL);
    const claim = db.$client.prepare("select c.id from claims c join finds f on f.claim_id = c.id where f.member_id = ? limit 1").get(m.id) as { id: string };
    db.$client.prepare("update members set name = ? where id = ?").run('=HYPERLINK("https://evil.example","Ines")', m.id);
    db.$client.prepare("update claims set name = ? where id = ?").run("@SUM(1+1)\u202eBench", claim.id);
    const officer = await sessionCookie(memberByEmail(db, OFFICER_EMAIL));
    const res = await getCsv(req(`/api/club/ledger/csv?memberId=${m.id}&claimId=${claim.id}`, { cookie: officer }), none);
    const table = Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true }).data;
    expect(table.length).toBeGreaterThan(0);
    for (const row of table) {
      expect(row.memberName).toBe(`'=HYPERLINK("https://evil.example","Ines")`);
      expect(row.claimName).toBe("'@SUM(1+1)Bench");
      for (const cell of Object.values(row)) expect(/^[=+@\t\r]/.test(cell) || /^-(?!\d)/.test(cell)).toBe(false);
    }
    // A query on one of the member's finds, as the digest lists it.
    const find = db.$client.prepare("select id from finds where member_id = ? limit 1").get(m.id) as { id: string };
    db.$client
      .prepare(
        "insert into reviews (id, find_id, officer_id, action, note, created_at, seq) values (?, ?, ?, 'query', ?, ?, (select coalesce(max(seq), 0) + 1 from reviews))",
      )
      .run(crypto.randomUUID(), find.id, memberByEmail(db, OFFICER_EMAIL).id, "weight\u202e 0.2 g", Date.now());
    const text = digestText(buildDigest());
    expect(text).not.toMatch(/[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/);
    expect(text).toContain("weight 0.2 g");
  });
});
