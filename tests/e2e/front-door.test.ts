import crypto from "node:crypto";
import fs from "node:fs";
import http from "node:http";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { once } from "node:events";
import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { startApp } from "../../scripts/lib/app-server";
import { startMailCatcher } from "../../scripts/lib/mail-catcher";
import { waitForMail } from "./support/pages";

// A server of its own (same build, own database and mail), so these tests can run its
// per-address limits out without touching the server the other browser tests use.
let baseUrl: string;
let mailDir: string;
let stop: () => Promise<void>;
/** What the server wrote to its error stream (quiet: errors only). */
const serverErrors: string[] = [];
const MEMBER = "ines@quillmarsh.example";

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });

beforeAll(async () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-door-"));
  const [appPort, smtpPort] = [await freePort(), await freePort()];
  mailDir = path.join(dir, "mail");
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    DATABASE_URL: path.join(dir, "door.db"),
    AUTH_SECRET: crypto.randomBytes(32).toString("base64url"),
    LODEBOOK_MAIL_DIR: mailDir,
    LODEBOOK_PHOTO_DIR: path.join(dir, "photos"),
    SMTP_PORT: String(smtpPort),
    LODEBOOK_ORIGIN: `http://localhost:${appPort}`,
    LODEBOOK_TRUSTED_PROXIES: "0",
    LODEBOOK_LOG: "error",
  };
  const saved = { ...process.env };
  Object.assign(process.env, env);
  const { getDb, closeDb } = await import("../../src/server/db");
  const { hashPassword } = await import("../../src/server/auth/password");
  const { seedDemoClub, DEMO_PASSWORDS } = await import("../../src/server/seed/demo-club");
  closeDb();
  seedDemoClub(getDb(), { passwordHashes: { officer: await hashPassword(DEMO_PASSWORDS.officer), member: await hashPassword(DEMO_PASSWORDS.member) } });
  closeDb();
  process.env = saved;
  const mail = await startMailCatcher({ port: smtpPort, dir: mailDir });
  const app = await startApp({ port: appPort, env, quiet: true });
  app.child.stderr?.on("data", (b: Buffer) => serverErrors.push(b.toString()));
  baseUrl = app.url;
  stop = async () => {
    await app.stop();
    await mail.close();
    fs.rmSync(dir, { recursive: true, force: true });
  };
});
afterAll(() => stop?.());

/**
 * A bare socket to the app, for bodies no HTTP client would send. A server that ends a hostile
 * request may reset the connection (unread bytes on its side): that is one way of closing it, so
 * the reset is kept here (the "close" that follows says it) instead of becoming an uncaught error.
 */
async function socketToApp(): Promise<{ socket: net.Socket; url: URL; resets: Error[] }> {
  const url = new URL(baseUrl);
  const socket = net.connect(Number(url.port), url.hostname);
  const resets: Error[] = [];
  socket.on("error", (e) => resets.push(e));
  await once(socket, "connect");
  return { socket, url, resets };
}

/** A raw request, so Host and every other header are exactly what a hostile client sends. */
function raw(
  method: string,
  pathname: string,
  headers: Record<string, string>,
  body = "",
): Promise<{ status: number; headers: http.IncomingHttpHeaders; text: string }> {
  const url = new URL(baseUrl);
  return new Promise((resolve, reject) => {
    const r = http.request(
      {
        host: "127.0.0.1",
        port: url.port,
        method,
        path: pathname,
        headers: { ...headers, ...(body ? { "content-length": String(Buffer.byteLength(body)) } : {}) },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text: Buffer.concat(chunks).toString() }));
      },
    );
    r.on("error", reject);
    r.end(body);
  });
}

async function csrf(host: string) {
  const res = await raw("GET", "/api/auth/csrf", { host });
  const cookie = (res.headers["set-cookie"] ?? []).map((c) => c.split(";")[0]).join("; ");
  return { cookie, token: (JSON.parse(res.text) as { csrfToken: string }).csrfToken };
}

