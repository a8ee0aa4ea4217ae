// @vitest-environment jsdom
import { act, cleanup, fireEvent, render, screen } from "@testing-library/react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { UpdatePrompt } from "./update-prompt";

/** A stand-in service worker: its state moves when the test says so. */
class FakeWorker extends EventTarget {
  state: ServiceWorkerState = "installing";
  postMessage = vi.fn();
  moveTo(state: ServiceWorkerState) {
    this.state = state;
    this.dispatchEvent(new Event("statechange"));
  }
}

/** navigator.serviceWorker with one registration, and a page already controlled by a worker (not a first visit). */
function serviceWorkers({ installing = null as FakeWorker | null, waiting = null as FakeWorker | null } = {}) {
  const registration = Object.assign(new EventTarget(), { installing, waiting });
  const container = Object.assign(new EventTarget(), {
    controller: {} as ServiceWorker,
    getRegistration: () => Promise.resolve(registration),
  });
  Object.defineProperty(navigator, "serviceWorker", { value: container, configurable: true });
  return { registration, container };
}

const reload = vi.fn();

describe("UpdatePrompt", () => {
  afterEach(() => {
    cleanup();
    Reflect.deleteProperty(navigator, "serviceWorker");
    vi.unstubAllGlobals();
    reload.mockReset();
  });

  it("shows a worker that was still installing when it mounted, once installed (the prompt comes after the first paint)", async () => {
    const next = new FakeWorker();
    serviceWorkers({ installing: next });
    render(<UpdatePrompt />);
    await act(async () => {});
    expect(screen.queryByText("A new version of Lodebook is ready.")).toBeNull();
    act(() => next.moveTo("installed"));
    expect(screen.getByText("A new version of Lodebook is ready.")).toBeTruthy();
  });

  it("shows a worker found after it mounted, and Later hides it", async () => {
    const { registration } = serviceWorkers();
    render(<UpdatePrompt />);
    await act(async () => {});
    const next = new FakeWorker();
    act(() => {
      registration.installing = next;
      registration.dispatchEvent(new Event("updatefound"));
    });
    act(() => next.moveTo("installed"));
    expect(screen.getByText("A new version of Lodebook is ready.")).toBeTruthy();
    fireEvent.click(screen.getByRole("button", { name: "Later" }));
    expect(screen.queryByText("A new version of Lodebook is ready.")).toBeNull();
  });

  it("Update asks the waiting worker to take over", async () => {
    const waiting = new FakeWorker();
    waiting.state = "installed";
    serviceWorkers({ waiting });
    render(<UpdatePrompt />);
    await act(async () => {});
    fireEvent.click(screen.getByRole("button", { name: "Update" }));
    expect(waiting.postMessage).toHaveBeenCalledWith({ type: "SKIP_WAITING" });
  });

  it("never reloads over typing: the switch asks the member to save first", async () => {
    const { container } = serviceWorkers();
    vi.stubGlobal("location", { ...window.location, reload });
    render(
      <>
        <input aria-label="Notes" />
        <UpdatePrompt />
      </>,
    );
    await act(async () => {});
    fireEvent.input(screen.getByLabelText("Notes"), { target: { value: "quartz with" } });
    act(() => {
      container.dispatchEvent(new Event("controllerchange"));
    });
    expect(reload).not.toHaveBeenCalled();
    expect(screen.getByText("Lodebook was updated. Save what you are typing, then reload.")).toBeTruthy();
  });
});
