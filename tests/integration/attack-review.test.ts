import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as authGet } from "@/app/api/auth/[...nextauth]/route";
import { GET as getMe } from "@/app/api/me/route";
import { SIGN_IN_POLICY, resetSignInGuard } from "@/server/auth/sign-in-guard";
import type { Db } from "@/server/db";
import { resetLimits } from "@/server/limits";
import { startMailCatcher } from "../../scripts/lib/mail-catcher";
import { CookieJar, postAuth, signedIn, signInByPassword } from "../support/auth-client";
import { MEMBER_EMAIL, memberByEmail, OTHER_MEMBER_EMAIL, req, seededDatabase } from "../support/test-db";

// Attack review of issue 14 (RELIABILITY 32–37): each case is what a stranger or a hostile
// member would try; the expectation is the safe behaviour.
const MEMBER_PASSWORD = "member-demo-pass";
const ORIGIN = "https://club.example";
const none = { params: Promise.resolve({}) };

let db: Db;
let mailDir: string;
let catcher: { close: () => Promise<void> };

function caughtMail(): { to: string[]; subject: string; text: string }[] {
  return fs
    .readdirSync(mailDir)
    .sort()
    .map((f) => JSON.parse(fs.readFileSync(path.join(mailDir, f), "utf8")));
}
const clearMail = () => {
  for (const f of fs.readdirSync(mailDir)) fs.rmSync(path.join(mailDir, f));
};

beforeAll(async () => {
  ({ db } = await seededDatabase());
  mailDir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-attack-mail-"));
  const port = 20000 + Math.floor(Math.random() * 20000);
  process.env.SMTP_PORT = String(port);
  catcher = await startMailCatcher({ port, dir: mailDir });
});
afterAll(async () => {
  await catcher.close();
  fs.rmSync(mailDir, { recursive: true, force: true });
});
beforeEach(() => {
  vi.stubEnv("LODEBOOK_ORIGIN", ORIGIN);
  vi.stubEnv("AUTH_URL", "");
  resetLimits();
  resetSignInGuard();
  clearMail();
});
afterEach(() => {
  vi.unstubAllEnvs();
  vi.restoreAllMocks();
});

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
    expect(caughtMail().length).toBeLessThanOrEqual(3);
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
