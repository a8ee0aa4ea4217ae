import type { LodebookDb } from "../device-db";
import { afterFirstPaint } from "../first-paint";
import { whenIdle } from "../when-idle";
import { syncStatus, type SyncStatus } from "./status";

const PERIOD_MS = 5 * 60_000;
const MAX_BACKOFF_MS = 5 * 60_000;

/** Delay before retry n (from 0): doubling from 2 s to 5 min, with jitter so devices spread out. */
export function backoffMs(attempt: number, random = Math.random): number {
  const base = Math.min(MAX_BACKOFF_MS, 2000 * 2 ** attempt);
  return Math.round(base * (0.5 + random() * 0.5));
}

/**
 * What follows a sync's outcome: the delay before trying again (an error: the back-off, or the
 * server's Retry-After when longer) and the status to show, whose retryAt is that same moment.
 * Offline with a network there (`online`: navigator.onLine) tries again after the back-off too:
 * navigator.onLine says a network is there, not that the club's server can be reached (a
 * camp's Wi-Fi with no way out, a phone waking in a dead zone), and no "online" event comes
 * when the way opens. With no network at all the online event is the way back, and no try is
 * made meanwhile (each would flash "syncing" on the card and in a screen reader's ear).
 */
export function afterOutcome(
  outcome: SyncStatus,
  attempt: number,
  now = Date.now(),
  random = Math.random,
  online = true,
): { status: SyncStatus; waitMs: number | null; attempt: number } {
  if (outcome.kind === "error") {
    const waitMs = Math.max(backoffMs(attempt, random), outcome.retryAt - now);
    return { status: { ...outcome, retryAt: now + waitMs }, waitMs, attempt: attempt + 1 };
  }
  if (outcome.kind === "offline") return { status: outcome, waitMs: online ? backoffMs(attempt, random) : null, attempt: attempt + 1 };
  return { status: outcome, waitMs: null, attempt: 0 };
}

// The engine (push, pull, photo upload) is loaded with the first sync, not with the screen:
// a chunk the service worker precaches, so it is there offline too.
const loadEngine = () => import("./engine");

/** The statuses a tab takes from the leading tab's messages (anything else is ignored): every kind, the compiler holds it so. */
const KINDS: Record<SyncStatus["kind"], true> = { idle: true, offline: true, syncing: true, done: true, "needs-sign-in": true, outdated: true, error: true };
const isStatus = (data: unknown): data is SyncStatus =>
  typeof data === "object" && data !== null && Object.hasOwn(KINDS, (data as { kind?: unknown }).kind as PropertyKey);
/** How often a tab that does not lead looks whether the leader still holds the sync's lock. */
export const LEADER_WATCH_MS = 1000;

type Running = { stop: () => void; request: (options?: SyncOptions) => void };
/** What the engine's sync takes (kept as a type here, so the engine stays out of the first load). */
type SyncOptions = { photosNow?: boolean };
let current: Running | undefined;

/**
 * Runs camp sync for one member on this device: at start, when the browser comes online or
 * the app comes back into view, every few minutes, from "sync now", and when the service
 * worker's Background Sync fires. Only one tab leads (Web Locks); failures back off.
 */
