import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { estimateSpecimen } from "@/lib/estimate";
import type { Find } from "@/lib/entities/find";
import type { Outing } from "@/lib/entities/outing";
import type { Photo } from "@/lib/entities/photo";
import type { WeighIn } from "@/lib/entities/weigh-in";
import { MUTATION_ARGS, type MutationName } from "@/lib/sync/mutations";
import type { Actor } from "../auth/actor";
import type { Db } from "../db";
import * as t from "../db/schema";
import { nextSeq } from "../db/sequence";
import { logger } from "../log";
import { refreshFindFigures } from "../club/figures";
import { RejectError } from "./reject";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type Owned = { id: string; memberId: string; deletedAt: number | null };
type Table = typeof t.outings | typeof t.finds | typeof t.photos | typeof t.weighIns;

const ENTITY: Record<string, Table> = { outing: t.outings, find: t.finds, photo: t.photos, weighIn: t.weighIns };

/**
 * Loads a member record for a write. Another member's record is refused (and logged);
 * a record deleted earlier wins over a late edit, whose content is kept in history.
 */
function loadForWrite(tx: Tx, entity: string, id: string, actor: Actor, incoming?: unknown): Owned | undefined {
  const table = ENTITY[entity];
  const row = tx.select().from(table).where(eq(table.id, id)).get() as (Owned & Record<string, unknown>) | undefined;
  if (!row) return undefined;
  if (row.memberId !== actor.id) {
    logger.warn({ code: "forbidden:record", entity, id, actor: actor.id }, "push touched another member's record");
    throw new RejectError("not_owner", "This record belongs to another member.", "id");
  }
  if (row.deletedAt !== null) {
    // The written rule: a delete wins over a later edit; the edit is kept in history, not lost.
    const keep = incoming ? { entity, entityId: id, memberId: actor.id, version: { ...(incoming as object), lateEditAfterDelete: true } } : undefined;
    throw new RejectError("deleted", "This record was deleted on another device; your edit is kept in its history.", "id", keep);
  }
  return row;
}

export function keepHistory(tx: Tx, entity: string, entityId: string, memberId: string, version: Record<string, unknown>) {
  tx.insert(t.recordHistory).values({ entity, entityId, memberId, version }).run();
}

function requireOwnedParent(tx: Tx, table: typeof t.finds | typeof t.outings, id: string, actor: Actor, field: string, label: string) {
  const row = tx.select({ memberId: table.memberId, deletedAt: table.deletedAt }).from(table).where(eq(table.id, id)).get();
  if (!row || row.memberId !== actor.id) throw new RejectError("unknown_parent", `The ${label} this belongs to is not on the server.`, field);
  if (row.deletedAt !== null) throw new RejectError("deleted", `The ${label} this belongs to was deleted.`, field);
}

function requireClaim(tx: Tx, claimId: string | null) {
  if (claimId === null) return;
  const row = tx.select({ id: t.claims.id }).from(t.claims).where(eq(t.claims.id, claimId)).get();
  if (!row) throw new RejectError("unknown_claim", "That claim is not one of the club's.", "claimId");
}

/** Upsert by id; the version it replaces goes to history (two devices: arrival order decides). */
function upsert(tx: Tx, entity: string, existing: Owned | undefined, values: Record<string, unknown>, actor: Actor) {
  const table = ENTITY[entity];
  const now = Date.now();
  const row = { ...values, memberId: actor.id, seq: nextSeq(tx), ...(entity === "photo" ? {} : { updatedAt: now }) };
  if (existing) {
    keepHistory(tx, entity, existing.id, actor.id, existing as unknown as Record<string, unknown>);
    tx.update(table).set(row).where(eq(table.id, existing.id)).run();
  } else {
    tx.insert(table).values(row as never).run();
  }
}

function tombstone(tx: Tx, entity: string, id: string, actor: Actor) {
  const existing = loadForWrite(tx, entity, id, actor);
  if (!existing) return; // never reached the server: nothing to delete
  const table = ENTITY[entity];
  tx.update(table).set({ deletedAt: Date.now(), seq: nextSeq(tx) }).where(eq(table.id, id)).run();
}