describe("the front door (RELIABILITY 32–34)", () => {
  it("a sign-in link asked for under a stranger's Host and forwarding headers points at the configured origin", async () => {
    const hostile = { host: "evil.example", "x-forwarded-host": "evil.example", "x-forwarded-proto": "https" };
    const { cookie, token } = await csrf("evil.example");
    const res = await raw(
      "POST",
      "/api/auth/signin/nodemailer",
      { ...hostile, cookie, "content-type": "application/x-www-form-urlencoded" },
      new URLSearchParams({ email: MEMBER, csrfToken: token, callbackUrl: "https://evil.example/x" }).toString(),
    );
    expect(res.status).toBe(302);
    expect(res.headers.location ?? "").not.toContain("evil.example");
    const mail = await waitForMail(mailDir, MEMBER);
    const links = mail.text.match(/https?:\/\/\S+/g) ?? [];
    expect(links.length).toBeGreaterThan(0);
    for (const link of links) {
      expect(new URL(link).origin).toBe(baseUrl);
      expect(link).not.toContain("evil.example");
    }
  });

  it("a request for an absolute URL (a host of the client's choosing) is refused, not redirected there", async () => {
    for (const target of ["http://evil.example/club", "https://evil.example/sign-in", "evil.example:443"]) {
      const res = await raw("GET", target, { host: "localhost" });
      expect(res.status, target).toBe(400);
      expect(res.headers.location ?? "").not.toContain("evil.example");
    }
  });

  it("a declared body over 8 MB is refused at the door", async () => {
    const url = new URL(baseUrl);
    const status = await new Promise<number>((resolve, reject) => {
      const r = http.request(
        {
          host: "127.0.0.1",
          port: url.port,
          method: "POST",
          path: "/api/sync/push",
          headers: { "content-type": "application/json", "content-length": String(50 * 1024 * 1024) },
        },
        (res) => {
          res.resume();
          resolve(res.statusCode ?? 0);
        },
      );
      r.on("error", reject);
      r.write("{");
    });
    expect(status).toBe(413);
  });

  // A handler that stops reading part-way (the body ran over its limit while still coming)
  // answers at once; the door then drains the rest for a moment and closes. Node had let go of
  // the request's socket by then, and the door threw on it (twice, uncaught) and never closed.
  it.each([
    ["the estimate, anonymous", "/api/estimate", "application/json", 30_000],
    ["the password sign-in, anonymous", "/api/auth/callback/credentials", "application/x-www-form-urlencoded", 10_000],
  ])("a body refused part-way (%s) gets its 413, and the connection is closed soon after", async (_what, target, type, size) => {
    const { socket, url } = await socketToApp();
    let answer = "";
    socket.on("data", (b: Buffer) => (answer += b.toString("latin1")));
    const closed = new Promise<number>((resolve) => socket.once("close", () => resolve(Date.now())));
    const errorsBefore = serverErrors.join("").length;
    socket.write(`POST ${target} HTTP/1.1\r\nHost: ${url.host}\r\nContent-Type: ${type}\r\nTransfer-Encoding: chunked\r\n\r\n`);
    socket.write(`${size.toString(16)}\r\n${"x".repeat(size)}\r\n`);
    const started = Date.now();
    // A slow client: a byte every 200 ms, the last chunk never sent.
    const trickle = setInterval(() => socket.destroyed || socket.write("1\r\nx\r\n"), 200);
    const at = await Promise.race([closed, new Promise<number>((r) => setTimeout(() => r(0), 10_000))]);
    clearInterval(trickle);
    socket.destroy();
    expect(answer).toMatch(/^HTTP\/1\.1 413 /);
    expect(at, "the server closed the connection").toBeGreaterThan(0);
    expect(at - started).toBeLessThan(6_000);
    expect(serverErrors.join("").slice(errorsBefore)).not.toMatch(/uncaught|TypeError/i);
  });

  it("a forged X-Forwarded-For does not give a caller fresh addresses: the socket's address is limited", async () => {
    const { cookie, token } = await csrf("localhost");
    const statuses: number[] = [];
    for (let i = 0; i < 31; i++) {
      const body = new URLSearchParams({ email: `nobody${i}@quillmarsh.example`, password: "guess", csrfToken: token }).toString();
      const res = await raw(
        "POST",
        "/api/auth/callback/credentials",
        { host: "localhost", cookie, "content-type": "application/x-www-form-urlencoded", "x-forwarded-for": `203.0.113.${i}`, "x-real-ip": `203.0.113.${i}` },
        body,
      );
      statuses.push(res.status);
    }
    expect(statuses.slice(0, 30)).not.toContain(429);
    expect(statuses[30]).toBe(429);
  });
  // A stranger's endless chunked body: to the push endpoint, refused at once (no session); to a
  // page as a server action, refused at once (no length). Without a bound Node would go on
  // reading and discarding it until the request timeout.
  it.each([
    ["the push endpoint", "/api/sync/push", "Content-Type: application/json"],
    ["a page, as a server action", "/sign-in", "Next-Action: 7f00\r\nContent-Type: text/plain;charset=UTF-8"],
  ])("a body refused before it was read (%s) is drained for a moment at most, then the connection is closed", async (_what, target, headers) => {
    const { socket, url, resets } = await socketToApp();
    let answer = "";
    socket.on("data", (b: Buffer) => (answer += b.toString("latin1")));
    let open = true;
    const closed = new Promise<void>((resolve) => {
      const done = () => {
        open = false;
        resolve();
      };
      // On a reset "error" comes first, and the wait for "drain" below gives up on it.
      socket.once("error", done);
      socket.once("close", done);
    });
    socket.write(`POST ${target} HTTP/1.1\r\nHost: ${url.host}\r\n${headers}\r\nTransfer-Encoding: chunked\r\n\r\n`);
    const chunk = Buffer.alloc(64 * 1024, 0x20);
    const frame = Buffer.concat([Buffer.from(`${chunk.length.toString(16)}\r\n`), chunk, Buffer.from("\r\n")]);
    let sent = 0;
    const started = Date.now();
    while (open && Date.now() - started < 20_000) {
      if (!socket.write(frame)) await Promise.race([once(socket, "drain"), closed]);
      sent += frame.length;
    }
    socket.destroy();
    const seen = `${sent} bytes sent in ${Date.now() - started} ms; reset: ${resets.map((e) => e.message).join(", ") || "none"}`;
    expect(open, seen).toBe(false);
    expect(answer, seen).toMatch(/^HTTP\/1\.1 4\d\d /);
    // The server's 1 MB of draining, plus what the two sockets' buffers hold.
    expect(sent).toBeLessThan(64 * 1024 * 1024);
  });
});

