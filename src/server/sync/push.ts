import "server-only";
import { eq } from "drizzle-orm";
import type { MutationName } from "@/lib/sync/mutations";
import type { MutationResult, PushRequest, PushResponse } from "@/lib/sync/protocol";
import type { Actor } from "../auth/actor";
import { getDb } from "../db";
import { syncClients } from "../db/schema";
import { AppError } from "../errors";
import { logger } from "../log";
import { applyMutation, keepHistory } from "./mutators";
import { RejectError } from "./reject";

/** SQLite answers that mean "try again later", not "this change is wrong". */
const TEMPORARY = new Set(["SQLITE_BUSY", "SQLITE_LOCKED", "SQLITE_FULL", "SQLITE_IOERR", "SQLITE_PROTOCOL"]);

export function isTemporaryDbError(error: unknown): boolean {
  const code = (error as { code?: string } | undefined)?.code ?? "";
  return TEMPORARY.has(code) || [...TEMPORARY].some((c) => code.startsWith(`${c}_`));
}

/**
 * Applies a push in one SQLite transaction: ids already applied are skipped, a gap is
 * refused, a change rejected for good still advances the client's last mutation id, and the
 * id is stored in the same transaction as the writes (exactly once).
 */
export function applyPush(actor: Actor, push: PushRequest): PushResponse {
  if (push.asMember !== undefined && push.asMember !== actor.id) {
    // Another member signed in on this device: the first member's changes never go under this identity.
    throw new AppError("conflict:member", "These changes belong to another member. Sign in as that member to send them.");
  }
  const db = getDb();
  try {
    return db.transaction((tx) => {
      const client = tx.select().from(syncClients).where(eq(syncClients.id, push.clientId)).get();
      if (client && client.memberId !== actor.id) {
        logger.warn({ code: "forbidden:client", actor: actor.id }, "push named another member's client");
        throw new AppError("forbidden:client", "This device id belongs to another member.");
      }
      if (!client) tx.insert(syncClients).values({ id: push.clientId, memberId: actor.id, lastMutationId: 0 }).run();
      let last = client?.lastMutationId ?? 0;
      const results: MutationResult[] = [];
      for (const m of push.mutations) {
        if (m.id <= last) {
          results.push({ id: m.id, status: "skipped" });
          continue;
        }
        if (m.id !== last + 1) {
          if (results.every((r) => r.status === "skipped")) {
            throw new AppError("conflict:mutation_gap", `The server expected change ${last + 1} next, not ${m.id}. Resend from ${last + 1}.`, {
              expected: [String(last + 1)],
            });
          }
          break; // apply what came before the gap; the device resends the rest
        }
        try {
          // A savepoint per change: a rejected change leaves no partial write behind.
          tx.transaction((sp) => applyMutation(sp, actor, m.name as MutationName, m.args));
          results.push({ id: m.id, status: "applied" });
        } catch (error) {
          if (!(error instanceof RejectError)) throw error;
          if (error.keep) keepHistory(tx, error.keep.entity, error.keep.entityId, error.keep.memberId, error.keep.version);
          results.push({ id: m.id, status: "rejected", reason: error.reason, field: error.field, message: error.message });
        }
        last = m.id;
      }
      if (last !== (client?.lastMutationId ?? 0)) {
        tx.update(syncClients).set({ lastMutationId: last, updatedAt: Date.now() }).where(eq(syncClients.id, push.clientId)).run();
      }
      return { lastMutationId: last, results };
    });
  } catch (error) {
    if (isTemporaryDbError(error)) {
      throw new AppError("unavailable:database", "The club's server is busy. Nothing was applied; try again shortly.");
    }
    throw error;
  }
}
