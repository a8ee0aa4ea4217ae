// @ts-check
import net from "node:net";

/** The header the front door sets to the caller's address; any copy a client sends is dropped. */
export const CLIENT_HEADER = "x-lodebook-client";

/** Bodies declared larger than this are refused before Next reads a byte (photos are at most 4 MB). */
export const MAX_DECLARED_BODY_BYTES = 8 * 1024 * 1024;

/**
 * A body the server answered before reading it all (refused: too large, not signed in, over a
 * limit) is read and thrown away for at most this much, then the connection is closed: the
 * client has its answer, and a stranger's endless body costs the server no more than this.
 */
export const LINGER_BYTES = 1024 * 1024;
export const LINGER_MS = 2000;

/**
 * After the answer is sent: if the request's body is still coming, drain it for at most
 * LINGER_BYTES or LINGER_MS (so the client can read the answer), then close the connection.
 * Node would otherwise read a refused body to its end, however long it is.
 * @param {import("node:http").IncomingMessage} req
 * @param {import("node:http").ServerResponse} res
 */
export function boundedLinger(req, res) {
  // Taken now: a handler that stops reading a body part-way (over its limit) cancels the
  // request's stream, and Node then lets go of `req.socket` (null) while the body still comes.
  const socket = req.socket;
  res.once("finish", () => {
    if (req.complete || !socket || socket.destroyed) return;
    // Node dumps an unread body once the answer is finished: its bytes no longer reach `req`,
    // so they are counted where they arrive, on the socket.
    let left = LINGER_BYTES;
    const stop = () => {
      clearTimeout(timer);
      socket.off("data", count);
      req.off("end", stop);
    };
    const close = () => {
      stop();
      socket.destroy();
    };
    /** @param {Buffer} chunk */
    const count = (chunk) => {
      left -= chunk.length;
      if (left < 0) close();
    };
    const timer = setTimeout(close, LINGER_MS);
    timer.unref();
    socket.on("data", count);
    req.once("end", stop);
    req.resume();
  });
}

/** @typedef {{ status: number; code: string; message: string }} Refusal What the door answers in Next's place. */

/** Each request's routed path, worked out once: several of the door's checks ask for it. */
const routedPaths = new WeakMap();

/**
 * A request's path as Next will route it: dot segments resolved ("/api/../sign-in" is the
 * sign-in page), the query left out.
 *
 * @param {import("node:http").IncomingMessage} req
 */
const routedPath = (req) => {
  let path = routedPaths.get(req);
  if (path === undefined) routedPaths.set(req, (path = new URL(req.url ?? "/", "http://front.door").pathname));
  return path;
};

/**
 * What the front door answers a request Next would answer with a 500, or null:
 * - TRACE (and TRACK): Next builds a fetch Request for the app, which refuses the method;
 * - a path that is not valid percent-encoding ("%zz"): Next's router throws decoding it;
 * - an encoded slash or backslash in the path ("/api/..%2fsign-in"): Next's router decodes it
 *   into another path than the one this door and the proxy judged (a route handler's, say,
 *   where Next runs a page's server action). No address of the app needs one;
 * - Next's own error page asked for by its address ("/_global-error"), which it serves with
 *   the 500 it is made for: there is no page there for a caller.
 *
 * @param {import("node:http").IncomingMessage} req
 * @returns {Refusal | null}
 */
export function refuseTarget(req) {
  if (req.method === "TRACE" || req.method === "TRACK") return { status: 405, code: "bad_request:method", message: `${req.method} is not answered here.` };
  const path = (req.url ?? "/").split("?")[0];
  if (/%(2f|5c)/i.test(path)) return { status: 400, code: "bad_request:path", message: "Write the path with plain slashes." };
  try {
    decodeURIComponent(path);
  } catch {
    return { status: 400, code: "bad_request:path", message: "The path is not valid percent-encoding." };
  }
  if (/^\/_global-error\/?$/.test(routedPath(req))) return { status: 404, code: "not_found:path", message: "There is no page at this address." };
  return null;
}

/**
 * A Range header is honoured by the route handlers that serve ranges (the basemap); elsewhere
 * (Next's static files, which answer a bad or unsatisfiable range with a 500) it is dropped and
 * the whole file sent, as HTTP allows (RFC 9110 §14.2). So are the preconditions If-Match and
 * If-Unmodified-Since, which Next's static files answer with a 500 where they fail (a 412 is
 * meant): outside the route handlers they are ignored, as Next's pages already ignore them, and
 * the whole file comes. Nothing outside /api/ changes with a request, so none needs them.
 *
 * @param {import("node:http").IncomingMessage} req
 */
