import "server-only";
import { decode } from "next-auth/jwt";
import { can, type Capability, type Role } from "@/lib/roles";
import { getDb } from "../db";
import { statement } from "../db/rows";
import { AppError } from "../errors";
import { authSecret } from "./secret";

/** Who is acting, as the database says now (not as the session cookie remembered it). */
export type Actor = { id: string; email: string; name: string | null; role: Role };

export const SESSION_COOKIES = ["__Secure-authjs.session-token", "authjs.session-token"] as const;

/** What a session token carries: the member, their session version, and the session's row. */
export type SessionClaims = { sub?: unknown; sv?: unknown; sid?: unknown };

/**
 * The member behind a session, or null when the member is gone or deactivated, their sessions
 * were ended (session version bumped on deactivation or role change), or this session was
 * signed out (its row is gone).
 */
export function loadActor(claims: SessionClaims | null | undefined): Actor | null {
  if (!claims || typeof claims.sub !== "string" || typeof claims.sid !== "string") return null;
  // Read on every request: one statement prepared once per connection.
  const row = statement(
    getDb().$client,
    `select m.id, m.email, m.name, m.role, m.active, m.session_version as sv
     from auth_sessions s join members m on m.id = s.user_id
     where s.session_token = ? and m.id = ? and s.expires > ?`,
  ).get(claims.sid, claims.sub, Date.now()) as { id: string; email: string; name: string | null; role: Role; active: number; sv: number } | undefined;
  if (!row || !row.active || row.sv !== claims.sv) return null;
  return { id: row.id, email: row.email, name: row.name, role: row.role };
}

function readCookie(header: string | null, name: string): string | undefined {
  if (!header) return undefined;
  for (const part of header.split(";")) {
    const eqAt = part.indexOf("=");
    if (eqAt > 0 && part.slice(0, eqAt).trim() === name) {
      // A cookie a client made up may not be valid percent-encoding: that is no session, not a 500.
      try {
        return decodeURIComponent(part.slice(eqAt + 1).trim());
      } catch {
        return undefined;
      }
    }
  }
  return undefined;
}

type SessionPayload = SessionClaims & { exp?: number };
const decoded = new Map<string, SessionPayload>();
const DECODED_MAX = 1000;

/**
 * Auth.js's decode derives a key and decrypts on every call (about 2 ms, a fifth of a push).
 * The token is authenticated encryption, so one string always decodes to one payload: keep
 * the last thousand, and still honour their expiry. Who the member is now (active, role,
 * session version, session not signed out) is read from the database on every request.
 */
async function decodeSession(token: string, salt: string): Promise<SessionPayload | null> {
  const key = `${salt}:${token}`;
  const kept = decoded.get(key);
  if (kept) {
    // Decoding checked the expiry then; time has passed since.
    if (typeof kept.exp === "number" && kept.exp * 1000 <= Date.now()) {
      decoded.delete(key);
      return null;
    }
    return kept;
  }
  const payload = ((await decode({ token, secret: authSecret(), salt })) ?? {}) as SessionPayload;
  if (decoded.size >= DECODED_MAX) decoded.delete(decoded.keys().next().value!);
  decoded.set(key, payload);
  return payload;
}

/** Decodes the Auth.js session cookie of a request (the same JWT `auth()` reads). */
export function actorFromRequest(req: Request): Promise<Actor | null> {
  return actorFromHeaders(req.headers);
}

export async function actorFromHeaders(headers: Headers): Promise<Actor | null> {
  const header = headers.get("cookie");
  for (const name of SESSION_COOKIES) {
    const token = readCookie(header, name);
    if (!token) continue;
    try {
      const payload = await decodeSession(token, name);
      if (payload?.sub) return loadActor(payload);
    } catch {
      return null;
    }
  }
  return null;
}

/** 401 without a live session, 403 without the capability. */
export async function requireActor(req: Request, capability?: Capability, subject = "session"): Promise<Actor> {
  const actor = await actorFromRequest(req);
  if (!actor) throw new AppError(`unauthorized:${subject}`, "Sign in to do this.");
  if (capability && !can(actor.role, capability)) throw new AppError(`forbidden:${subject}`, "Your role does not allow this.");
  return actor;
}
