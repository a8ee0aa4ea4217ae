import "server-only";
import crypto from "node:crypto";
import { and, desc, eq, isNull, sql } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import type { z } from "zod";
import type { invitationInputSchema, memberChangeSchema } from "@/lib/club/schemas";
import type { Actor } from "../auth/actor";
import { hashPassword } from "../auth/password";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { AppError } from "../errors";
import { logger } from "../log";
import { sendMail } from "../mail";
import { invitationMessage } from "../mail/messages";
import { siteLink } from "../site-link";
import { clubSettings } from "./settings";

const INVITATION_DAYS = 14;
const GONE_MESSAGE = "This invitation link has been used, withdrawn or has run out. Ask an officer for a new one.";
const hashToken = (token: string) => crypto.createHash("sha256").update(token).digest("hex");

/** Invitations not yet accepted, withdrawn or run out. */
export function listOpenInvitations() {
  const now = Date.now();
  return listInvitations().filter((i) => !i.acceptedAt && !i.revokedAt && i.expiresAt > now);
}

export function listInvitations() {
  return getDb()
    .select({
      id: t.invitations.id,
      email: t.invitations.email,
      role: t.invitations.role,
      createdAt: t.invitations.createdAt,
      expiresAt: t.invitations.expiresAt,
      acceptedAt: t.invitations.acceptedAt,
      revokedAt: t.invitations.revokedAt,
    })
    .from(t.invitations)
    .orderBy(desc(t.invitations.createdAt))
    .all();
}

async function mailInvitation(email: string, token: string, inviter: string) {
  await sendMail({ to: email, ...invitationMessage(siteLink(`/join#token=${token}`), inviter, INVITATION_DAYS, clubSettings().name) });
}

/** Invites someone by e-mail: the link sets their password, once, within 14 days. */
export async function invite(actor: Actor, input: z.infer<typeof invitationInputSchema>) {
  const email = input.email.trim().toLowerCase();
  const db = getDb();
  const existing = db.select({ id: t.members.id }).from(t.members).where(eq(t.members.email, email)).get();
  if (existing) throw new AppError("conflict:invitation", "That address already belongs to a member.", { email: ["already a member"] });
  // Refused before anything is written when no link could be mailed (no configured origin).
  siteLink("/join");
  const token = crypto.randomBytes(32).toString("base64url");
  const id = uuidv7();
  db.transaction((tx) => {
    // A new invitation replaces any still open for the same address.
    tx.update(t.invitations)
      .set({ revokedAt: Date.now() })
      .where(and(eq(t.invitations.email, email), isNull(t.invitations.acceptedAt), isNull(t.invitations.revokedAt)))
      .run();
    tx.insert(t.invitations)
      .values({ id, email, role: input.role, tokenHash: hashToken(token), invitedBy: actor.id, expiresAt: Date.now() + INVITATION_DAYS * 86_400_000 })
      .run();
    audit(tx, { actorId: actor.id, action: "invitation.create", entity: "invitation", entityId: id, after: { email, role: input.role } });
  });
  try {
    await mailInvitation(email, token, actor.name ?? actor.email);
  } catch (error) {
    logger.warn({ code: "mail_failed", invitation: id, reason: (error as Error).message }, "invitation not mailed");
    throw new AppError("unavailable:mail", "The invitation is saved, but the e-mail could not be sent. Use Resend once mail works again.");
  }
  return { id };
}

/** Sends a fresh link (the old one stops working). */
export async function resendInvitation(actor: Actor, id: string) {
  const row = getDb().select().from(t.invitations).where(eq(t.invitations.id, id)).get();
  if (!row || row.acceptedAt || row.revokedAt) throw new AppError("not_found:invitation", "No open invitation with that id.");
  return invite(actor, { email: row.email, role: row.role });
}

export function revokeInvitation(actor: Actor, id: string) {
  const db = getDb();
  db.transaction((tx) => {
    const row = tx.select().from(t.invitations).where(eq(t.invitations.id, id)).get();
    if (!row || row.acceptedAt || row.revokedAt) throw new AppError("not_found:invitation", "No open invitation with that id.");
    tx.update(t.invitations).set({ revokedAt: Date.now() }).where(eq(t.invitations.id, id)).run();
    audit(tx, { actorId: actor.id, action: "invitation.revoke", entity: "invitation", entityId: id, before: { email: row.email } });
  });
}

/** The invitation behind a link, if it still works. */
export function openInvitation(token: string) {
  const row = getDb()
    .select()
    .from(t.invitations)
    .where(eq(t.invitations.tokenHash, hashToken(token)))
    .get();
  if (!row || row.acceptedAt || row.revokedAt || row.expiresAt < Date.now()) return null;
  return row;
}

/** Accepting makes the member (or revives a deactivated one) with the chosen password. The link then stops working. */
export async function acceptInvitation(token: string, name: string, password: string) {
  // The cheap check first: a wrong or spent link never costs a password hash.
  if (!openInvitation(token)) throw new AppError("gone:invitation", GONE_MESSAGE);
  const passwordHash = await hashPassword(password);
  const db = getDb();
  return db.transaction((tx) => {
    const row = tx
      .select()
      .from(t.invitations)
      .where(eq(t.invitations.tokenHash, hashToken(token)))
      .get();
    if (!row || row.acceptedAt || row.revokedAt || row.expiresAt < Date.now()) throw new AppError("gone:invitation", GONE_MESSAGE);
    const existing = tx.select({ id: t.members.id }).from(t.members).where(eq(t.members.email, row.email)).get();
    const id = existing?.id ?? uuidv7();
    if (existing)
      tx.update(t.members)
        .set({ name, passwordHash, role: row.role, active: true, sessionVersion: sql`${t.members.sessionVersion} + 1` })
        .where(eq(t.members.id, id))
        .run();
    else tx.insert(t.members).values({ id, email: row.email, name, role: row.role, passwordHash, active: true }).run();
    tx.update(t.invitations).set({ acceptedAt: Date.now() }).where(eq(t.invitations.id, row.id)).run();
    audit(tx, { actorId: id, action: "invitation.accept", entity: "member", entityId: id, after: { email: row.email, role: row.role } });
    return { email: row.email };
  });
}

/** Role change or deactivation; either ends the member's sessions at their next request. */
export function changeMember(actor: Actor, memberId: string, change: z.infer<typeof memberChangeSchema>) {
  const db = getDb();
  return db.transaction((tx) => {
    const before = tx.select({ id: t.members.id, role: t.members.role, active: t.members.active }).from(t.members).where(eq(t.members.id, memberId)).get();
    if (!before) throw new AppError("not_found:member", "No such member.");
    const after = { role: change.role ?? before.role, active: change.active ?? before.active };
    if (before.role === "officer" && before.active && (after.role !== "officer" || !after.active)) {
      const officers = tx
        .select({ n: sql<number>`count(*)` })
        .from(t.members)
        .where(and(eq(t.members.role, "officer"), eq(t.members.active, true)))
        .get()!.n;
      if (officers <= 1) throw new AppError("conflict:member", "The club needs at least one active officer.");
    }
    tx.update(t.members)
      .set({ ...after, sessionVersion: sql`${t.members.sessionVersion} + 1` })
      .where(eq(t.members.id, memberId))
      .run();
    audit(tx, { actorId: actor.id, action: "member.change", entity: "member", entityId: memberId, before, after });
    return after;
  });
}
