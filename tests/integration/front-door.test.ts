import http from "node:http";
import { describe, expect, it } from "vitest";
import {
  ACTION_BODY_LIMIT,
  CLIENT_HEADER,
  dropForeignCallbackCookie,
  dropRangeAndPreconditionsOutsideApi,
  refuseActionPost,
  refuseTarget,
  resolveClientAddress,
  settleForwardingHeaders,
  trustedProxyCount,
} from "../../scripts/lib/front-door.mjs";

describe("the caller's address: forwarding headers count only behind trusted proxies (RELIABILITY 32)", () => {
  it("with no trusted proxy (the default) the socket's address counts and X-Forwarded-For is ignored", () => {
    expect(resolveClientAddress({ socketAddress: "198.51.100.7", forwardedFor: "203.0.113.1", trustedProxies: 0 })).toBe("198.51.100.7");
    expect(resolveClientAddress({ socketAddress: "::ffff:198.51.100.7", forwardedFor: undefined, trustedProxies: 0 })).toBe("198.51.100.7");
  });

  it("behind N trusted proxies the caller is the Nth address from the right", () => {
    // client → proxy A (appends client) → proxy B (appends A) → us (socket = B)
    expect(resolveClientAddress({ socketAddress: "10.0.0.2", forwardedFor: "203.0.113.50", trustedProxies: 1 })).toBe("203.0.113.50");
    expect(resolveClientAddress({ socketAddress: "10.0.0.3", forwardedFor: "203.0.113.50, 10.0.0.2", trustedProxies: 2 })).toBe("203.0.113.50");
    // A client's own forged entries sit further left and are never reached.
    expect(resolveClientAddress({ socketAddress: "10.0.0.2", forwardedFor: "1.2.3.4, 5.6.7.8, 203.0.113.50", trustedProxies: 1 })).toBe("203.0.113.50");
    expect(resolveClientAddress({ socketAddress: "10.0.0.2", forwardedFor: ["1.2.3.4", "203.0.113.50"], trustedProxies: 1 })).toBe("203.0.113.50");
  });

  it("garbage where an address should be falls back to the socket", () => {
    expect(resolveClientAddress({ socketAddress: "10.0.0.2", forwardedFor: "not-an-ip", trustedProxies: 1 })).toBe("10.0.0.2");
    expect(resolveClientAddress({ socketAddress: undefined, forwardedFor: undefined, trustedProxies: 0 })).toBe("unknown");
  });

  it("settles the headers the app reads: the client's copies of forwarding and address headers do not survive", () => {
    const req = new http.IncomingMessage(null as never);
    Object.defineProperty(req, "socket", { value: { remoteAddress: "198.51.100.7" } });
    req.headers = {
      [CLIENT_HEADER]: "1.1.1.1",
      "x-forwarded-for": "1.1.1.1",
      "x-forwarded-host": "evil.example",
      "x-forwarded-proto": "https",
      "x-real-ip": "1.1.1.1",
      forwarded: "for=1.1.1.1",
    };
    settleForwardingHeaders(req, 0);
    expect(req.headers[CLIENT_HEADER]).toBe("198.51.100.7");
    expect(req.headers["x-forwarded-for"]).toBe("198.51.100.7");
    for (const h of ["x-forwarded-host", "x-forwarded-proto", "x-real-ip", "forwarded"]) expect(req.headers[h]).toBeUndefined();
  });

  it("reads the proxy count strictly", () => {
    expect(trustedProxyCount(undefined)).toBe(0);
    expect(trustedProxyCount("2")).toBe(2);
    for (const bad of ["-1", "1.5", "eleven", "11"]) expect(() => trustedProxyCount(bad)).toThrow(/LODEBOOK_TRUSTED_PROXIES/);
  });
});

describe("possible server actions at the front door", () => {
  const request = (method: string, url: string, headers: Record<string, string>) => {
    const req = new http.IncomingMessage(null as never);
    req.method = method;
    req.url = url;
    req.headers = headers;
    return req;
  };
  const answer = (method: string, url: string, headers: Record<string, string>) => refuseActionPost(request(method, url, headers))?.status ?? "through";

  it("refuses a body over the actions' limit (413) and one of unknown length (411), by header or by form body", () => {
    const limit = String(ACTION_BODY_LIMIT);
    const over = String(ACTION_BODY_LIMIT + 1);
    expect(answer("POST", "/sign-in", { "next-action": "7f00", "content-length": limit })).toBe("through");
    expect(answer("POST", "/sign-in", { "next-action": "7f00", "content-length": over })).toBe(413);
    expect(answer("POST", "/sign-in", { "next-action": "7f00", "transfer-encoding": "chunked" })).toBe(411);
    expect(answer("POST", "/join", { "content-type": "multipart/form-data; boundary=x", "content-length": over })).toBe(413);
    expect(answer("POST", "/join", { "content-type": "Multipart/Form-Data; boundary=x", "transfer-encoding": "chunked" })).toBe(411);
    expect(answer("POST", "/", { "content-type": "application/x-www-form-urlencoded", "content-length": over })).toBe(413);
    // A path Next routes to a page, written to look like a route handler's.
    expect(answer("POST", "/api/../sign-in", { "next-action": "7f00", "content-length": over })).toBe(413);
    expect(answer("POST", "/api/%2e%2e/sign-in", { "next-action": "7f00", "content-length": over })).toBe(413);
  });

  it("refuses a form body without its boundary (Next's form reader throws on one)", () => {
    expect(answer("POST", "/", { "content-type": "multipart/form-data", "content-length": "10" })).toBe(400);
    expect(answer("POST", "/sign-in", { "next-action": "7f00", "content-type": "multipart/form-data; charset=utf-8", "content-length": "10" })).toBe(400);
    expect(answer("POST", "/sign-in", { "next-action": "7f00", "content-type": "multipart/form-data; boundary=", "content-length": "10" })).toBe(400);
    expect(answer("POST", "/sign-in", { "next-action": "7f00", "content-type": "multipart/form-data; boundary=----x1", "content-length": "10" })).toBe(
      "through",
    );
  });

  it("refuses an empty action header (an action to Next, matching none of the proxy's rules)", () => {
    expect(answer("POST", "/sign-in", { "next-action": "", "content-length": "2" })).toBe(400);
    expect(answer("POST", "/sign-in", { "next-action": "  ", "content-type": "application/json", "content-length": "2" })).toBe(400);
  });

  it("leaves route handlers, page loads and other posts to their own rules", () => {
    expect(answer("POST", "/api/sync/push", { "content-type": "application/json", "transfer-encoding": "chunked" })).toBe("through");
    expect(answer("POST", "/api/auth/callback/credentials", { "content-type": "application/x-www-form-urlencoded", "content-length": "999999" })).toBe(
      "through",
    );
    expect(answer("GET", "/sign-in", { "next-action": "7f00", "content-length": "999999" })).toBe("through");
    expect(answer("POST", "/finds", { "content-type": "application/json", "content-length": "999999" })).toBe("through");
  });
});

