import "server-only";
import { asc } from "drizzle-orm";
import { getDb } from "../db";
import { members } from "../db/schema";

/** The club roll, named columns only: no password hash ever leaves this function. */
export function listMembers() {
  return getDb()
    .select({ id: members.id, email: members.email, name: members.name, role: members.role, active: members.active, createdAt: members.createdAt })
    .from(members)
    .orderBy(asc(members.name))
    .all();
}