// Server actions are public endpoints: hostile calls get a status and a message, never Next's 500.
describe("server actions called by hand", () => {
  /** An action's id in this build, by its exported name. */
  const actionId = (name: string) => {
    const manifest = JSON.parse(fs.readFileSync(path.resolve(".next/server/server-reference-manifest.json"), "utf8")) as {
      node: Record<string, { exportedName: string }>;
    };
    const id = Object.entries(manifest.node).find(([, a]) => a.exportedName === name)?.[0];
    if (!id) throw new Error(`no server action ${name} in this build`);
    return id;
  };
  const call = (name: string, headers: Record<string, string>, body: string) =>
    raw(
      "POST",
      name === "joinClub" || name === "invitationState" ? "/join" : "/sign-in",
      {
        host: new URL(baseUrl).host,
        origin: baseUrl,
        "next-action": actionId(name),
        "content-type": "text/plain;charset=UTF-8",
        ...headers,
      },
      body,
    );

  it("an argument that is not a form gets the action's own message, for every action", async () => {
    for (const name of ["sendSignInLink", "signInWithPassword", "signOutNow", "joinClub", "invitationState"]) {
      for (const body of ["[{},1]", '["abc"]', "[null,null]", "[]"]) {
        const res = await call(name, {}, body);
        expect(res.status, `${name} ${body}`).toBe(200);
        expect(res.text, `${name} ${body}`).toContain("Send the form's fields.");
      }
    }
  });

  // React's reply decoder throws on these, and Next answered each with a 500 (RELIABILITY 31):
  // text that is not JSON or not a list, references to parts that are not there or are not plain
  // (a map, a server reference, a promise, a blob), forms cut short or without their arguments,
  // and a script-less form whose bound arguments are not a list.
  it("a body React could not decode gets 400 and what is wrong, for every action; the forms' own shapes still work", async () => {
    const boundary = "lodebookform";
    const multipart = (fields: Record<string, string>) =>
      Object.entries(fields)
        .map(([k, v]) => `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`)
        .join("") + `--${boundary}--\r\n`;
    const asForm = { "content-type": `multipart/form-data; boundary=${boundary}` };
    for (const name of ["sendSignInLink", "signInWithPassword", "signOutNow", "joinClub", "invitationState"]) {
      const bad: [Record<string, string>, string][] = [
        [{}, "garbage"],
        [{}, "[{},"],
        [{}, '"x"'],
        [{}, "null"],
        [{}, '["$Q9"]'],
        [{}, '["$h1"]'],
        [{}, '[{},"$B1"]'],
        [{}, '[{"message":"$@1"},"$K1"]'],
        // Read as Next reads them: a byte-order mark kept, an upper-case type taken as text.
        [{}, '\uFEFF[{},"$K1"]'],
        [{ "content-type": `Multipart/form-data; boundary=${boundary}` }, multipart({ "0": '[{},"$K1"]' })],
        [asForm, multipart({ _1_email: "x" })],
        [asForm, multipart({ "0": "garbage" })],
        [asForm, multipart({ "0": '[{},"$Q1"]', "1": '[["a","b"]]' })],
        [asForm, `--${boundary}\r\nContent-Disposition: form-data; name="0"\r\n\r\n[{},"$K1"]\r\n--${boundary}\r\nContent-Disp`],
      ];
      for (const [headers, body] of bad) {
        const res = await call(name, headers, body);
        expect(res.status, `${name} ${body}`).toBe(400);
        expect(JSON.parse(res.text).error.code, `${name} ${body}`).toBe("bad_request:action_body");
      }
      const good = await call(name, asForm, multipart({ "0": '[{"ok":false,"message":"$$ is escaped"},"$K1"]', _1_email: "not an address" }));
      expect(good.status, name).toBe(200);
    }
    // Without script: the action named in the form's fields, its state bound to it.
    const id = actionId("sendSignInLink");
    const noScript = (bound: string) =>
      raw(
        "POST",
        "/sign-in",
        { host: new URL(baseUrl).host, origin: baseUrl, ...asForm },
        multipart({ $ACTION_REF_1: "", "$ACTION_1:0": JSON.stringify({ id, bound: "$@1" }), "$ACTION_1:1": bound, $ACTION_KEY: "k", email: "x" }),
      );
    for (const bound of ["garbage", '"x"', '["$Q2"]']) {
      const res = await noScript(bound);
      expect(res.status, bound).toBe(400);
      expect(JSON.parse(res.text).error.message, bound).toContain('"$ACTION_1:1"');
    }
    expect((await noScript("[{}]")).status).toBe(200);
  });

  it("generated bodies get an answer below 500 from every action", async () => {
    const names = ["sendSignInLink", "signInWithPassword", "signOutNow", "joinClub", "invitationState"];
    const reference = fc
      .tuple(
        fc.constantFrom("$", "$$", "$@", "$K", "$Q", "$W", "$h", "$F", "$T", "$B", "$D", "$n", "$i", "$R", "$X", "$Z", "$u"),
        fc.stringMatching(/^[0-9a-z]{0,3}$/),
      )
      .map(([a, b]) => a + b);
    const value = fc.letrec((tie) => ({
      v: fc.oneof(
        { depthSize: "small" },
        reference,
        fc.jsonValue({ maxDepth: 1 }),
        fc.array(tie("v"), { maxLength: 3 }),
        fc.dictionary(fc.string({ maxLength: 4 }), tie("v"), { maxKeys: 3 }),
      ),
    })).v;
    const body = fc.oneof(
      value.map((v) => JSON.stringify(v)),
      fc.string({ maxLength: 40 }),
    );
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...names), body, fc.boolean(), async (name, text, asForm) => {
        const boundary = "lodebookform";
        const res = asForm
          ? await call(
              name,
              { "content-type": `multipart/form-data; boundary=${boundary}` },
              `--${boundary}\r\nContent-Disposition: form-data; name="0"\r\n\r\n${text}\r\n--${boundary}--\r\n`,
            )
          : await call(name, {}, text || "[]");
        return res.status < 500;
      }),
      { numRuns: 300 },
    );
  });

  // One after another through Node's agent, which keeps connections alive and reuses them as a
  // browser does: an answer given before the body was read says "close", so the next request
  // goes on a fresh connection (Node reads no more of the old one, which would hang it).
  it("another site's call is refused with 403, a body over 64 kB with 413, one of unknown length with 411", async () => {
    const cross = await call("sendSignInLink", { origin: "http://evil.example" }, "[{},1]");
    expect(cross.status).toBe(403);
    expect(JSON.parse(cross.text).error.code).toBe("forbidden:origin");
    expect((await call("sendSignInLink", { origin: "null" }, "[{},1]")).status).toBe(403);

    const boundary = "lodebookform";
    const form = `--${boundary}\r\nContent-Disposition: form-data; name="1_email"\r\n\r\n${"a".repeat(100_000)}@x.example\r\n--${boundary}--\r\n`;
    const big = await call("sendSignInLink", { "content-type": `multipart/form-data; boundary=${boundary}` }, form);
    expect(big.status).toBe(413);
    expect(JSON.parse(big.text).error.message).toMatch(/over 64 kB/);
    // The same without script: a form post naming the action in its fields.
    const plain = await raw(
      "POST",
      "/sign-in",
      { host: new URL(baseUrl).host, "content-type": `multipart/form-data; boundary=${boundary}` },
      `--${boundary}\r\nContent-Disposition: form-data; name="$ACTION_ID_${actionId("sendSignInLink")}"\r\n\r\n\r\n` + form,
    );
    expect(plain.status).toBe(413);

    // A whole chunked body (Node's client sends none with an empty one; a socket then).
    const { socket, url } = await socketToApp();
    socket.write(
      `POST /sign-in HTTP/1.1\r\nHost: ${url.host}\r\nNext-Action: ${actionId("sendSignInLink")}\r\nContent-Type: text/plain\r\nTransfer-Encoding: chunked\r\n\r\n5\r\n[{},1\r\n1\r\n]\r\n0\r\n\r\n`,
    );
    const [head] = (await once(socket, "data")) as [Buffer];
    socket.destroy();
    expect(head.toString("latin1")).toMatch(/^HTTP\/1\.1 411 /);
    // An empty action header is still an action to Next, from another site too.
    const empty = await call("sendSignInLink", { "next-action": "", origin: "http://evil.example", "content-type": "application/json" }, "[]");
    expect(empty.status).toBe(400);
  });
});