export function dropRangeAndPreconditionsOutsideApi(req) {
  if (routedPath(req).startsWith("/api/")) return;
  for (const name of ["range", "if-range", "if-match", "if-unmodified-since"]) delete req.headers[name];
}

/**
 * Next answers a method a route handler does not have with a bare 405: no body. The door gives
 * it the API's JSON error, saying which method, as every other refusal under /api/ has.
 *
 * @param {import("node:http").IncomingMessage} req
 * @param {import("node:http").ServerResponse} res
 */
export function explainRefusedMethod(req, res) {
  if (!routedPath(req).startsWith("/api/")) return;
  const body = JSON.stringify({ error: { code: "unsupported:method", message: `This address does not answer ${req.method}.` } });
  let explain = false;
  let written = false;
  // Next sends a 405's head before its (empty) body: the JSON type is set as the head goes.
  const beforeHead = () => {
    if (res.statusCode === 405 && !res.headersSent && !res.hasHeader("content-type")) {
      explain = true;
      res.setHeader("content-type", "application/json");
    }
  };
  /** @param {string} name */
  const wrap = (name) => {
    const original = /** @type {any} */ (res)[name];
    /** @type {any} */ (res)[name] = function (/** @type {unknown[]} */ ...args) {
      if (name === "writeHead" && args[0] === 405) res.statusCode = 405;
      if (name === "writeHead" || name === "flushHeaders") beforeHead();
      if (name === "write" || name === "end") {
        beforeHead();
        const chunk = args[0];
        if ((typeof chunk === "string" || chunk instanceof Uint8Array) && chunk.length > 0) written = true;
        if (name === "end" && explain && !written && req.method !== "HEAD") {
          written = true;
          original.call(
            res,
            body,
            "utf8",
            args.find((a) => typeof a === "function"),
          );
          return res;
        }
      }
      return original.apply(res, args);
    };
  };
  for (const name of ["writeHead", "flushHeaders", "write", "end"]) wrap(name);
}

const CALLBACK_COOKIE = /^(?:__Secure-)?authjs\.callback-url$/;

/**
 * Drops an Auth.js "where to after sign-in" cookie that is not an address on this site: Auth.js
 * answers one it cannot read ("%zz", "javascript:…", another host) with a 500 on every sign-in,
 * sign-out and session check, so a cookie planted from elsewhere (a sibling subdomain, plain
 * http) would lock that browser out until cleared. Without it Auth.js goes to its default.
 *
 * @param {import("node:http").IncomingMessage} req
 * @param {string | undefined} siteOrigin LODEBOOK_ORIGIN
 */
export function dropForeignCallbackCookie(req, siteOrigin) {
  const header = req.headers.cookie;
  if (!header || !header.includes("callback-url")) return;
  const host = req.headers.host;
  const onSite = (/** @type {string} */ raw) => {
    let value;
    try {
      value = decodeURIComponent(raw);
    } catch {
      return false;
    }
    if (value.startsWith("/")) return !value.startsWith("//") && !value.startsWith("/\\");
    try {
      const url = new URL(value);
      return (url.protocol === "http:" || url.protocol === "https:") && (url.origin === siteOrigin || url.host === host);
    } catch {
      return false;
    }
  };
  const kept = header.split(";").filter((pair) => {
    const at = pair.indexOf("=");
    const name = (at < 0 ? pair : pair.slice(0, at)).trim();
    return !CALLBACK_COOKIE.test(name) || onSite(pair.slice(at + 1).trim());
  });
  if (kept.length === 0) delete req.headers.cookie;
  else req.headers.cookie = kept.join(";");
}

/**
 * Server actions' body limit: next.config.mjs sets Next's own (serverActions.bodySizeLimit) from
 * this, so the two cannot drift apart.
 */
export const ACTION_BODY_LIMIT = 64 * 1024;

/** @param {import("node:http").IncomingMessage} req */
const contentType = (req) => String(req.headers["content-type"] ?? "").toLowerCase();

/**
 * Whether a request may be a server action: a POST to a page (not a route handler under /api/)
 * that names an action in its header (the app's own calls), or posts a form body (a form with
 * no script). Next treats both as actions; anything that might be one is held to their rules.
 *
 * @param {import("node:http").IncomingMessage} req
 */
export function mayBeAction(req) {
  if (req.method !== "POST" || routedPath(req).startsWith("/api/")) return false;
  const type = contentType(req);
  return req.headers["next-action"] !== undefined || type.startsWith("multipart/form-data") || type.startsWith("application/x-www-form-urlencoded");
}

