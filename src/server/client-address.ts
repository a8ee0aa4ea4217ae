import "server-only";
import net from "node:net";

/**
 * The caller's address as the front door (scripts/serve.mjs) settled it: the socket's peer, or
 * what the configured trusted proxies vouch for. Forwarding headers are never read here.
 * Without the front door (next dev, tests) every caller is "unknown".
 *
 * This is what the per-address limits count, so an IPv6 address is counted by its /64: one
 * home or phone connection is handed a whole /64 and may pick any address in it, which would
 * otherwise give a stranger a fresh allowance with every request.
 */
export function clientAddress(req: Request | Headers): string {
  const headers = req instanceof Headers ? req : req.headers;
  const address = headers.get("x-lodebook-client") || "unknown";
  return ipv6Network(address) ?? address;
}

/** "2001:db8:1:2::5" → "2001:db8:1:2::/64"; null for anything that is not an IPv6 address. */
function ipv6Network(address: string): string | null {
  if (!net.isIPv6(address)) return null;
  let text = address.toLowerCase();
  // An IPv4 tail ("64:ff9b::192.0.2.1") is two groups.
  const v4 = /(\d+)\.(\d+)\.(\d+)\.(\d+)$/.exec(text);
  if (v4) {
    const [a, b, c, d] = v4.slice(1).map(Number);
    text = `${text.slice(0, v4.index)}${((a << 8) | b).toString(16)}:${((c << 8) | d).toString(16)}`;
  }
  const [head, tail] = text.split("::");
  const front = head ? head.split(":") : [];
  const back = tail === undefined ? [] : tail ? tail.split(":") : [];
  const groups = tail === undefined ? front : [...front, ...Array<string>(8 - front.length - back.length).fill("0"), ...back];
  if (groups.length !== 8) return null;
  return `${groups
    .slice(0, 4)
    .map((g) => parseInt(g, 16).toString(16))
    .join(":")}::/64`;
}
