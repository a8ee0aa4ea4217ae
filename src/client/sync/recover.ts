import { v7 as uuidv7 } from "uuid";
import { pickRecord, type RecordEntity } from "@/lib/entities/keys";
import type { MutationName } from "@/lib/sync/mutations";
import type { LodebookDb, OutboxEntry } from "../device-db";

// The device's ways back to step with the server. Each keeps every change still waiting:
// RELIABILITY 16 and 38 (reset, gap, reused client id) and 39 (a change the server fails on).

export async function meta<T>(db: LodebookDb, key: string, fallback: T): Promise<T> {
  return ((await db.meta.get(key))?.value as T | undefined) ?? fallback;
}

/** This device's client id for the member, made once; with it, the mutation counter. */
export async function ensureClient(db: LodebookDb): Promise<string> {
  return db.transaction("rw", db.meta, async () => {
    const existing = await meta<string | null>(db, "clientId", null);
    if (existing) return existing;
    const id = uuidv7();
    await db.meta.bulkPut([
      { key: "clientId", value: id },
      { key: "nextMutationId", value: 1 },
    ]);
    return id;
  });
}

/** Gives waiting changes their mutation ids, in the order made, stored before the first send so a resend reuses them. */
export async function assignMutationIds(db: LodebookDb): Promise<void> {
  await db.transaction("rw", db.outbox, db.meta, async () => {
    let next = await meta(db, "nextMutationId", 1);
    const fresh = await db.outbox
      .where("state")
      .equals("pending")
      .filter((e) => e.mutationId === undefined)
      .sortBy("id");
    for (const e of fresh) await db.outbox.update(e.id!, { mutationId: next++ });
    await db.meta.put({ key: "nextMutationId", value: next });
  });
}

/**
 * Numbers waiting changes again from `from` (the server applied none of them): ids from it on
 * are cleared and given anew in the order the changes were made. Call inside a transaction on
 * outbox and meta.
 */
async function renumberFrom(db: LodebookDb, from: number): Promise<void> {
  await db.outbox
    .where("state")
    .equals("pending")
    .filter((e) => e.mutationId !== undefined && e.mutationId >= from)
    .modify((e) => void delete e.mutationId);
  await db.meta.put({ key: "nextMutationId", value: from });
}

/**
 * Reset (the server was restored from an older backup, or lost track of this device): a new
 * client id, the cursor at 0, and every local record queued again as it stands, so the server
 * gets what it lacks. Waiting changes that are not a record's state (deletions, settings) stay
 * queued after them in their order: without them a deleted find would come back. Nothing on
 * the device is dropped.
 */
export async function resetAndResend(db: LodebookDb): Promise<void> {
  await db.transaction("rw", [db.outbox, db.meta, db.outings, db.finds, db.photos, db.scales, db.weighIns, db.barrenRocks, db.answers], async () => {
    const now = Date.now();
    const puts: OutboxEntry[] = [];
    const queue = (entity: RecordEntity, record: { id: string } & object) =>
      puts.push({
        name: `${entity}.put` as MutationName,
        args: pickRecord(entity, record as Record<string, unknown>),
        entityId: record.id,
        createdAt: now,
        state: "pending",
      });
    (await db.outings.toArray()).forEach((o) => queue("outing", o));
    (await db.finds.toArray()).forEach((f) => queue("find", f));
    (await db.photos.toArray()).filter((p) => p.blob.size > 0).forEach((p) => queue("photo", p));
    // Scales before the weigh-ins and barren rock that name them.
    (await db.scales.toArray()).forEach((s) => queue("scale", s));
    (await db.weighIns.toArray()).forEach((w) => queue("weighIn", w));
    (await db.barrenRocks.toArray()).forEach((b) => queue("barrenRock", b));
    // After the finds they answer about.
    (await db.answers.toArray()).forEach((a) => queue("answer", a));
    const waiting = await db.outbox.where("state").equals("pending").sortBy("id");
    // A record's waiting put is the record as queued above (or, gone from the device, one a waiting delete undoes).
    const kept = waiting.filter((e) => e.name === "settings.put" || !e.name.endsWith(".put")).map(({ id: _id, mutationId: _m, ...e }) => e);
    await db.outbox.where("state").equals("pending").delete();
    await db.outbox.bulkAdd([...puts, ...kept]);
    await db.photos.toCollection().modify((p) => {
      if (p.blob.size > 0) p.uploaded = 0;
    });
    await db.meta.bulkPut([
      { key: "clientId", value: uuidv7() },
      { key: "nextMutationId", value: 1 },
      { key: "cursor", value: 0 },
    ]);
  });
}

