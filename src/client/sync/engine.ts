import type { LodebookDb, OutboxEntry } from "../device-db";
import { applyPullPage, beginResync, finishResync } from "./apply-pull";
import {
  assignMutationIds,
  clearServerFault,
  countServerFault,
  ensureClient,
  meta,
  putBack,
  recoverFromGap,
  resetAndResend,
  setAside,
  takeNewClientId,
} from "./recover";
import type { SyncStatus } from "./status";
import { PARALLEL_UPLOADS, sendPhoto } from "./photo-upload";
import { fetchPull, sendPush, type Answer } from "./transport";

export { ensureClient, resetAndResend } from "./recover";

const BATCH = 200;
/** Server failures of one batch, each after a back-off, before the device looks for the change behind them. */
export const FAULTS_BEFORE_SET_ASIDE = 3;

type Report = (s: SyncStatus) => void;
/** A step's end: on, with its counts, or stopped with the status to show. */
type Step<T> = ({ ok: true } & T) | { ok: false; status: SyncStatus };

export type SyncOptions = {
  /** "Send photos now": this sync sends photos even when the member keeps them for later. */
  photosNow?: boolean;
};

/**
 * One full sync, in three steps: send waiting changes, upload photos whose records are on the
 * server, receive what changed. A pull answered `reset` starts over after queueing everything
 * again (see recover.ts). With "records now, photos later" on (a device setting), photos wait
 * unless this sync was asked to send them.
 */
export async function syncOnce(db: LodebookDb, memberId: string, report: Report, options: SyncOptions = {}): Promise<SyncStatus> {
  await ensureClient(db);
  const sent = await pushChanges(db, memberId, report);
  if (!sent.ok) return sent.status;
  const photosLater = (await db.settings.get("photosLater"))?.value === true && !options.photosNow;
  const photos = photosLater ? { ok: true as const, bytesDone: 0, bytesTotal: 0 } : await uploadPhotos(db, report);
  if (!photos.ok) return photos.status;
  const received = await pullChanges(db, report, photos.bytesDone, photos.bytesTotal);
  if (!received.ok) return received.status;
  if (received.reset) {
    await resetAndResend(db);
    return syncOnce(db, memberId, report, options);
  }
  const at = Date.now();
  await db.meta.put({ key: "lastSyncedAt", value: at });
  return { kind: "done", at, sent: sent.sent, received: received.received, rejected: sent.rejected };
}

const pending = (db: LodebookDb) => db.outbox.where("state").equals("pending");

/**
 * Push: waiting changes in batches, in order. Recovery where the server answers so: a gap
 * (it has less than this device thought, recoverFromGap), a reused client id (another device
 * shares it, takeNewClientId), and a server failure that repeats (back off; after
 * FAULTS_BEFORE_SET_ASIDE, halve the batch until the one change behind it is found, and set
 * that one aside so the rest moves).
 */
async function pushChanges(db: LodebookDb, memberId: string, report: Report): Promise<Step<{ sent: number; rejected: number; total: number }>> {
  await assignMutationIds(db);
  const total = await pending(db).count();
  let sent = 0;
  let rejected = 0;
  let size = BATCH;
  let narrowing = false;
  let setAsideLast: { entry: OutboxEntry; from: number } | undefined;
  for (;;) {
    const batch = (await pending(db).sortBy("id")).filter((e) => e.mutationId !== undefined).slice(0, size);
    if (batch.length === 0) return { ok: true, sent, rejected, total };
    report({ kind: "syncing", phase: "sending", done: sent, total, bytesDone: 0, bytesTotal: 0 });
    const clientId = await meta(db, "clientId", "");
    const answer = await sendPush({ clientId, asMember: memberId, mutations: batch.map((e) => ({ id: e.mutationId!, name: e.name, args: e.args })) });
    if (answer.ok) {
      const counts = await settle(db, batch, answer.body.results);
      sent += counts.sent;
      rejected += counts.rejected;
      setAsideLast = undefined;
      await clearServerFault(db);
      continue;
    }
    if (answer.kind === "gap" && answer.expected) {
      await recoverFromGap(db, batch, answer.expected);
      await assignMutationIds(db);
      continue;
    }
    if (answer.kind === "reused") {
      await takeNewClientId(db, answer.replayed ?? []);
      continue;
    }
    if (answer.kind === "retry" && answer.errorId !== undefined) {
      if (setAsideLast) {
        // The push after a set-aside failed too: the server fails on everything now. Undo it and back off.
        await putBack(db, setAsideLast.entry.id!, setAsideLast.from);
        return { ok: false, status: failure(answer, await pending(db).count()) };
      }
      const faults = await countServerFault(db, batch[0].mutationId!);
      if (!narrowing && faults < FAULTS_BEFORE_SET_ASIDE) return { ok: false, status: failure(answer, await pending(db).count()) };
      narrowing = true;
      if (batch.length > 1) {
        size = Math.ceil(batch.length / 2);
        continue;
      }
      setAsideLast = { entry: batch[0], from: batch[0].mutationId! };
      await setAside(db, batch[0], answer.errorId);
      size = BATCH;
      continue;
    }
    return { ok: false, status: failure(answer, await pending(db).count()) };
  }
}

