import "server-only";
import { serverEnv } from "../env";

/** The key of session tokens, device cookies and every other server signature. */
export function authSecret(): string {
  const secret = serverEnv().AUTH_SECRET;
  if (!secret) throw new Error("AUTH_SECRET is not set");
  return secret;
}
