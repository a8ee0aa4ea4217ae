import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";

// The worker's registration waits for the page to settle (service-worker.ts): these check when
// it happens, with a stand-in for the window object @serwist/next leaves on the page.
describe("registering the service worker", () => {
  let register: ReturnType<typeof vi.fn>;
  let listeners: Map<string, () => void>;
  let readyState: string;

  beforeEach(() => {
    vi.useFakeTimers();
    vi.resetModules();
    register = vi.fn(() => Promise.resolve());
    listeners = new Map();
    readyState = "loading";
    vi.stubGlobal("window", {
      serwist: { register },
      addEventListener: (type: string, fn: () => void) => listeners.set(type, fn),
      removeEventListener: (type: string) => listeners.delete(type),
    });
    vi.stubGlobal("document", {
      get readyState() {
        return readyState;
      },
    });
    // No idle callbacks here: the fallback registers when the settle time is over.
    vi.stubGlobal("requestIdleCallback", undefined);
  });

  afterEach(() => {
    vi.useRealTimers();
    vi.unstubAllGlobals();
  });

  it("waits for the load event and then a few seconds", async () => {
    const { startServiceWorkerWhenSettled } = await import("./service-worker");
    startServiceWorkerWhenSettled();
    vi.advanceTimersByTime(10_000);
    expect(register).not.toHaveBeenCalled();
    readyState = "complete";
    listeners.get("load")!();
    vi.advanceTimersByTime(2_000);
    expect(register).not.toHaveBeenCalled();
    vi.advanceTimersByTime(1_500);
    expect(register).toHaveBeenCalledTimes(1);
  });

  it("registers once, however many ask (a page's settle timer and a direct call)", async () => {
    const { startServiceWorker, startServiceWorkerWhenSettled } = await import("./service-worker");
    readyState = "complete";
    startServiceWorkerWhenSettled();
    startServiceWorker();
    startServiceWorker();
    vi.advanceTimersByTime(10_000);
    expect(register).toHaveBeenCalledTimes(1);
  });

  it("does not register from a page that left before it settled", async () => {
    const { startServiceWorkerWhenSettled } = await import("./service-worker");
    readyState = "complete";
    const stop = startServiceWorkerWhenSettled();
    vi.advanceTimersByTime(1_000);
    stop();
    vi.advanceTimersByTime(10_000);
    expect(register).not.toHaveBeenCalled();
  });
});
