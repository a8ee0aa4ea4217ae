// @vitest-environment jsdom
import "fake-indexeddb/auto";
import { act, cleanup, render, screen, waitFor } from "@testing-library/react";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import type { LodebookDb } from "./device-db";
import type { SyncStatus } from "./sync/status";

// useQueryOnceCopied: a fresh device's screens wait (skeleton) for the first camp sync's copy of
// the member's logbook, not say "none yet" and then push their forms down when it arrives.
// The "gave up" latch lives for a page's life: each test loads the modules afresh.

let db: LodebookDb;
let counter = 0;
let setStatus: (s: SyncStatus) => void;
let Scales: (props: { testId?: string }) => React.ReactElement;
let Find: (props: { id: string }) => React.ReactElement;
let drawn: string[];
let reads: number;

beforeEach(async () => {
  vi.resetModules();
  const { memberDb } = await import("./device-db");
  const { syncStatus } = await import("./sync/status");
  const { useQueryOnceCopied } = await import("./first-copy");
  db = memberDb(`first-copy-${counter++}`);
  setStatus = (s) => act(() => syncStatus.set(s));
  drawn = [];
  reads = 0;
  Scales = function Scales({ testId = "scales" }) {
    const scales = useQueryOnceCopied(db, () => {
      reads++;
      return db.scales.toArray();
    }, []);
    const text = scales === undefined ? "waiting" : scales.map((s) => s.name).join(",") || "none yet";
    drawn.push(text);
    return <p data-testid={testId}>{text}</p>;
  };
  Find = function Find({ id }) {
    const read = useQueryOnceCopied(
      db,
      async () => ({ find: (await db.finds.get(id)) ?? null }),
      [id],
      (r) => r.find !== null,
    );
    return <p data-testid="find">{read === undefined ? "waiting" : read.find ? `find ${read.find.id}` : "not on this device"}</p>;
  };
});

afterEach(async () => {
  cleanup();
  db.close();
});

const scale = (name: string) => ({ id: name, name, stepGrams: 0.01, accuracyGrams: null, checks: [], updatedAt: 1 });
const shown = () => screen.getByTestId("scales").textContent;
/** Lets the device's queries answer (live queries hand over at the next frame or task). */
const settle = () => act(() => new Promise((r) => setTimeout(r, 50)));

describe("a screen on a device that has never synced", () => {
  it("waits while the first sync runs, then shows its records and the empty store never", async () => {
    render(<Scales />);
    await settle();
    expect(shown()).toBe("waiting");
    setStatus({ kind: "syncing", phase: "receiving", done: 0, total: 1, bytesDone: 0, bytesTotal: 0 });
    await settle();
    expect(shown()).toBe("waiting");
    // A sync that ends well has stored its cursor with the records (one transaction).
    await db.transaction("rw", [db.scales, db.meta], async () => {
      await db.scales.bulkPut([scale("Pocket scale"), scale("Bench scale")]);
      await db.meta.put({ key: "cursor", value: 25 });
    });
    setStatus({ kind: "done", at: Date.now(), sent: 0, received: 2, rejected: 0 });
    await waitFor(() => expect(shown()).toBe("Bench scale,Pocket scale"));
    expect(new Set(drawn)).toEqual(new Set(["waiting", "Bench scale,Pocket scale"]));
  });

  it("does not take a sync's 'done' for the copy: it waits for the cursor", async () => {
    render(<Scales />);
    setStatus({ kind: "done", at: Date.now(), sent: 0, received: 0, rejected: 0 });
    await settle();
    expect(shown()).toBe("waiting");
    await act(() => db.meta.put({ key: "cursor", value: 0 }));
    await waitFor(() => expect(shown()).toBe("none yet"));
  });

  it.each<SyncStatus>([
    { kind: "offline", waiting: 0, rejected: 0, lastSyncedAt: null },
    { kind: "error", message: "the club's server did not answer", retryAt: 0, waiting: 0 },
    { kind: "needs-sign-in", waiting: 0, reason: "expired" },
    { kind: "outdated", waiting: 0 },
  ])("shows what the device holds once the first sync has ended without a copy ($kind)", async (ended) => {
    await db.scales.put(scale("Typed before signal"));
    render(<Scales />);
    await waitFor(() => expect(reads).toBeGreaterThan(0));
    await settle();
    expect(shown()).toBe("waiting");
    setStatus(ended);
    await waitFor(() => expect(shown()).toBe("Typed before signal"));
    // A retry later does not put the screen back to waiting.
    setStatus({ kind: "syncing", phase: "sending", done: 0, total: 1, bytesDone: 0, bytesTotal: 0 });
    await settle();
    expect(shown()).toBe("Typed before signal");
  });
});

