import "server-only";
import { createHash } from "node:crypto";
import type { MutationName } from "@/lib/sync/mutations";
import type { MutationResult, PushRequest, PushResponse } from "@/lib/sync/protocol";
import type { Actor } from "../auth/actor";
import { getDb } from "../db";
import { statement, type Sqlite } from "../db/rows";
import { sequenceBlock } from "../db/sequence";
import { AppError } from "../errors";
import { logger } from "../log";
import { applyMutation, keepHistory, resendFinds, type PushTx } from "./mutators";
import { RejectError } from "./reject";

/** SQLite answers that mean "try again later", not "this change is wrong". */
const TEMPORARY = new Set(["SQLITE_BUSY", "SQLITE_LOCKED", "SQLITE_FULL", "SQLITE_IOERR", "SQLITE_PROTOCOL"]);

export function isTemporaryDbError(error: unknown): boolean {
  const code = (error as { code?: string } | undefined)?.code ?? "";
  return TEMPORARY.has(code) || [...TEMPORARY].some((c) => code.startsWith(`${c}_`));
}

/** How many recent mutation ids of a client keep their digest (more than one push holds). */
export const DIGEST_WINDOW = 2 * 1000;

/** A change's fingerprint: its name and its arguments as sent (a resend sends the same JSON). */
export function mutationDigest(name: string, args: unknown): string {
  return createHash("sha256")
    .update(name)
    .update("\0")
    .update(JSON.stringify(args) ?? "")
    .digest("base64url")
    .slice(0, 22);
}

/**
 * Ids at or below the client's last: a replay when each one's content is what was applied under
 * it (or its digest has left the window), else a second device sharing this client id. That
 * push is refused whole, naming the replays (done) and the reuses (to be sent again under a new
 * client id): answering "skipped" would drop the second device's changes unseen.
 */
function checkReplays(sqlite: Sqlite, clientId: string, seen: PushRequest["mutations"]): MutationResult[] {
  const reused: string[] = [];
  const replayed: string[] = [];
  const read = statement(sqlite, "select digest from sync_mutations where client_id = ? and mutation_id = ?").pluck();
  for (const m of seen) {
    const kept = read.get(clientId, m.id) as string | undefined;
    if (kept !== undefined && kept !== mutationDigest(m.name, m.args)) reused.push(String(m.id));
    else replayed.push(String(m.id));
  }
  if (reused.length > 0) {
    logger.warn({ code: "conflict:client_reused", clientId, reused: reused.length }, "two devices share one client id");
    throw new AppError(
      "conflict:client_reused",
      "Another device is using this device's sync id (a copied browser profile?). This device takes a new one and sends its changes again.",
      {
        reused,
        replayed,
      },
    );
  }
  return seen.map((m) => ({ id: m.id, status: "skipped" }));
}

/**
 * A push's work inside an open transaction: ids already applied are skipped (or refused as a
 * reuse, see checkReplays), a gap is refused, a change rejected for good still advances the
 * client's last mutation id, and the id is stored in the same transaction as the writes
 * (exactly once), with each change's digest.
 */