// What Next itself answers with a 500, kept from it at the door (scripts/lib/front-door.mjs).
describe("requests Next would fail on", () => {
  const host = () => new URL(baseUrl).host;
  it("TRACE, a path that is not valid percent-encoding and an encoded slash get their own status", async () => {
    expect((await raw("TRACE", "/api/me", { host: host() })).status).toBe(405);
    for (const path of ["/api/club/claims/%zz", "/api/auth/callback/%zz", "/api/photos/%E0%A4%A"])
      expect((await raw("GET", path, { host: host() })).status, path).toBe(400);
    // A page's server action from another site, dressed as a route handler's path.
    const dressed = await raw(
      "POST",
      "/api/..%2fsign-in",
      { host: host(), origin: "http://evil.example", "next-action": "7f00", "content-type": "text/plain;charset=UTF-8" },
      "[{}]",
    );
    expect(dressed.status).toBe(400);
    // A form body without its boundary, which Next's form reader throws on.
    expect((await raw("POST", "/", { host: host(), "content-type": "multipart/form-data" }, "garbage")).status).toBe(400);
    expect(JSON.parse(dressed.text).error.message).toMatch(/plain slashes/);
  });

  it("under /api/, a method an address does not answer and an address nothing answers get the API's JSON, naming the method", async () => {
    for (const [method, path] of [
      ["PATCH", "/api/me"],
      ["DELETE", "/api/sync/push"],
      ["GET", "/api/estimate"],
      ["PUT", "/api/club/production"],
    ]) {
      const res = await raw(method, path, { host: host(), origin: baseUrl, "content-type": "application/json" }, method === "GET" ? "" : "{}");
      expect(res.status, `${method} ${path}`).toBe(405);
      expect(res.headers["content-type"], `${method} ${path}`).toMatch(/^application\/json/);
      expect(JSON.parse(res.text).error, `${method} ${path}`).toEqual({ code: "unsupported:method", message: `This address does not answer ${method}.` });
    }
    for (const method of ["GET", "POST", "DELETE"]) {
      const res = await raw(method, "/api/club/no/such/thing", { host: host(), origin: baseUrl });
      expect(res.status, method).toBe(404);
      expect(JSON.parse(res.text).error.code, method).toBe("not_found:address");
    }
    // The handlers' own answers are untouched.
    expect((await raw("GET", "/api/me", { host: host() })).status).toBe(401);
  });

  it("a static file asked for with a bad or unsatisfiable range comes whole; an odd callback cookie is set aside", async () => {
    const html = (await raw("GET", "/about", { host: host() })).text;
    const chunk = /\/_next\/static\/chunks\/[^"]+\.js/.exec(html)![0];
    for (const range of ["bytes=999999999-", "bytes=abc", "bytes=-0"]) {
      const res = await raw("GET", chunk, { host: host(), range });
      expect(res.status, range).toBe(200);
      expect(res.text.length).toBeGreaterThan(0);
    }
    // Failed preconditions, which Next's static files answered with a 500: ignored, as its pages do.
    for (const [name, value] of [
      ["if-match", '"x"'],
      ["if-unmodified-since", "Thu, 01 Jan 1970 00:00:00 GMT"],
    ])
      for (const path of [chunk, "/sw.js", "/icons/icon-192.png", "/about"]) {
        const res = await raw("GET", path, { host: host(), [name]: value });
        expect(res.status, `${name} ${path}`).toBe(200);
      }
    // Next's own error page, which it serves with its 500.
    for (const method of ["GET", "POST"]) expect((await raw(method, "/_global-error", { host: host() })).status, method).toBe(404);
    for (const value of ["%zz", "x", "javascript%3Aalert(1)", "http%3A%2F%2Fevil.example%2F"]) {
      const res = await raw("GET", "/api/auth/session", { host: host(), cookie: `authjs.callback-url=${value}` });
      expect(res.status, value).toBe(200);
    }
  });
});
