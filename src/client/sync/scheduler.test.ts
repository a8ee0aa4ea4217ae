import { describe, expect, it } from "vitest";
import { afterOutcome, backoffMs } from "./scheduler";

describe("the scheduler's retry", () => {
  const error = (retryAt: number) => ({ kind: "error" as const, message: "x", retryAt, waiting: 1 });

  it("shows the moment its timer will fire: the back-off, or the server's Retry-After when later", () => {
    const now = 1_000_000;
    const random = () => 0.5;
    const soon = afterOutcome(error(now), 3, now, random);
    expect(soon.waitMs).toBe(backoffMs(3, random));
    expect(soon.status).toMatchObject({ kind: "error", retryAt: now + soon.waitMs! });
    expect(soon.attempt).toBe(4);
    const told = afterOutcome(error(now + 600_000), 0, now, random);
    expect(told.waitMs).toBe(600_000);
    expect(told.status).toMatchObject({ retryAt: now + 600_000 });
  });

  it("offline, tries again after the back-off (no online event may come), and starts over after a sync that went through", () => {
    const random = () => 0.5;
    const offline = { kind: "offline" as const, waiting: 1, rejected: 0, lastSyncedAt: null };
    expect(afterOutcome(offline, 2, 0, random)).toMatchObject({ status: offline, waitMs: backoffMs(2, random), attempt: 3 });
    // With no network at all, the online event brings it back; no tries meanwhile.
    expect(afterOutcome(offline, 2, 0, random, false)).toMatchObject({ status: offline, waitMs: null, attempt: 3 });
    // However long the dead zone lasts, the device looks again every few minutes at most.
    expect(afterOutcome(offline, 40, 0, () => 1).waitMs).toBe(5 * 60_000);
    expect(afterOutcome({ kind: "done", at: 1, sent: 1, received: 0, rejected: 0 }, 5)).toMatchObject({ waitMs: null, attempt: 0 });
  });
});
