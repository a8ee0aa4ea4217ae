import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { whenIdle } from "./when-idle";

// whenIdle (when-idle.ts) with a stand-in idle callback: the browser's idle moments are called
// by hand, its timeouts by the fake clock.
describe("work that waits for an idle moment", () => {
  let idle: Map<number, { fn: () => void; timeout: number }>;
  let next: number;

  beforeEach(() => {
    vi.useFakeTimers();
    idle = new Map();
    next = 1;
    vi.stubGlobal("requestIdleCallback", (fn: () => void, options: { timeout: number }) => {
      idle.set(next, { fn, timeout: options.timeout });
      return next++;
    });
    vi.stubGlobal("cancelIdleCallback", (id: number) => idle.delete(id));
  });

  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  const idleNow = () => [...idle.values()].forEach(({ fn }) => fn());

  it("runs at the next idle moment, asking the browser for it with its time limit", () => {
    const then = vi.fn();
    whenIdle(then, { timeoutMs: 2000 });
    expect(then).not.toHaveBeenCalled();
    expect([...idle.values()].map((w) => w.timeout)).toEqual([2000]);
    idleNow();
    expect(then).toHaveBeenCalledTimes(1);
  });

  it("with a delay, asks for an idle moment only once the delay is over", () => {
    const then = vi.fn();
    whenIdle(then, { afterMs: 3000, timeoutMs: 2000 });
    vi.advanceTimersByTime(2999);
    expect(idle.size).toBe(0);
    vi.advanceTimersByTime(1);
    expect(idle.size).toBe(1);
    idleNow();
    expect(then).toHaveBeenCalledTimes(1);
  });

  it("cancelled during the delay or while waiting for idle, never runs", () => {
    const early = vi.fn();
    whenIdle(early, { afterMs: 1000, timeoutMs: 2000 })();
    vi.advanceTimersByTime(5000);
    expect(idle.size).toBe(0);

    const late = vi.fn();
    const stop = whenIdle(late, { afterMs: 1000, timeoutMs: 2000 });
    vi.advanceTimersByTime(1000);
    expect(idle.size).toBe(1);
    stop();
    expect(idle.size).toBe(0);
    expect(early).not.toHaveBeenCalled();
    expect(late).not.toHaveBeenCalled();
  });

  it("where the browser has no idle callback (Safari), runs in a task of its own after the delay", () => {
    vi.stubGlobal("requestIdleCallback", undefined);
    vi.stubGlobal("cancelIdleCallback", undefined);
    const then = vi.fn();
    whenIdle(then, { afterMs: 500, timeoutMs: 2000 });
    vi.advanceTimersByTime(499);
    expect(then).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1);
    expect(then).toHaveBeenCalledTimes(1);

    const cancelled = vi.fn();
    const stop = whenIdle(cancelled, { timeoutMs: 2000 });
    stop();
    vi.advanceTimersByTime(10);
    expect(cancelled).not.toHaveBeenCalled();
  });
});