export function startSync(db: LodebookDb, memberId: string): Running {
  current?.stop();
  let stopped = false;
  let attempt = 0;
  let retryTimer: ReturnType<typeof setTimeout> | undefined;
  let again = false;
  let running = false;
  // "Send photos now" holds for the next sync to start (this one, or the one after a running one).
  let photosNow = false;
  // Only one tab leads a sync (the lock). The others show what it is doing and how it ended:
  // their own status would stay as it was, and a screen waiting for the first copy
  // (first-copy.ts) would wait on after the leader's first sync ended with no signal.
  const lockName = `lodebook-sync-${memberId}`;
  const channel = typeof BroadcastChannel === "undefined" ? null : new BroadcastChannel(lockName);
  const report = (status: SyncStatus) => {
    syncStatus.set(status);
    if (!stopped) channel?.postMessage(status);
  };
  // A sync asked for (after a save, "sync now"), not one of the timer's or the page's own.
  let asked = false;
  // While the leader syncs with no end heard yet, or a sync asked for here found the lock taken,
  // this tab looks whether the lock is still held (asking, never queueing for it: a queued
  // request would take the lock between the leader's syncs and make its next one give up).
  // Once it is free: a leader that let go with no end (its tab closed mid-sync), or a sync this
  // tab wanted, runs here.
  let leaderSyncing = false;
  let wanted = false;
  let watch: ReturnType<typeof setInterval> | undefined;
  const endWatch = () => {
    clearInterval(watch);
    watch = undefined;
  };
  const watchLeader = () => {
    if (watch || typeof navigator === "undefined" || !navigator.locks?.query) return;
    watch = setInterval(async () => {
      const held = await navigator.locks.query().then(
        (q) => (q.held ?? []).some((l) => l.name === lockName),
        () => true,
      );
      if (stopped || !(leaderSyncing || wanted)) return endWatch();
      if (held) return;
      endWatch();
      leaderSyncing = wanted = false;
      void run();
    }, LEADER_WATCH_MS);
  };
  if (channel)
    channel.onmessage = (e: MessageEvent<unknown>) => {
      if (running || stopped || !isStatus(e.data)) return;
      syncStatus.set(e.data);
      leaderSyncing = e.data.kind === "syncing";
      if (leaderSyncing) watchLeader();
    };

  const run = async () => {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    running = true;
    const options: SyncOptions = { photosNow };
    const wish = asked;
    photosNow = asked = false;
    try {
      const work = async () => {
        const { syncOnce } = await loadEngine();
        const outcome = await syncOnce(db, memberId, report, options);
        const next = afterOutcome(outcome, attempt, Date.now(), Math.random, navigator.onLine);
        report(next.status);
        attempt = next.attempt;
        clearTimeout(retryTimer);
        if (next.waitMs !== null) retryTimer = setTimeout(run, next.waitMs);
      };
      if (typeof navigator !== "undefined" && navigator.locks) {
        await navigator.locks.request(lockName, { ifAvailable: true }, async (lock) => {
          if (lock) await work();
          else if (wish) {
            // Another tab holds it and syncs for everyone; a sync asked for here (a change saved
            // in this tab may have missed that one) runs once the lock is free, "send photos
            // now" kept for it.
            wanted = true;
            if (options.photosNow) photosNow = true;
            watchLeader();
          }
        });
      } else await work();
    } catch (error) {
      const next = afterOutcome({ kind: "error", message: error instanceof Error ? error.message : String(error), retryAt: 0, waiting: 0 }, attempt);
      report(next.status);
      attempt = next.attempt;
      clearTimeout(retryTimer); // one retry waiting, never two chains of them
      retryTimer = setTimeout(run, next.waitMs!);
    } finally {
      running = false;
      if (again && !stopped) {
        again = false;
        void run();
      }
    }
  };

  const onVisible = () => document.visibilityState === "visible" && void run();
  const onMessage = (e: MessageEvent) => e.data?.type === "lodebook-sync" && void run();
  window.addEventListener("online", run);
  document.addEventListener("visibilitychange", onVisible);
  navigator.serviceWorker?.addEventListener("message", onMessage);
  const timer = setInterval(() => navigator.onLine && void run(), PERIOD_MS);
  // The sync at app start waits until the page has drawn its first words, and then until the
  // first screen has drawn what the device holds (the browser is idle, or 2 s at most): on a
  // slow link and a slow phone it would otherwise compete with them.
  let stopIdle = () => {};
  const stopWaiting = afterFirstPaint(() => (stopIdle = whenIdle(() => void run(), { timeoutMs: 2000 })));

  current = {
    request: (options) => {
      if (options?.photosNow) photosNow = true;
      asked = true;
      void run();
    },
    stop: () => {
      stopped = true;
      stopWaiting();
      stopIdle();
      clearInterval(timer);
      clearTimeout(retryTimer);
      window.removeEventListener("online", run);
      document.removeEventListener("visibilitychange", onVisible);
      navigator.serviceWorker?.removeEventListener("message", onMessage);
      endWatch();
      channel?.close();
    },
  };
  return current;
}

/** Ask for a sync now (after a save, or the "sync now" button). Offline, Background Sync takes it. */
export function requestSync(options?: SyncOptions): void {
  if (navigator.onLine) current?.request(options);
  else void registerBackgroundSync();
}

async function registerBackgroundSync() {
  try {
    const reg = (await navigator.serviceWorker?.ready) as (ServiceWorkerRegistration & { sync?: { register: (tag: string) => Promise<void> } }) | undefined;
    await reg?.sync?.register("lodebook-sync");
  } catch {
    // Not every browser has Background Sync; the online event covers it.
  }
}
