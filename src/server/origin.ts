import "server-only";
import { AppError } from "./errors";

/**
 * Handlers that change data answer only same-origin requests: the Origin header must match
 * the host (browsers always send it on POST), and Sec-Fetch-Site must not say cross-site.
 */
export function requireSameOrigin(req: Request): void {
  const site = req.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") throw new AppError("forbidden:origin", "Cross-site requests are refused.");
  const origin = req.headers.get("origin");
  if (origin === null) return; // non-browser clients (tests, scripts) send none; cookies still decide who they are
  const host = req.headers.get("x-forwarded-host") ?? req.headers.get("host") ?? new URL(req.url).host;
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    throw new AppError("forbidden:origin", "Cross-site requests are refused.");
  }
  if (origin === "null" || originHost !== host) throw new AppError("forbidden:origin", "Cross-site requests are refused.");
}
