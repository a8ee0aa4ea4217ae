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

/** Decodes the Auth.js session cookie of a request (the same JWT `auth()` reads). */
export async function actorFromRequest(req: Request): Promise<Actor | null> {
  const header = req.headers.get("cookie");
  for (const name of SESSION_COOKIES) {
    const token = readCookie(header, name);
    if (!token) continue;
    try {
      const payload = await decode({ token, secret: authSecret(), salt: name });
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