// Requests Next itself answers with a 500: refused or mended at the door.
describe("what the front door keeps from Next", () => {
  const request = (method: string, url: string, headers: Record<string, string> = {}) => {
    const req = new http.IncomingMessage(null as never);
    req.method = method;
    req.url = url;
    req.headers = headers;
    return req;
  };

  it("refuses TRACE, a path that is not valid percent-encoding and an encoded slash, with their status", () => {
    expect(refuseTarget(request("TRACE", "/api/me"))?.status).toBe(405);
    expect(refuseTarget(request("TRACK", "/"))?.status).toBe(405);
    for (const path of ["/api/club/claims/%zz", "/api/auth/%zz", "/api/photos/%E0%A4%A", "/%"])
      expect(refuseTarget(request("GET", path))?.status, path).toBe(400);
    for (const path of ["/api/..%2fsign-in", "/_next/..%2Fclub", "/api/..%5csign-in"]) {
      const refusal = refuseTarget(request("POST", path));
      expect(refusal?.status, path).toBe(400);
      expect(refusal?.message).toMatch(/plain slashes/);
    }
    // Encoded slashes in the query are the query's business (a sign-in link's callbackUrl).
    expect(refuseTarget(request("GET", "/api/auth/callback/nodemailer?callbackUrl=%2Fsigned-in&token=x"))).toBeNull();
    expect(refuseTarget(request("GET", "/finds/view?x=%zz"))).toBeNull();
    expect(refuseTarget(request("GET", "/api/photos/0193a1b2-0000-7000-8000-000000000000"))).toBeNull();
  });

  it("drops a Range header and the preconditions outside the route handlers (Next's static files), keeps them for the handlers", () => {
    const conditions = { range: "bytes=999999999-", "if-range": "x", "if-match": '"x"', "if-unmodified-since": "Thu, 01 Jan 1970 00:00:00 GMT" };
    for (const path of ["/_next/static/chunks/webpack.js", "/sw.js", "/api/../sw.js"]) {
      const file = request("GET", path, { ...conditions, "if-none-match": '"y"', accept: "*/*" });
      dropRangeAndPreconditionsOutsideApi(file);
      expect(file.headers, path).toEqual({ "if-none-match": '"y"', accept: "*/*" });
    }
    const basemap = request("GET", "/api/basemap", { ...conditions });
    dropRangeAndPreconditionsOutsideApi(basemap);
    expect(basemap.headers).toEqual(conditions);
  });

  it("has no page at Next's own error page's address (served with its 500)", () => {
    for (const path of ["/_global-error", "/_global-error/", "/_global-error?x=1", "/finds/../_global-error"]) {
      const refusal = refuseTarget(request("GET", path));
      expect(refusal?.status, path).toBe(404);
      expect(refusal?.code, path).toBe("not_found:path");
    }
    expect(refuseTarget(request("GET", "/_global-errors"))).toBeNull();
  });

  it("drops an Auth.js callback cookie that is not an address on this site, and only that cookie", () => {
    const site = "http://localhost:3000";
    const cookieAfter = (value: string) => {
      const req = request("GET", "/api/auth/session", { host: "localhost:3000", cookie: `a=1; authjs.callback-url=${value}; authjs.session-token=t` });
      dropForeignCallbackCookie(req, site);
      return req.headers.cookie;
    };
    for (const bad of [
      "%zz",
      "x",
      "javascript%3Aalert(1)",
      "http%3A%2F%2Flocalhost%3A3000.evil.example%2F",
      "%2F%2Fevil.example",
      "https%3A%2F%2Fevil.example%2F",
    ])
      expect(cookieAfter(bad), bad).toBe("a=1; authjs.session-token=t");
    for (const good of ["http%3A%2F%2Flocalhost%3A3000%2Ffinds", "%2Fsigned-in", "/club"]) expect(cookieAfter(good), good).toContain("authjs.callback-url=");
    const secure = request("GET", "/", { host: "club.example", cookie: "__Secure-authjs.callback-url=x" });
    dropForeignCallbackCookie(secure, "https://club.example");
    expect(secure.headers.cookie).toBeUndefined();
  });
});
