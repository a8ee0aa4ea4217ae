// @ts-check
// The production server: Next behind a small front door that settles who the caller is
// (the socket's address unless trusted proxies are configured) and, before Next reads a byte,
// refuses oversized bodies, server-action posts over the actions' limit or of unknown length,
// and the requests Next itself would answer with a 500 (lib/front-door.mjs says which).
// `npm start` and the demo run this, never `next start` directly.
import http from "node:http";
import { parseArgs } from "node:util";
import next from "next";
import {
  answerBeforeReading,
  boundedLinger,
  dropForeignCallbackCookie,
  explainRefusedMethod,
  dropRangeAndPreconditionsOutsideApi,
  MAX_DECLARED_BODY_BYTES,
  refuseActionPost,
  refuseTarget,
  settleForwardingHeaders,
  trustedProxyCount,
} from "./lib/front-door.mjs";

const { values } = parseArgs({ options: { port: { type: "string", short: "p" }, hostname: { type: "string", short: "H" } } });
const port = Number(values.port ?? process.env.PORT ?? 3000);
const hostname = values.hostname ?? process.env.HOSTNAME ?? "0.0.0.0";
const trustedProxies = trustedProxyCount(process.env.LODEBOOK_TRUSTED_PROXIES);

// @ts-expect-error the process is production whatever the shell said
process.env.NODE_ENV = "production";
/** @type {any} */ (globalThis).__lodebookFrontDoor = true;

const app = next({ dev: false, hostname, port });
await app.prepare();
const handle = app.getRequestHandler();

const server = http.createServer((req, res) => {
  boundedLinger(req, res);
  // Only origin-form targets ("/path"): an absolute target ("GET http://evil.example/x") would
  // have Next build its redirects on a host the client chose (RFC 9112 §3.2.2 lets proxies send
  // it; nothing in front of this server needs to).
  if (!req.url?.startsWith("/")) {
    res.writeHead(400, { "content-type": "application/json", connection: "close" });
    res.end(JSON.stringify({ error: { code: "bad_request:target", message: "Ask for a path on this server." } }));
    return;
  }
  const badTarget = refuseTarget(req);
  if (badTarget) {
    answerBeforeReading(req, res, badTarget);
    return;
  }
  settleForwardingHeaders(req, trustedProxies);
  dropRangeAndPreconditionsOutsideApi(req);
  dropForeignCallbackCookie(req, process.env.LODEBOOK_ORIGIN);
  explainRefusedMethod(req, res);
  const declared = Number(req.headers["content-length"] ?? 0);
  if (declared > MAX_DECLARED_BODY_BYTES) {
    answerBeforeReading(req, res, { status: 413, code: "too_large:request", message: `The body is over ${MAX_DECLARED_BODY_BYTES} bytes.` });
    return;
  }
  const refused = refuseActionPost(req);
  if (refused) {
    answerBeforeReading(req, res, refused);
    return;
  }
  handle(req, res);
});
// A slow client may not hold a connection open indefinitely.
server.headersTimeout = 20_000;
server.requestTimeout = 120_000;
server.listen(port, hostname, () => {
  console.log(`Lodebook listening on http://${hostname}:${port} (trusted proxies: ${trustedProxies})`);
});

const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
