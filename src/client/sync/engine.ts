import { v7 as uuidv7 } from "uuid";
import type { LodebookDb, OutboxEntry } from "../device-db";
import { applyPullPage, beginResync, finishResync } from "./apply-pull";
import type { SyncStatus } from "./status";
import { fetchPull, sendPush, uploadPhoto } from "./transport";

const BATCH = 200;

async function meta<T>(db: LodebookDb, key: string, fallback: T): Promise<T> {
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

/** Gives waiting changes their mutation ids, stored before the first send so a resend reuses them. */
async function assignMutationIds(db: LodebookDb): Promise<void> {
  await db.transaction("rw", db.outbox, db.meta, async () => {
    let next = await meta(db, "nextMutationId", 1);
    const fresh = await db.outbox.where("state").equals("pending").filter((e) => e.mutationId === undefined).sortBy("id");
    for (const e of fresh) await db.outbox.update(e.id!, { mutationId: next++ });
    await db.meta.put({ key: "nextMutationId", value: next });
  });
}

/**
 * Starts over with the server (it was restored from an older backup, or lost track of this
 * device): a new client id, the cursor at 0, and every local record queued again so the
 * server gets what it lacks. Nothing on the device is dropped.
 */
export async function resetAndResend(db: LodebookDb): Promise<void> {
  await db.transaction("rw", [db.outbox, db.meta, db.outings, db.finds, db.photos, db.weighIns], async () => {
    const now = Date.now();
    const entries: OutboxEntry[] = [];
    const put = (name: OutboxEntry["name"], args: Record<string, unknown>) => {
      const { updatedAt: _u, blob: _b, thumb: _t, uploaded: _up, ...record } = args;
      entries.push({ name, args: record, entityId: record.id as string, createdAt: now, state: "pending" });
    };
    (await db.outings.toArray()).forEach((o) => put("outing.put", o));
    (await db.finds.toArray()).forEach((f) => put("find.put", f));
    (await db.photos.toArray()).filter((p) => p.blob.size > 0).forEach((p) => put("photo.put", p));
    (await db.weighIns.toArray()).forEach((w) => put("weighIn.put", w));
    await db.outbox.where("state").equals("pending").delete();
    await db.outbox.bulkAdd(entries);
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

type Outcome = SyncStatus;

/** One full sync: send waiting changes, upload photos, receive what changed. */
export async function syncOnce(db: LodebookDb, memberId: string, report: (s: SyncStatus) => void): Promise<Outcome> {
  const clientId = await ensureClient(db);
  await assignMutationIds(db);
  const total = await db.outbox.where("state").equals("pending").count();
  let sent = 0;
  let rejected = 0;
  const waiting = () => db.outbox.where("state").equals("pending").count();

  // 1. Send.
  for (;;) {
    const batch = (await db.outbox.where("state").equals("pending").sortBy("id")).filter((e) => e.mutationId !== undefined).slice(0, BATCH);
    if (batch.length === 0) break;
    report({ kind: "syncing", phase: "sending", done: sent, total, bytesDone: 0, bytesTotal: 0 });
    const answer = await sendPush({ clientId: (await meta(db, "clientId", clientId))!, asMember: memberId, mutations: batch.map((e) => ({ id: e.mutationId!, name: e.name, args: e.args })) });
    if (!answer.ok) {
      if (answer.kind === "gap" && answer.expected) {
        // The server is ahead of what this device thought: what lies below its next id is done.
        const done = batch.filter((e) => e.mutationId! < answer.expected!);
        if (done.length === 0) {
          await resetAndResend(db);
          await assignMutationIds(db);
        } else await db.outbox.bulkDelete(done.map((e) => e.id!));
        continue;
      }
      return failure(answer.kind, answer.message, await waiting(), answer.retryAfterS);
    }
    const byId = new Map(batch.map((e) => [e.mutationId!, e]));
    await db.transaction("rw", db.outbox, async () => {
      for (const r of answer.body.results) {
        const entry = byId.get(r.id);
        if (!entry) continue;
        if (r.status === "rejected") {
          rejected++;
          await db.outbox.update(entry.id!, { state: "rejected", reason: r.message ?? r.reason, field: r.field });
        } else {
          sent++;
          await db.outbox.delete(entry.id!);
        }
      }
    });
  }

  // 2. Photos whose records are on the server.
  const photos = (await db.photos.where("uploaded").equals(0).toArray()).filter((p) => p.blob.size > 0);
  const waitingIds = new Set((await db.outbox.toArray()).map((e) => e.entityId));
  const ready = photos.filter((p) => !waitingIds.has(p.id) && !waitingIds.has(p.findId));
  const bytesTotal = ready.reduce((n, p) => n + p.blob.size, 0);
  let bytesDone = 0;
  for (const p of ready) {
    report({ kind: "syncing", phase: "photos", done: sent, total, bytesDone, bytesTotal });
    const answer = await uploadPhoto(p.id, p.blob, p.sha256);
    if (answer.ok) {
      await db.photos.update(p.id, { uploaded: 1 });
      bytesDone += p.blob.size;
    } else if (answer.kind !== "refused") {
      return failure(answer.kind, answer.message, await waiting(), answer.retryAfterS);
    }
  }

  // 3. Receive.
  let received = 0;
  for (;;) {
    const cursor = await meta(db, "cursor", 0);
    report({ kind: "syncing", phase: "receiving", done: received, total: received + 1, bytesDone, bytesTotal });
    const answer = await fetchPull((await meta(db, "clientId", clientId))!, cursor);
    if (!answer.ok) return failure(answer.kind, answer.message, await waiting(), answer.retryAfterS);
    if (answer.body.reset) {
      await resetAndResend(db);
      return syncOnce(db, memberId, report);
    }
    if (answer.body.resync) {
      await beginResync(db);
      continue;
    }
    await applyPullPage(db, answer.body.changes, answer.body.cursor, answer.body.lastMutationId);
    received += answer.body.changes.length;
    if (!answer.body.more) break;
  }
  await finishResync(db);
  const at = Date.now();
  await db.meta.put({ key: "lastSyncedAt", value: at });
  return { kind: "done", at, sent, received, rejected };
}

function failure(kind: string, message: string | undefined, waiting: number, retryAfterS?: number): SyncStatus {
  switch (kind) {
    case "offline":
      return { kind: "offline", waiting, rejected: 0, lastSyncedAt: null };
    case "unauthorized":
      return { kind: "needs-sign-in", waiting, reason: "expired" };
    case "other-member":
      return { kind: "needs-sign-in", waiting, reason: "other-member" };
    case "outdated":
      return { kind: "outdated", waiting };
    default:
      return { kind: "error", message: message ?? "The club's server did not answer as expected.", retryAt: Date.now() + (retryAfterS ?? 0) * 1000, waiting };
  }
}

