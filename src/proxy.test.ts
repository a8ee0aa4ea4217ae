import { NextRequest } from "next/server";
import { unstable_doesMiddlewareMatch } from "next/experimental/testing/server";
import { describe, expect, it } from "vitest";
import { config, proxy } from "./proxy";

// The proxy (proxy.ts) stands before every request Next may take as a server action, and before
// the officers' console. Next answers another site's action with a 500; here it gets a 403.
// (The front door, scripts/serve.mjs, refuses oversize and unknown-length ones before this;
// a browser test sends all of them to the real server: tests/e2e/front-door.test.ts.)
const site = "http://localhost:3000";
const post = (headers: Record<string, string>, path = "/sign-in", body = '[{},"$K1"]') =>
  proxy(new NextRequest(`${site}${path}`, { method: "POST", headers: { "next-action": "7f00", "content-type": "text/plain", ...headers }, body }));

describe("what the proxy sees (its matcher)", () => {
  const matches = (url: string, headers: Record<string, string> = {}) => unstable_doesMiddlewareMatch({ config, url, headers });
  it("every request Next may take as a server action, on any page", () => {
    expect(matches("/sign-in", { "next-action": "7f00" })).toBe(true);
    expect(matches("/finds/new", { "next-action": "7f00", "content-type": "text/plain;charset=UTF-8" })).toBe(true);
    expect(matches("/join", { "content-type": "multipart/form-data; boundary=x" })).toBe(true);
    expect(matches("/", { "content-type": "application/x-www-form-urlencoded" })).toBe(true);
    expect(matches("/club/ledger")).toBe(true);
  });
  it("not page loads, route handlers (Auth.js's forms among them) or Next's files", () => {
    expect(matches("/")).toBe(false);
    expect(matches("/finds")).toBe(false);
    expect(matches("/api/auth/callback/credentials", { "content-type": "application/x-www-form-urlencoded" })).toBe(false);
    expect(matches("/api/sync/push", { "next-action": "7f00", "content-type": "application/json" })).toBe(false);
    expect(matches("/_next/static/chunks/x.js", { "next-action": "7f00" })).toBe(false);
  });
});

describe("form posts to pages (server actions)", () => {
  it("refuses another site's origin, a null origin and a cross-site fetch with 403", async () => {
    for (const headers of <Record<string, string>[]>[
      { origin: "https://evil.example" },
      { origin: "null" },
      { "sec-fetch-site": "cross-site" },
      { origin: "http://localhost:3000.evil.example" },
    ]) {
      const res = await post(headers);
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect((await res.json()).error.code).toBe("forbidden:origin");
    }
  });

  it("lets the app's own posts through: same origin, or none (a script, not a browser)", async () => {
    for (const headers of <Record<string, string>[]>[{ origin: site, "sec-fetch-site": "same-origin" }, {}]) {
      expect((await post(headers)).headers.get("x-middleware-next")).toBe("1");
    }
  });

  it("refuses a body React could not decode with 400 and what is wrong, before Next reads it", async () => {
    const res = await post({ origin: site }, "/sign-in", "[{},");
    expect(res.status).toBe(400);
    expect((await res.json()).error).toEqual({ code: "bad_request:action_body", message: "The action's arguments could not be read: it is not JSON." });
    // Another site's call is refused for its origin first, whatever its body.
    expect((await post({ origin: "https://evil.example" }, "/sign-in", "[{},")).status).toBe(403);
  });
});

describe("the officers' console without a session", () => {
  it("redirects to sign-in with where it came from, and lets a session through", async () => {
    const anonymous = await proxy(new NextRequest(`${site}/club/ledger`));
    expect(anonymous.status).toBe(307);
    expect(anonymous.headers.get("location")).toBe(`${site}/sign-in?from=%2Fclub%2Fledger`);
    const signedIn = await proxy(new NextRequest(`${site}/club/ledger`, { headers: { cookie: "authjs.session-token=x" } }));
    expect(signedIn.headers.get("x-middleware-next")).toBe("1");
    // A member screen posting its own form is not sent to sign-in here.
    expect((await post({ origin: site }, "/finds")).headers.get("x-middleware-next")).toBe("1");
  });
});
