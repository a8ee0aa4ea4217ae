import "server-only";
import { MISSING_ORIGIN_MESSAGE, siteOrigin } from "./env";
import { AppError } from "./errors";

/**
 * An absolute link to this site for mail and redirects, on the configured origin only: the
 * Host and X-Forwarded-* headers of a request are a stranger's to choose. Without an origin
 * (production, unset) nothing carrying a link is sent.
 */
export function siteLink(pathAndQuery: string): string {
  const origin = siteOrigin();
  if (!origin) throw new AppError("unavailable:origin", MISSING_ORIGIN_MESSAGE);
  if (!pathAndQuery.startsWith("/") || pathAndQuery.startsWith("//")) throw new Error(`siteLink wants a path, not ${JSON.stringify(pathAndQuery)}`);
  return new URL(pathAndQuery, origin).toString();
}
