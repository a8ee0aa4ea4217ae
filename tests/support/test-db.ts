import { sql } from "drizzle-orm";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { encode } from "next-auth/jwt";
import { closeDb, getDb, type Db } from "@/server/db";
import { hashPassword } from "@/server/auth/password";
import { openSession } from "@/server/auth/sessions";
import { seedDemoClub } from "@/server/seed/demo-club";

/** A fresh SQLite file in a temp folder, migrated, as the app's shared connection. */
export function freshDatabase(): { db: Db; file: string } {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "lodebook-test-"));
  const file = path.join(dir, "lodebook.db");
  closeDb();
  process.env.DATABASE_URL = file;
  return { db: getDb(), file };
}

let hashes: { officer: string; member: string } | undefined;
export async function seededDatabase() {
  const fresh = freshDatabase();
  hashes ??= { officer: await hashPassword("officer-demo-pass"), member: await hashPassword("member-demo-pass") };
  seedDemoClub(fresh.db, { passwordHashes: hashes, now: Date.UTC(2026, 9, 15) });
  return fresh;
}

/** Every user table's rows, in a stable order, as one string: equal strings mean equal data. */
export function databaseChecksum(db: Db): string {
  const tables = db.all<{ name: string }>(
    sql`select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%' order by name`,
  );
  return tables.map(({ name }) => `${name}:${JSON.stringify(db.$client.prepare(`select * from "${name}" order by 1`).all())}`).join("\n");
}

/** A session cookie exactly as Auth.js would set it after signing in. */
export async function sessionCookie(member: { id: string; email?: string }, sessionVersion = 0, sid = openSession(member.id)): Promise<string> {
  const name = "authjs.session-token";
  const token = await encode({ token: { sub: member.id, email: member.email, sv: sessionVersion, sid }, secret: process.env.AUTH_SECRET!, salt: name });
  return `${name}=${token}`;
}

export function memberByEmail(db: Db, email: string) {
  return db.$client.prepare("select id, email, role, session_version as sv from members where email = ?").get(email) as {
    id: string;
    email: string;
    role: string;
    sv: number;
  };
}

export const OFFICER_EMAIL = "marguerite@quillmarsh.example";
export const MEMBER_EMAIL = "ines@quillmarsh.example";
export const OTHER_MEMBER_EMAIL = "tobias@quillmarsh.example";

export function req(url: string, init: RequestInit & { cookie?: string } = {}): Request {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set("cookie", init.cookie);
  return new Request(new URL(url, "http://localhost:3000"), { ...init, headers });
}