/**
 * What the front door answers a possible server action that it refuses before Next reads a
 * byte, or null to let it through. Next refuses an oversize action body itself, but with a 500
 * and only once past the limit; a body of unknown length (chunked) could run on for as long as
 * the client likes, so one is refused outright (browsers always send a form's length). An empty
 * action header is an action to Next but matches none of the proxy's rules: refused too. (The
 * proxy, src/proxy.ts, then refuses another site's calls: it has the site's origin rules.)
 *
 * @param {import("node:http").IncomingMessage} req
 * @returns {Refusal | null}
 */
export function refuseActionPost(req) {
  if (!mayBeAction(req)) return null;
  const action = req.headers["next-action"];
  if (action !== undefined && String(action).trim() === "")
    return { status: 400, code: "bad_request:action", message: "Name the action (the next-action header is empty)." };
  const type = contentType(req);
  // Next's form reader throws on a form body without its boundary (a 500).
  if (type.startsWith("multipart/form-data") && !/;\s*boundary=[^;\s]/.test(type))
    return { status: 400, code: "bad_request:form", message: "Send the form with its boundary (multipart/form-data; boundary=…)." };
  const declared = req.headers["content-length"];
  if (declared === undefined && req.headers["transfer-encoding"] !== undefined)
    return { status: 411, code: "length_required:form", message: "Send the form with its length (Content-Length)." };
  if (Number(declared ?? 0) > ACTION_BODY_LIMIT)
    return { status: 413, code: "too_large:form", message: `The form is over ${ACTION_BODY_LIMIT / 1024} kB: shorten the longest field.` };
  return null;
}

/**
 * Answers a request before reading its body (refused at the door). The answer says "close", so
 * the client opens a new connection for its next request: Node reads no more of this one once
 * it has answered. And the connection is only half-closed when the answer is out (Node would
 * close it whole, and a client still sending its body could then lose the answer to a reset):
 * the bounded linger closes it once the client has had time to read.
 *
 * @param {import("node:http").IncomingMessage} req
 * @param {import("node:http").ServerResponse} res
 * @param {Refusal} refusal
 */
export function answerBeforeReading(req, res, { status, code, message }) {
  const socket = req.socket;
  if (!req.complete) /** @type {any} */ (socket).destroySoon = () => socket.end();
  res.writeHead(status, { "content-type": "application/json", "cache-control": "no-store", connection: "close" });
  res.end(JSON.stringify({ error: { code, message } }));
}

/** @param {string | undefined} address */
function normalise(address) {
  if (!address) return undefined;
  const bare = address.trim().replace(/^\[|\]$/g, "");
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(bare);
  const ip = mapped ? mapped[1] : bare;
  return net.isIP(ip) ? ip.toLowerCase() : undefined;
}

/**
 * The caller's address. With no trusted proxies (the default) that is the socket's peer, and
 * X-Forwarded-For is ignored: anyone can write it. Behind N trusted proxies, each appends the
 * address it saw, so the caller is the Nth entry from the right of [forwarded…, socket].
 *
 * @param {{ socketAddress: string | undefined; forwardedFor: string | string[] | undefined; trustedProxies: number }} input
 * @returns {string}
 */
export function resolveClientAddress({ socketAddress, forwardedFor, trustedProxies }) {
  const socket = normalise(socketAddress) ?? "unknown";
  if (trustedProxies <= 0) return socket;
  const header = Array.isArray(forwardedFor) ? forwardedFor.join(",") : (forwardedFor ?? "");
  const chain = [...header.split(","), socket].map((a) => a.trim()).filter(Boolean);
  const at = Math.max(0, chain.length - 1 - trustedProxies);
  return normalise(chain[at]) ?? socket;
}

/**
 * Makes a request's forwarding headers say only what the configured proxies vouch for, and
 * records the caller's address where the app reads it.
 *
 * @param {import("node:http").IncomingMessage} req
 * @param {number} trustedProxies
 */
export function settleForwardingHeaders(req, trustedProxies) {
  const address = resolveClientAddress({ socketAddress: req.socket.remoteAddress, forwardedFor: req.headers["x-forwarded-for"], trustedProxies });
  req.headers[CLIENT_HEADER] = address;
  // Next fills these from the socket only when absent, so a client's own copies would stand.
  req.headers["x-forwarded-for"] = address;
  if (trustedProxies <= 0) {
    delete req.headers["x-forwarded-host"];
    delete req.headers["x-forwarded-proto"];
    delete req.headers["x-forwarded-port"];
    delete req.headers["x-real-ip"];
    delete req.headers.forwarded;
  }
  return address;
}

/** @param {string | undefined} raw */
export function trustedProxyCount(raw) {
  if (raw === undefined || raw === "") return 0;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 0 || n > 10) throw new Error(`LODEBOOK_TRUSTED_PROXIES must be a whole number from 0 to 10, not ${JSON.stringify(raw)}`);
  return n;
}
