import "server-only";
import { decode } from "next-auth/jwt";
import { can, type Capability, type Role } from "@/lib/roles";
import { getDb } from "../db";
import { statement } from "../db/rows";
import { AppError } from "../errors";

/** Who is acting, as the database says now (not as the session cookie remembered it). */
export type Actor = { id: string; email: string; name: string | null; role: Role };

export const SESSION_COOKIES = ["__Secure-authjs.session-token", "authjs.session-token"] as const;

export function authSecret(): string {
  const secret = process.env.AUTH_SECRET;
  if (!secret) throw new Error("AUTH_SECRET is not set");
  return secret;
}

/**
 * The member behind a session, or null when the member is gone, deactivated, or their
 * sessions were ended (session version bumped on deactivation or role change).
 */
export function loadActor(memberId: string | undefined, sessionVersion: unknown): Actor | null {
  if (!memberId) return null;
  // Read on every request: one statement prepared once per connection.
  const row = statement(getDb().$client, "select id, email, name, role, active, session_version as sv from members where id = ?").get(memberId) as
    | { id: string; email: string; name: string | null; role: Role; active: number; sv: number }
    | undefined;
  if (!row || !row.active || row.sv !== sessionVersion) return null;
  return { id: row.id, email: row.email, name: row.name, role: row.role };
}

function readCookie(header: string | null, name: string): string | undefined {
  if (!header) return undefined;
  for (const part of header.split(";")) {
    const eqAt = part.indexOf("=");
    if (eqAt > 0 && part.slice(0, eqAt).trim() === name) return decodeURIComponent(part.slice(eqAt + 1).trim());
  }
  return undefined;
}

type SessionPayload = { sub?: string; sv?: unknown; exp?: number };
const decoded = new Map<string, SessionPayload>();
const DECODED_MAX = 1000;

/**
 * Auth.js's decode derives a key and decrypts on every call (about 2 ms, a fifth of a push).
 * The token is authenticated encryption, so one string always decodes to one payload: keep
 * the last thousand, and still honour their expiry. Who the member is now (active, role,
 * session version) is read from the database on every request all the same.
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
export async function actorFromRequest(req: Request): Promise<Actor | null> {
  const header = req.headers.get("cookie");
  for (const name of SESSION_COOKIES) {
    const token = readCookie(header, name);
    if (!token) continue;
    try {
      const payload = await decodeSession(token, name);
      if (payload?.sub) return loadActor(payload.sub, payload.sv);
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