/** Records the server's answer for each change: done, or refused with its reason (kept, shown). */
async function settle(db: LodebookDb, batch: OutboxEntry[], results: { id: number; status: string; reason?: string; message?: string; field?: string }[]) {
  const byId = new Map(batch.map((e) => [e.mutationId!, e]));
  let sent = 0;
  let rejected = 0;
  await db.transaction("rw", db.outbox, async () => {
    for (const r of results) {
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
  return { sent, rejected };
}

/**
 * Photos whose records are on the server, PARALLEL_UPLOADS at a time, each in chunks that
 * resume after a cut (photo-upload.ts). One refused for good stays on the device; any other
 * failure stops the step once the uploads under way have ended.
 */
async function uploadPhotos(db: LodebookDb, report: Report): Promise<Step<{ bytesDone: number; bytesTotal: number }>> {
  const photos = (await db.photos.where("uploaded").equals(0).toArray()).filter((p) => p.blob.size > 0);
  const waitingIds = new Set((await db.outbox.toArray()).map((e) => e.entityId));
  const ready = photos.filter((p) => !waitingIds.has(p.id) && !waitingIds.has(p.findId));
  const bytesTotal = ready.reduce((n, p) => n + p.blob.size, 0);
  const startedAt = Date.now();
  let bytesDone = 0;
  let photosDone = 0;
  let stop: Extract<Answer<unknown>, { ok: false }> | undefined;
  const emit = () =>
    report({
      kind: "syncing",
      phase: "photos",
      done: photosDone,
      total: ready.length,
      bytesDone,
      bytesTotal,
      secondsLeft: secondsLeft(bytesDone, bytesTotal, Date.now() - startedAt),
    });
  const queue = [...ready];
  const worker = async () => {
    for (let p = queue.shift(); p && !stop; p = queue.shift()) {
      const answer = await sendPhoto(p, (delta) => {
        bytesDone += delta;
        emit();
      });
      if (answer.ok) {
        await db.photos.update(p.id, { uploaded: 1 });
        photosDone++;
        emit();
      } else if (answer.kind !== "refused") stop ??= answer;
    }
  };
  // No photo to send, no photos step to show: "Sending photos: 0 of 0" flashed on every sync,
  // and the photo line it adds on the sync screen moved the sections below it twice.
  if (ready.length > 0) emit();
  await Promise.all(Array.from({ length: PARALLEL_UPLOADS }, worker));
  if (stop) return { ok: false, status: failure(stop, await pending(db).count()) };
  return { ok: true, bytesDone, bytesTotal };
}

/** Time left at the rate seen so far; none until a couple of seconds and some bytes have gone. */
export function secondsLeft(done: number, total: number, elapsedMs: number): number | null {
  if (elapsedMs < 2000 || done <= 0) return null;
  return Math.max(0, Math.round(((total - done) * elapsedMs) / done / 1000));
}

/**
 * Pull: pages from the stored cursor, each stored with its cursor. A `resync` answer (deletions
 * this device may have missed were purged) pulls everything from 0 and drops at the end what
 * did not come (finishResync); a `reset` answer goes back to syncOnce, which resends.
 */
async function pullChanges(db: LodebookDb, report: Report, bytesDone: number, bytesTotal: number): Promise<Step<{ received: number; reset: boolean }>> {
  let received = 0;
  for (;;) {
    const cursor = await meta(db, "cursor", 0);
    report({ kind: "syncing", phase: "receiving", done: received, total: received + 1, bytesDone, bytesTotal });
    const answer = await fetchPull(await meta(db, "clientId", ""), cursor);
    if (!answer.ok) return { ok: false, status: failure(answer, await pending(db).count()) };
    if (answer.body.reset) return { ok: true, received, reset: true };
    if (answer.body.resync) {
      await beginResync(db);
      continue;
    }
    await applyPullPage(db, answer.body.changes, answer.body.cursor, answer.body.lastMutationId, answer.body.more);
    received += answer.body.changes.length;
    if (!answer.body.more) break;
  }
  await finishResync(db);
  return { ok: true, received, reset: false };
}

function failure(answer: Extract<Answer<unknown>, { ok: false }>, waiting: number): SyncStatus {
  switch (answer.kind) {
    case "offline":
      return { kind: "offline", waiting, rejected: 0, lastSyncedAt: null };
    case "unauthorized":
      return { kind: "needs-sign-in", waiting, reason: "expired" };
    case "other-member":
      return { kind: "needs-sign-in", waiting, reason: "other-member" };
    case "outdated":
      return { kind: "outdated", waiting };
    default:
      // The scheduler sets the time it will really try again (at least retryAt).
      return {
        kind: "error",
        message: answer.message ?? "The club's server did not answer as expected.",
        retryAt: Date.now() + (answer.retryAfterS ?? 0) * 1000,
        waiting,
      };
  }
}
