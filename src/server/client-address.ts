import "server-only";

/**
 * The caller's address as the front door (scripts/serve.mjs) settled it: the socket's peer, or
 * what the configured trusted proxies vouch for. Forwarding headers are never read here.
 * Without the front door (next dev, tests) every caller is "unknown".
 */
export function clientAddress(req: Request | Headers): string {
  const headers = req instanceof Headers ? req : req.headers;
  return headers.get("x-lodebook-client") || "unknown";
}
