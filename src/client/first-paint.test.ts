// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { afterFirstPaint } from "./first-paint";

/** A stand-in for the browser's paint reports: `paint()` delivers first-contentful-paint. */
function paintReports({ supported = true } = {}) {
  const entries: PerformanceEntry[] = [];
  const watchers = new Set<(list: { getEntriesByName: (name: string) => PerformanceEntry[] }) => void>();
  class FakeObserver {
    static supportedEntryTypes = supported ? ["paint", "longtask"] : ["longtask"];
    constructor(private readonly callback: (list: { getEntriesByName: (name: string) => PerformanceEntry[] }) => void) {}
    observe() {
      watchers.add(this.callback);
    }
    disconnect() {
      watchers.delete(this.callback);
    }
  }
  vi.stubGlobal("PerformanceObserver", FakeObserver);
  vi.spyOn(performance, "getEntriesByName").mockImplementation((name: string) => entries.filter((e) => e.name === name));
  return {
    watching: () => watchers.size,
    paint() {
      const entry = { name: "first-contentful-paint", entryType: "paint", startTime: 100, duration: 0 } as PerformanceEntry;
      entries.push(entry);
      for (const w of [...watchers]) w({ getEntriesByName: (name) => [entry].filter((e) => e.name === name) });
    },
  };
}

describe("afterFirstPaint", () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
    vi.restoreAllMocks();
  });

  it("waits for the first contentful paint, then runs once", () => {
    const reports = paintReports();
    const then = vi.fn();
    afterFirstPaint(then, 3000);
    vi.advanceTimersByTime(1000);
    expect(then).not.toHaveBeenCalled();
    reports.paint();
    vi.advanceTimersByTime(0);
    expect(then).toHaveBeenCalledTimes(1);
    expect(reports.watching()).toBe(0);
    vi.advanceTimersByTime(5000);
    expect(then).toHaveBeenCalledTimes(1);
  });

  it("goes at once when the page has painted already (a later screen of the same load)", () => {
    const reports = paintReports();
    reports.paint();
    const then = vi.fn();
    afterFirstPaint(then, 3000);
    expect(reports.watching()).toBe(0);
    vi.advanceTimersByTime(0);
    expect(then).toHaveBeenCalledTimes(1);
  });

  it("runs at the limit when no paint comes (a tab opened in the background)", () => {
    paintReports();
    const then = vi.fn();
    afterFirstPaint(then, 3000);
    vi.advanceTimersByTime(2999);
    expect(then).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1);
    expect(then).toHaveBeenCalledTimes(1);
  });

  it("runs after the next frame where the browser does not report paints", () => {
    paintReports({ supported: false });
    const frames: FrameRequestCallback[] = [];
    vi.stubGlobal("requestAnimationFrame", (cb: FrameRequestCallback) => frames.push(cb));
    const then = vi.fn();
    afterFirstPaint(then, 3000);
    vi.advanceTimersByTime(100);
    expect(then).not.toHaveBeenCalled();
    frames.forEach((f) => f(0));
    vi.advanceTimersByTime(0);
    expect(then).toHaveBeenCalledTimes(1);
  });

  it("never runs once cancelled, neither at the paint nor at the limit", () => {
    const reports = paintReports();
    const then = vi.fn();
    const cancel = afterFirstPaint(then, 3000);
    cancel();
    expect(reports.watching()).toBe(0);
    reports.paint();
    vi.advanceTimersByTime(5000);
    expect(then).not.toHaveBeenCalled();
  });
});