const MUTATORS: Record<MutationName, (tx: Tx, actor: Actor, args: never) => void> = {
  "outing.put": (tx, actor, o: Outing) => {
    const existing = loadForWrite(tx, "outing", o.id, actor, o);
    requireClaim(tx, o.claimId);
    upsert(tx, "outing", existing, o, actor);
  },
  "outing.delete": (tx, actor, { id }: { id: string }) => tombstone(tx, "outing", id, actor),
  "find.put": (tx, actor, f: Find) => {
    const existing = loadForWrite(tx, "find", f.id, actor, f);
    requireClaim(tx, f.claimId);
    if (f.outingId) requireOwnedParent(tx, t.outings, f.outingId, actor, "outingId", "outing");
    upsert(tx, "find", existing, f, actor);
  },
  "find.delete": (tx, actor, { id }: { id: string }) => {
    tombstone(tx, "find", id, actor);
    // Its photos and weigh-ins go with it.
    for (const table of [t.photos, t.weighIns]) {
      const children = tx.select({ id: table.id }).from(table).where(and(eq(table.findId, id), isNull(table.deletedAt))).all();
      for (const c of children) tx.update(table).set({ deletedAt: Date.now(), seq: nextSeq(tx) }).where(eq(table.id, c.id)).run();
    }
  },
  "photo.put": (tx, actor, p: Photo) => {
    const existing = loadForWrite(tx, "photo", p.id, actor, p);
    requireOwnedParent(tx, t.finds, p.findId, actor, "findId", "find");
    if (existing && (existing as unknown as { sha256: string }).sha256 !== p.sha256) {
      throw new RejectError("photo_changed", "A photo cannot change its bytes; add a new photo instead.", "sha256");
    }
    upsert(tx, "photo", existing, p, actor);
  },
  "photo.delete": (tx, actor, { id }: { id: string }) => tombstone(tx, "photo", id, actor),
  "weighIn.put": (tx, actor, w: WeighIn) => {
    const existing = loadForWrite(tx, "weighIn", w.id, actor, w);
    requireOwnedParent(tx, t.finds, w.findId, actor, "findId", "find");
    let server;
    try {
      server = estimateSpecimen(w.input);
    } catch (error) {
      throw new RejectError("estimate_input", (error as Error).message, `input.${(error as { field?: string }).field ?? ""}`);
    }
    // The server's recomputation stands; a device that disagrees is recorded, not hidden.
    const mismatch = JSON.stringify(server) !== JSON.stringify(w.deviceEstimate);
    if (mismatch) logger.warn({ code: "estimate_mismatch", weighIn: w.id, device: w.deviceEstimate.engineVersion, server: server.engineVersion }, "device estimate differs");
    upsert(
      tx,
      "weighIn",
      existing,
      { ...w, serverEstimate: server, engineVersion: server.engineVersion, fineGoldGrams: server.fineGoldGrams, goldAlloyGrams: server.goldAlloyGrams, mismatch },
      actor,
    );
    refreshFindFigures(tx, w.findId);
  },
  "weighIn.delete": (tx, actor, { id }: { id: string }) => {
    tombstone(tx, "weighIn", id, actor);
    const row = tx.select({ findId: t.weighIns.findId }).from(t.weighIns).where(eq(t.weighIns.id, id)).get();
    if (row) refreshFindFigures(tx, row.findId);
  },
  "settings.put": (tx, actor, s: { locationSharing: "exact" | "claim" }) => {
    tx.update(t.members).set({ locationSharing: s.locationSharing }).where(eq(t.members.id, actor.id)).run();
    // Officers' copies of this member's finds change with the setting: re-send them.
    const owned = tx.select({ id: t.finds.id }).from(t.finds).where(eq(t.finds.memberId, actor.id)).all();
    for (const f of owned) tx.update(t.finds).set({ seq: nextSeq(tx) }).where(eq(t.finds.id, f.id)).run();
  },
};

/** Parses a mutation's arguments with the shared schema, then applies it. Throws RejectError. */
export function applyMutation(tx: Tx, actor: Actor, name: MutationName, rawArgs: unknown): void {
  const parsed = MUTATION_ARGS[name].safeParse(rawArgs);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new RejectError("invalid", issue.message, issue.path.join(".") || undefined);
  }
  MUTATORS[name](tx, actor, parsed.data as never);
}