describe("a screen on a device whose first copy takes several pull pages", () => {
  const scaleChange = (name: string, seq: number) => ({ seq, entity: "scale" as const, op: "put" as const, value: scale(name) });

  it("waits through every page, and shows the whole copy at once after the last", async () => {
    const { applyPullPage } = await import("./sync/apply-pull");
    render(<Scales />);
    setStatus({ kind: "syncing", phase: "receiving", done: 0, total: 1, bytesDone: 0, bytesTotal: 0 });
    await act(() => applyPullPage(db, [scaleChange("Pocket scale", 1)], 500, 0, true));
    await settle();
    expect(shown()).toBe("waiting");
    await act(() => applyPullPage(db, [scaleChange("Bench scale", 501)], 1000, 0, true));
    await settle();
    expect(shown()).toBe("waiting");
    await act(() => applyPullPage(db, [scaleChange("Spring scale", 1001)], 1200, 0, false));
    await waitFor(() => expect(shown()).toBe("Bench scale,Pocket scale,Spring scale"));
    // Never a part of the copy on the way.
    expect(new Set(drawn)).toEqual(new Set(["waiting", "Bench scale,Pocket scale,Spring scale"]));
  });

  it("shows what came if the sync ends part-way (the signal lost between pages)", async () => {
    const { applyPullPage } = await import("./sync/apply-pull");
    render(<Scales />);
    await act(() => applyPullPage(db, [scaleChange("Pocket scale", 1)], 500, 0, true));
    await settle();
    expect(shown()).toBe("waiting");
    setStatus({ kind: "offline", waiting: 0, rejected: 0, lastSyncedAt: null });
    await waitFor(() => expect(shown()).toBe("Pocket scale"));
  });
});

describe("a screen on a device that holds its copy", () => {
  it("shows its records at once, before any sync of this visit", async () => {
    await db.meta.put({ key: "cursor", value: 40 });
    await db.scales.put(scale("Pocket scale"));
    render(<Scales />);
    await waitFor(() => expect(shown()).toBe("Pocket scale"));
  });

  it("reads the cursor until it has seen it, not after: a sync that writes only the cursor does not run the screen's read again", async () => {
    await db.meta.put({ key: "cursor", value: 40 });
    render(<Scales />);
    await waitFor(() => expect(shown()).toBe("none yet"));
    // The first answer that saw the cursor still watches it: one more read, then none.
    await act(() => db.meta.put({ key: "cursor", value: 41 }));
    await settle();
    const before = reads;
    await act(() => db.meta.put({ key: "cursor", value: 42 }));
    await settle();
    expect(reads).toBe(before);
    await act(() => db.scales.put(scale("Pocket scale")));
    await waitFor(() => expect(shown()).toBe("Pocket scale"));
  });
});

describe("the first sync's end, wherever the member is", () => {
  it("counts a sync that ended without a copy while no screen that waits was open", async () => {
    setStatus({ kind: "offline", waiting: 0, rejected: 0, lastSyncedAt: null });
    render(<Scales />);
    await waitFor(() => expect(shown()).toBe("none yet"));
  });

  it("tells every screen open then, not the first alone", async () => {
    render(
      <>
        <Scales />
        <Scales testId="scales-2" />
      </>,
    );
    await settle();
    setStatus({ kind: "error", message: "the club's server did not answer", retryAt: 0, waiting: 0 });
    await waitFor(() => expect(shown()).toBe("none yet"));
    await waitFor(() => expect(screen.getByTestId("scales-2").textContent).toBe("none yet"));
  });
});

describe("a record's page on a device that has never synced", () => {
  it("shows a record already on the device at once, and waits before saying one is not here", async () => {
    await db.finds.put({ id: "saved-here" } as never);
    const { unmount } = render(<Find id="saved-here" />);
    await waitFor(() => expect(screen.getByTestId("find").textContent).toBe("find saved-here"));
    unmount();
    render(<Find id="from-the-club" />);
    await settle();
    expect(screen.getByTestId("find").textContent).toBe("waiting");
    await act(() => db.meta.put({ key: "cursor", value: 3 }));
    await waitFor(() => expect(screen.getByTestId("find").textContent).toBe("not on this device"));
  });
});
