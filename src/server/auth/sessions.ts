import "server-only";
import crypto from "node:crypto";
import { getDb } from "../db";
import { statement } from "../db/rows";

/** However often it is renewed, a session ends this long after signing in. */
export const SESSION_LIFETIME_MS = 90 * 86_400_000;

/**
 * One row per signed-in browser (the JWT carries its id as `sid`). Signing out deletes the
 * row, so the token stops working everywhere at once, even if a copy of the cookie survives;
 * the member's other devices keep theirs.
 */
export function openSession(memberId: string, now = Date.now()): string {
  const sid = crypto.randomBytes(24).toString("base64url");
  const sqlite = getDb().$client;
  sqlite.transaction(() => {
    statement(sqlite, "delete from auth_sessions where user_id = ? and expires < ?").run(memberId, now);
    statement(sqlite, "insert into auth_sessions (session_token, user_id, expires) values (?, ?, ?)").run(sid, memberId, now + SESSION_LIFETIME_MS);
  })();
  return sid;
}

export function endSession(sid: unknown): void {
  if (typeof sid !== "string") return;
  statement(getDb().$client, "delete from auth_sessions where session_token = ?").run(sid);
}