function applyPushIn(sqlite: Sqlite, actor: Actor, push: PushRequest): PushResponse {
  if (push.asMember !== undefined && push.asMember !== actor.id) {
    // Another member signed in on this device: the first member's changes never go under this identity.
    throw new AppError("conflict:member", "These changes belong to another member. Sign in as that member to send them.");
  }
  const client = statement(sqlite, "select member_id as memberId, last_mutation_id as lastMutationId from sync_clients where id = ?").get(push.clientId) as
    { memberId: string; lastMutationId: number } | undefined;
  if (client && client.memberId !== actor.id) {
    logger.warn({ code: "forbidden:client", actor: actor.id }, "push named another member's client");
    throw new AppError("forbidden:client", "This device id belongs to another member.");
  }
  if (!client) statement(sqlite, "insert into sync_clients (id, member_id, last_mutation_id) values (?, ?, 0)").run(push.clientId, actor.id);
  const seq = sequenceBlock(sqlite);
  const pushTx: PushTx = { db: sqlite, seq: seq.next, written: new Map(), resendFindsOf: new Set<string>(), claims: new Map() };
  let last = client?.lastMutationId ?? 0;
  const seen = push.mutations.filter((m) => m.id <= last);
  const results: MutationResult[] = seen.length > 0 ? checkReplays(sqlite, push.clientId, seen) : [];
  const digests: string[] = [];
  for (const m of push.mutations) {
    if (m.id <= last) continue;
    if (m.id !== last + 1) {
      if (results.every((r) => r.status === "skipped")) {
        throw new AppError("conflict:mutation_gap", `The server expected change ${last + 1} next, not ${m.id}. Resend from ${last + 1}.`, {
          expected: [String(last + 1)],
        });
      }
      break; // apply what came before the gap; the device resends the rest
    }
    try {
      applyMutation(pushTx, actor, m.name as MutationName, m.args);
      results.push({ id: m.id, status: "applied" });
    } catch (error) {
      if (!(error instanceof RejectError)) throw error;
      if (error.keep) keepHistory(sqlite, error.keep.entity, error.keep.entityId, error.keep.memberId, error.keep.version);
      results.push({ id: m.id, status: "rejected", reason: error.reason, field: error.field, message: error.message });
    }
    digests.push(mutationDigest(m.name, m.args));
    last = m.id;
  }
  for (const memberId of pushTx.resendFindsOf) resendFinds(pushTx, memberId, seq.reserve);
  if (last !== (client?.lastMutationId ?? 0)) {
    statement(sqlite, "update sync_clients set last_mutation_id = ?, updated_at = ? where id = ?").run(last, Date.now(), push.clientId);
    // The applied ids run without a gap from the last stored one: one set-based insert per push.
    statement(sqlite, "insert or replace into sync_mutations (client_id, mutation_id, digest) select ?, ? + key, value from json_each(?)").run(
      push.clientId,
      last - digests.length + 1,
      JSON.stringify(digests),
    );
    statement(sqlite, "delete from sync_mutations where client_id = ? and mutation_id <= ?").run(push.clientId, last - DIGEST_WINDOW);
  }
  seq.store();
  return { lastMutationId: last, results };
}

function unavailable(error: unknown): unknown {
  return isTemporaryDbError(error) ? new AppError("unavailable:database", "The club's server is busy. Nothing was applied; try again shortly.") : error;
}

type Job = { actor: Actor; push: PushRequest; resolve: (r: PushResponse) => void; reject: (e: unknown) => void };
const MAX_GROUP = 64;
let queue: Job[] = [];
let scheduled = false;

/**
 * Group commit: pushes that arrive together (members back at camp) share one transaction and
 * one flush to disk, each in its own savepoint, so one push's refusal leaves the others. Each
 * answer is given only after the commit that holds it; a temporary error refuses the whole
 * group, and every device resends.
 */
export function applyPushGrouped(actor: Actor, push: PushRequest): Promise<PushResponse> {
  return new Promise((resolve, reject) => {
    queue.push({ actor, push, resolve, reject });
    if (!scheduled) {
      scheduled = true;
      // After the pending I/O callbacks, so that pushes already read join this group.
      setImmediate(commitGroup);
    }
  });
}

function commitGroup() {
  const jobs = queue.slice(0, MAX_GROUP);
  queue = queue.slice(MAX_GROUP);
  scheduled = queue.length > 0;
  if (scheduled) setImmediate(commitGroup);
  const sqlite = getDb().$client;
  const outcomes: ({ ok: PushResponse } | { error: unknown })[] = [];
  try {
    sqlite
      .transaction(() => {
        for (const job of jobs) {
          try {
            outcomes.push({ ok: sqlite.transaction(() => applyPushIn(sqlite, job.actor, job.push))() });
          } catch (error) {
            if (isTemporaryDbError(error)) throw error;
            outcomes.push({ error });
          }
        }
      })
      .immediate();
  } catch (error) {
    for (const job of jobs) job.reject(unavailable(error));
    return;
  }
  jobs.forEach((job, i) => {
    const outcome = outcomes[i];
    if ("ok" in outcome) job.resolve(outcome.ok);
    else job.reject(outcome.error);
  });
}