/**
 * Gap: the server expects `expected` next. Waiting changes below it were answered as replays
 * (the server holds them: done). With none below it, the server lacks changes this device
 * thought sent (restored from a backup): reset.
 */
export async function recoverFromGap(db: LodebookDb, batch: OutboxEntry[], expected: number): Promise<void> {
  const done = batch.filter((e) => e.mutationId! < expected);
  if (done.length === 0) await resetAndResend(db);
  else await db.outbox.bulkDelete(done.map((e) => e.id!));
}

/**
 * Reused client id: another device (a copied browser profile) sent other changes under this
 * device's ids. The changes the server named as replays are done; the rest go again under a
 * new client id of this device's own, from 1.
 */
export async function takeNewClientId(db: LodebookDb, replayed: number[]): Promise<void> {
  const done = new Set(replayed);
  await db.transaction("rw", db.outbox, db.meta, async () => {
    await db.outbox
      .where("state")
      .equals("pending")
      .filter((e) => e.mutationId !== undefined && done.has(e.mutationId))
      .delete();
    await renumberFrom(db, 1);
    await db.meta.put({ key: "clientId", value: uuidv7() });
  });
  await assignMutationIds(db);
}

/** Server failures (5xx) counted against the first change of a batch; the count restarts after any accepted push. */
export async function countServerFault(db: LodebookDb, mutationId: number): Promise<number> {
  const last = await meta<{ mutationId: number; count: number } | null>(db, "serverFault", null);
  const count = last?.mutationId === mutationId ? last.count + 1 : 1;
  await db.meta.put({ key: "serverFault", value: { mutationId, count } });
  return count;
}

export const clearServerFault = (db: LodebookDb) => db.meta.delete("serverFault");

/**
 * Sets aside a change the server fails on alone, every time: kept on the device as "stuck"
 * with the server's error id, and the changes after it numbered down to take its place (the
 * server applied none of them), so everything else moves.
 */
export async function setAside(db: LodebookDb, entry: OutboxEntry, errorId: string): Promise<void> {
  await db.transaction("rw", db.outbox, db.meta, async () => {
    await renumberFrom(db, entry.mutationId!);
    await db.outbox.update(entry.id!, { state: "stuck", errorId, reason: "The club's server failed on this change each time it was sent." });
  });
  await assignMutationIds(db);
}

/**
 * Puts changes set aside back in the queue ("Try again"): after what already waits, since a
 * numbered change may be on the server with its answer lost and must keep its id.
 */
export async function retryStuck(db: LodebookDb, outboxIds?: number[]): Promise<void> {
  await db.outbox
    .where("state")
    .equals("stuck")
    .filter((e) => !outboxIds || outboxIds.includes(e.id!))
    .modify((e) => {
      e.state = "pending";
      delete e.mutationId;
      delete e.errorId;
      delete e.reason;
    });
}

/**
 * Undoes a set-aside when the push after it failed on the server too (the server is failing
 * on everything, not on that change): the change takes its place again, ids from `from` on
 * are given anew (the server applied none of them).
 */
export async function putBack(db: LodebookDb, outboxId: number, from: number): Promise<void> {
  await db.transaction("rw", db.outbox, db.meta, async () => {
    await renumberFrom(db, from);
    await db.outbox.update(outboxId, { state: "pending", errorId: undefined, reason: undefined });
  });
  await assignMutationIds(db);
}
