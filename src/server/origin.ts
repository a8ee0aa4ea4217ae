import "server-only";
import { serverEnv, siteOrigin } from "./env";
import { AppError } from "./errors";

/**
 * Handlers that change data answer only same-origin requests: the Origin header must be the
 * configured site origin or the host the browser addressed (browsers always send Origin on
 * POST), and Sec-Fetch-Site must not say cross-site. X-Forwarded-Host counts only behind a
 * configured trusted proxy.
 */
export function requireSameOrigin(req: Request): void {
  const site = req.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") throw new AppError("forbidden:origin", "Cross-site requests are refused.");
  const origin = req.headers.get("origin");
  if (origin === null) return; // non-browser clients (tests, scripts) send none; cookies still decide who they are
  const env = serverEnv();
  let originUrl: URL;
  try {
    originUrl = new URL(origin);
  } catch {
    throw new AppError("forbidden:origin", "Cross-site requests are refused.");
  }
  if (origin === "null") throw new AppError("forbidden:origin", "Cross-site requests are refused.");
  if (originUrl.origin === siteOrigin(env)) return;
  const forwarded = env.LODEBOOK_TRUSTED_PROXIES > 0 ? req.headers.get("x-forwarded-host") : null;
  const host = forwarded ?? req.headers.get("host") ?? new URL(req.url).host;
  if (originUrl.host !== host) throw new AppError("forbidden:origin", "Cross-site requests are refused.");
}
