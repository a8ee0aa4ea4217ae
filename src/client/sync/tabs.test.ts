// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { LodebookDb } from "../device-db";
import type { SyncStatus } from "./status";

// Two tabs of one member: one leads the sync (Web Locks), and the other shows what it does and
// how it ended. Each tab is its own copy of the scheduler and status modules, as in two pages;
// the engine is stood in for, so each test says what the leader's sync does.

vi.mock("../first-paint", () => ({ afterFirstPaint: () => () => {} }));
const engine = vi.hoisted(() => ({ syncOnce: (() => Promise.reject(new Error("set by the test"))) as (...args: unknown[]) => Promise<SyncStatus> }));
vi.mock("./engine", () => ({ syncOnce: (...args: unknown[]) => engine.syncOnce(...args) }));

type Tab = { status: () => SyncStatus; request: () => void; stop: () => void };
let held = false;
let waiters: (() => void)[] = [];
const tabs: Tab[] = [];
/** Lets the lock go as a closed tab does: no end to its work, the next in line gets it. */
const dropLock = () => {
  held = false;
  waiters.shift()?.();
};

async function openTab(): Promise<Tab> {
  vi.resetModules();
  const { startSync } = await import("./scheduler");
  const { syncStatus } = await import("./status");
  const running = startSync({} as LodebookDb, "member-1");
  const tab = { status: syncStatus.get, request: () => running.request(), stop: running.stop };
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
      request: async (_name: string, ...rest: unknown[]) => {
        const [options, work] = (rest.length === 1 ? [{}, rest[0]] : rest) as [{ ifAvailable?: boolean }, (lock: object | null) => Promise<void>];
        if (held) {
          if (options.ifAvailable) return work(null);
          await new Promise<void>((r) => waiters.push(r));
        }
        held = true;
        try {
          return await work({});
        } finally {
          dropLock();
        }
      },
    },
  });
});

afterEach(() => {
  for (const t of tabs.splice(0)) t.stop();
});

const receiving: SyncStatus = { kind: "syncing", phase: "receiving", done: 0, total: 1, bytesDone: 0, bytesTotal: 0 };

describe("a tab that does not lead the sync", () => {
  it("shows the leader's progress and how its sync ended: no signal", async () => {
    let end!: () => void;
    engine.syncOnce = async (_db, _member, report) => {
      (report as (s: SyncStatus) => void)(receiving);
      await new Promise<void>((r) => (end = r));
      return { kind: "offline", waiting: 2, rejected: 0, lastSyncedAt: null };
    };
    const leader = await openTab();
    const follower = await openTab();
    leader.request();
    await vi.waitFor(() => expect(leader.status().kind).toBe("syncing"));
    follower.request(); // the lock is taken: this tab does not sync itself
    await vi.waitFor(() => expect(follower.status()).toEqual(receiving));
    end();
    await vi.waitFor(() => expect(leader.status().kind).toBe("offline"));
    await vi.waitFor(() => expect(follower.status()).toEqual({ kind: "offline", waiting: 2, rejected: 0, lastSyncedAt: null }));
  });

  it("keeps its own word when the leader's code is out of date", async () => {
    engine.syncOnce = async () => ({ kind: "outdated", waiting: 0 });
    const leader = await openTab();
    const follower = await openTab();
    leader.request();
    await vi.waitFor(() => expect(leader.status().kind).toBe("outdated"));
    // Give the message time to arrive, had it been sent on.
    await new Promise((r) => setTimeout(r, 50));
    expect(follower.status().kind).toBe("idle");
  });

  it("stops hearing the leader once stopped (signed out)", async () => {
    engine.syncOnce = async () => ({ kind: "done", at: 1, sent: 0, received: 3, rejected: 0 });
    const leader = await openTab();
    const follower = await openTab();
    follower.stop();
    leader.request();
    await vi.waitFor(() => expect(leader.status().kind).toBe("done"));
    await new Promise((r) => setTimeout(r, 50));
    expect(follower.status().kind).toBe("idle");
  });

  it("syncs itself when the leader is closed mid-sync: no end came, and the lock is free", async () => {
    let calls = 0;
    engine.syncOnce = async (_db, _member, report) => {
      if (++calls === 1) {
        (report as (s: SyncStatus) => void)(receiving);
        return new Promise<SyncStatus>(() => {}); // the leader's tab closes before its end
      }
      return { kind: "done", at: 2, sent: 0, received: 1, rejected: 0 };
    };
    const leader = await openTab();
    const follower = await openTab();
    leader.request();
    await vi.waitFor(() => expect(follower.status()).toEqual(receiving));
    expect(calls).toBe(1);
    leader.stop();
    dropLock();
    await vi.waitFor(() => expect(follower.status()).toEqual({ kind: "done", at: 2, sent: 0, received: 1, rejected: 0 }));
    expect(calls).toBe(2);
  });

  it("does not sync again after a leader that ended well", async () => {
    let calls = 0;
    let end!: () => void;
    engine.syncOnce = async (_db, _member, report) => {
      calls++;
      (report as (s: SyncStatus) => void)(receiving);
      await new Promise<void>((r) => (end = r));
      return { kind: "done", at: 3, sent: 0, received: 0, rejected: 0 };
    };
    const leader = await openTab();
    const follower = await openTab();
    leader.request();
    await vi.waitFor(() => expect(follower.status()).toEqual(receiving));
    end();
    await vi.waitFor(() => expect(follower.status().kind).toBe("done"));
    await new Promise((r) => setTimeout(r, 400));
    expect(calls).toBe(1);
  });
});
