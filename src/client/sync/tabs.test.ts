// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { LodebookDb } from "../device-db";
import type { SyncStatus } from "./status";

// Two tabs of one member: one leads the sync (Web Locks), and the other shows what it does and
// how it ended. Each tab is its own copy of the scheduler and status modules, as in two pages;
// the engine is stood in for, so each test says what a sync does.

vi.mock("../first-paint", () => ({ afterFirstPaint: () => () => {} }));
type Report = (s: SyncStatus) => void;
type Options = { photosNow?: boolean };
const engine = vi.hoisted(() => ({
  syncOnce: (() => Promise.reject(new Error("set by the test"))) as (db: unknown, member: unknown, report: Report, options: Options) => Promise<SyncStatus>,
}));
vi.mock("./engine", () => ({
  syncOnce: (db: unknown, member: unknown, report: Report, options: Options) => engine.syncOnce(db, member, report, options),
}));

type Tab = { status: () => SyncStatus; request: (options?: { photosNow?: boolean }) => void; stop: () => void };
let held = false;
let waiters: (() => void)[] = [];
let watchMs = 0;
const tabs: Tab[] = [];
/** Lets the lock go as a closed tab does: no end to its work, the next in line gets it. */
const dropLock = () => {
  held = false;
  waiters.shift()?.();
};
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function openTab(): Promise<Tab> {
  vi.resetModules();
  const { startSync, LEADER_WATCH_MS } = await import("./scheduler");
  const { syncStatus } = await import("./status");
  watchMs = LEADER_WATCH_MS;
  const running = startSync({} as LodebookDb, "member-1");
  const tab = { status: syncStatus.get, request: running.request, stop: running.stop };
  tabs.push(tab);
  return tab;
}

beforeEach(() => {
  held = false;
  waiters = [];
  // One lock for the member's tabs: the first to ask holds it while its work runs; asked with
  // ifAvailable a taken lock answers null, asked without it waits its turn.
  Object.defineProperty(navigator, "locks", {
    configurable: true,
    value: {
      request: async (name: string, ...rest: unknown[]) => {
        const [options, work] = (rest.length === 1 ? [{}, rest[0]] : rest) as [{ ifAvailable?: boolean }, (lock: object | null) => Promise<void>];
        if (held) {
          if (options.ifAvailable) return work(null);
          await new Promise<void>((r) => waiters.push(r));
        }
        held = true;
        try {
          return await work({ name });
        } finally {
          dropLock();
        }
      },
      query: async () => ({ held: held ? [{ name: "lodebook-sync-member-1", mode: "exclusive" }] : [], pending: [] }),
    },
  });
});

afterEach(() => {
  for (const t of tabs.splice(0)) t.stop();
});

const receiving: SyncStatus = { kind: "syncing", phase: "receiving", done: 0, total: 1, bytesDone: 0, bytesTotal: 0 };
const done = (at: number): SyncStatus => ({ kind: "done", at, sent: 0, received: 0, rejected: 0 });

/** A sync that reports "receiving" and then waits for the test to end it with `outcome`. */
function heldSync(outcome: SyncStatus) {
  const ends: (() => void)[] = [];
  const asked: Options[] = [];
  let calls = 0;
  engine.syncOnce = async (_db, _member, report, options) => {
    calls++;
    asked.push(options);
    report(receiving);
    await new Promise<void>((r) => ends.push(r));
    return outcome;
  };
  return { end: () => ends.shift()?.(), calls: () => calls, options: () => asked };
}

/** Two tabs, the first leading a held sync that ends with `outcome`, the second showing it. */
async function leaderSyncing(outcome: SyncStatus) {
  const sync = heldSync(outcome);
  const leader = await openTab();
  const follower = await openTab();
  leader.request();
  await vi.waitFor(() => expect(follower.status()).toEqual(receiving));
  return { sync, leader, follower };
}

describe("a tab that does not lead the sync", () => {
  it("shows the leader's progress and how its sync ended: no signal", async () => {
    const offline: SyncStatus = { kind: "offline", waiting: 2, rejected: 0, lastSyncedAt: null };
    const { sync, leader, follower } = await leaderSyncing(offline);
    follower.request(); // the lock is taken: this tab does not sync at the same time
    await pause(watchMs / 2);
    expect(sync.calls()).toBe(1);
    sync.end();
    await vi.waitFor(() => expect(leader.status()).toEqual(offline));
    await vi.waitFor(() => expect(follower.status()).toEqual(offline));
  });

  it("shows an 'outdated' end too, and neither tab starts another sync", async () => {
    const { sync, leader, follower } = await leaderSyncing({ kind: "outdated", waiting: 0 });
    sync.end();
    await vi.waitFor(() => expect(follower.status().kind).toBe("outdated"));
    await pause(watchMs * 2.5);
    expect(sync.calls()).toBe(1);
    expect(leader.status().kind).toBe("outdated");
  });

  it("does not sync again after a leader that ended well", async () => {
    const { sync, follower } = await leaderSyncing(done(3));
    sync.end();
    await vi.waitFor(() => expect(follower.status()).toEqual(done(3)));
    await pause(watchMs * 2.5);
    expect(sync.calls()).toBe(1);
  });

  it("syncs itself when the leader is closed mid-sync: no end came, and the lock is free", async () => {
    const { sync, leader, follower } = await leaderSyncing(done(2));
    leader.stop();
    dropLock(); // the leader's tab is gone: its sync never ends
    await vi.waitFor(() => expect(sync.calls()).toBe(2), { timeout: watchMs * 3 });
    sync.end(); // the closed leader's
    sync.end(); // the follower's own
    await vi.waitFor(() => expect(follower.status()).toEqual(done(2)));
  });

  it("a sync asked for here while the leader syncs runs once the leader is done, its 'send photos now' kept", async () => {
    const { sync, follower } = await leaderSyncing(done(4));
    follower.request({ photosNow: true }); // "send photos now" pressed in this tab
    sync.end();
    await vi.waitFor(() => expect(sync.calls()).toBe(2), { timeout: watchMs * 3 });
    expect(sync.options()[1]).toEqual({ photosNow: true });
    sync.end();
    await vi.waitFor(() => expect(follower.status()).toEqual(done(4)));
  });

  it("stops hearing the leader once stopped (signed out)", async () => {
    engine.syncOnce = async () => done(1);
    const leader = await openTab();
    const follower = await openTab();
    follower.stop();
    leader.request();
    await vi.waitFor(() => expect(leader.status().kind).toBe("done"));
    await pause(50);
    expect(follower.status().kind).toBe("idle");
  });
});

describe("the leading tab", () => {
  it("runs the sync asked for during its own, though another tab is watching the lock", async () => {
    const sync = heldSync(done(5));
    const leader = await openTab();
    await openTab(); // watches while the leader syncs
    leader.request();
    await vi.waitFor(() => expect(sync.calls()).toBe(1));
    leader.request(); // asked again mid-sync: it runs after this one
    sync.end();
    await vi.waitFor(() => expect(sync.calls()).toBe(2));
    sync.end();
    await vi.waitFor(() => expect(leader.status()).toEqual(done(5)));
  });

  it("stopped mid-sync (signed out), its sync goes on reporting without throwing", async () => {
    const { sync, leader, follower } = await leaderSyncing(done(6));
    leader.stop();
    sync.end();
    await vi.waitFor(() => expect(leader.status()).toEqual(done(6)));
    expect(follower.status()).toEqual(receiving);
  });
});
