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

  it("waits for the online event when offline, and starts over after a sync that went through", () => {
    expect(afterOutcome({ kind: "offline", waiting: 1, rejected: 0, lastSyncedAt: null }, 2)).toMatchObject({ waitMs: null, attempt: 3 });
    expect(afterOutcome({ kind: "done", at: 1, sent: 1, received: 0, rejected: 0 }, 5)).toMatchObject({ waitMs: null, attempt: 0 });
  });
});
