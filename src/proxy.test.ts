import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import { ACTION_BODY_LIMIT, proxy } from "./proxy";

// The proxy (proxy.ts) stands before every request that can carry a server action, and before
// the officers' console. Next answers a cross-site or oversize action with a 500; here they get
// their own status, before Next reads the body. (A browser test sends the same to the real
// server: tests/e2e/front-door.test.ts.)
const site = "http://localhost:3000";
const post = (headers: Record<string, string>, path = "/sign-in") =>
  proxy(new NextRequest(`${site}${path}`, { method: "POST", headers: { "next-action": "7f00", "content-type": "text/plain", ...headers } }));

describe("form posts to pages (server actions)", () => {
  it("refuses another site's origin, a null origin and a cross-site fetch with 403", async () => {
    for (const headers of <Record<string, string>[]>[
      { origin: "https://evil.example" },
      { origin: "null" },
      { "sec-fetch-site": "cross-site" },
      { origin: "http://localhost:3000.evil.example" },
    ]) {
      const res = post({ ...headers, "content-length": "10" });
      expect(res.status, JSON.stringify(headers)).toBe(403);
      expect((await res.json()).error.code).toBe("forbidden:origin");
    }
  });

  it("refuses a body over the actions' limit by its declared length (413), and one with no length (411)", async () => {
    const over = post({ origin: site, "content-length": String(ACTION_BODY_LIMIT + 1) });
    expect(over.status).toBe(413);
    expect((await over.json()).error.message).toMatch(/over 64 kB/);
    const chunked = post({ origin: site, "transfer-encoding": "chunked" });
    expect(chunked.status).toBe(411);
    // A form post without script (no action header) is held to the same.
    expect(post({ origin: site, "next-action": "", "content-type": "multipart/form-data; boundary=x", "content-length": "70000" }).status).toBe(413);
  });

  it("lets the app's own posts through: same origin (or none, from a script), at or under the limit", () => {
    for (const headers of <Record<string, string>[]>[{ origin: site, "sec-fetch-site": "same-origin" }, {}]) {
      const res = post({ ...headers, "content-length": String(ACTION_BODY_LIMIT) });
      expect(res.headers.get("x-middleware-next")).toBe("1");
    }
  });
});

describe("the officers' console without a session", () => {
  it("redirects to sign-in with where it came from, and lets a session through", () => {
    const anonymous = proxy(new NextRequest(`${site}/club/ledger`));
    expect(anonymous.status).toBe(307);
    expect(anonymous.headers.get("location")).toBe(`${site}/sign-in?from=%2Fclub%2Fledger`);
    const signedIn = proxy(new NextRequest(`${site}/club/ledger`, { headers: { cookie: "authjs.session-token=x" } }));
    expect(signedIn.headers.get("x-middleware-next")).toBe("1");
    // A member screen posting its own form is not sent to sign-in here.
    expect(post({ origin: site, "content-length": "5" }, "/finds").headers.get("x-middleware-next")).toBe("1");
  });
});
