// @vitest-environment jsdom
import "fake-indexeddb/auto";
import { act, cleanup, render, screen } from "@testing-library/react";
import Dexie, { type EntityTable } from "dexie";
import { Component, startTransition, type ReactNode } from "react";
import { afterEach, describe, expect, it, vi } from "vitest";
import { useLiveQuery } from "./live-query";

// React's own startTransition, watched: each answer must go through it.
vi.mock("react", async (importOriginal) => {
  const react = await importOriginal<typeof import("react")>();
  return { ...react, startTransition: vi.fn(react.startTransition) };
});

// The app's useLiveQuery (live-query.ts) hands each answer to React as a transition. These check
// that it is still a live query: the default until the first answer, every later write seen,
// a failing query reaching the error boundary, and nothing delivered after unmounting.

type Row = { id: number; name: string };
const open = () => {
  const db = new Dexie(`live-query-${crypto.randomUUID()}`) as Dexie & { rows: EntityTable<Row, "id"> };
  db.version(1).stores({ rows: "id" });
  return db;
};

class Boundary extends Component<{ children: ReactNode }, { error: string | null }> {
  state = { error: null };
  static getDerivedStateFromError(error: Error) {
    return { error: error.message };
  }
  render() {
    return this.state.error ? <p>failed: {this.state.error}</p> : this.props.children;
  }
}

function Count({ db, fail = false }: { db: ReturnType<typeof open>; fail?: boolean }) {
  const names = useLiveQuery(
    async () => {
      if (fail) throw new Error("the query failed");
      return (await db.rows.toArray()).map((r) => r.name);
    },
    [db, fail],
    null,
  );
  return <p data-testid="names">{names === null ? "waiting" : names.join(",") || "none"}</p>;
}

afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
  vi.unstubAllGlobals();
});

describe("useLiveQuery, delivered as transitions", () => {
  it("shows the default until the first answer, then every write", async () => {
    const db = open();
    render(<Count db={db} />);
    expect(screen.getByTestId("names").textContent).toBe("waiting");
    expect((await screen.findByText("none")).textContent).toBe("none");
    const transitions = vi.mocked(startTransition).mock.calls.length;
    expect(transitions).toBeGreaterThan(0);
    await act(() => db.rows.put({ id: 1, name: "nugget" }));
    expect((await screen.findByText("nugget")).textContent).toBe("nugget");
    expect(vi.mocked(startTransition).mock.calls.length).toBeGreaterThan(transitions);
    await act(() => db.rows.bulkPut([{ id: 2, name: "flake" }]));
    expect((await screen.findByText("nugget,flake")).textContent).toBe("nugget,flake");
    db.close();
  });

  it("a failing query reaches the error boundary instead of waiting for ever", async () => {
    const db = open();
    vi.spyOn(console, "error").mockImplementation(() => undefined); // React reports the caught error
    render(
      <Boundary>
        <Count db={db} fail />
      </Boundary>,
    );
    expect((await screen.findByText(/failed:/)).textContent).toBe("failed: the query failed");
    db.close();
  });

  it("stops listening when the screen goes: a later write runs the query no more", async () => {
    const db = open();
    let runs = 0;
    function Counted() {
      const n = useLiveQuery(() => (runs++, db.rows.count()), [], null);
      return <p data-testid="count">{n ?? "waiting"}</p>;
    }
    const { unmount } = render(<Counted />);
    await screen.findByText("0");
    await act(() => db.rows.put({ id: 3, name: "specimen" }));
    await screen.findByText("1");
    const whileShown = runs;
    expect(whileShown).toBeGreaterThanOrEqual(2);
    unmount();
    await act(() => db.rows.put({ id: 4, name: "flake" }));
    await act(() => new Promise((r) => setTimeout(r, 50)));
    expect(runs).toBe(whileShown);
    db.close();
  });
});

describe("useLiveQuery, answers that arrive together", () => {
  it("are drawn together: a screen with two queries is never drawn with one answered and not the other", async () => {
    const db = open();
    await db.rows.bulkPut([
      { id: 1, name: "nugget" },
      { id: 2, name: "flake" },
    ]);
    // The next frame comes 30 ms after an answer (a slow phone's frame; jsdom's frames fall
    // at fixed times, which could split two answers 4 ms apart).
    vi.stubGlobal("requestAnimationFrame", (cb: FrameRequestCallback) => setTimeout(() => cb(performance.now()), 30));
    const drawn: string[] = [];
    function TwoQueries() {
      const names = useLiveQuery(async () => (await db.rows.toArray()).map((r) => r.name).join(","), [], null);
      // Its answer comes a few milliseconds after the other's, in a task of its own (as a
      // screen's several queries do in a browser).
      const count = useLiveQuery(
        async () => {
          const n = await db.rows.count();
          await new Promise((r) => setTimeout(r, 4));
          return n;
        },
        [],
        null,
      );
      drawn.push(`${names ?? "?"}|${count ?? "?"}`);
      return <p data-testid="both">{names !== null && count !== null ? `${names} (${count})` : "waiting"}</p>;
    }
    render(<TwoQueries />);
    expect((await screen.findByText("nugget,flake (2)")).textContent).toBe("nugget,flake (2)");
    expect(drawn.filter((d) => d.includes("?") && d !== "?|?")).toEqual([]);
    // A write re-answers both: again drawn together.
    drawn.length = 0;
    await act(() => db.rows.put({ id: 3, name: "specimen" }));
    expect((await screen.findByText("nugget,flake,specimen (3)")).textContent).toBe("nugget,flake,specimen (3)");
    expect(drawn.filter((d) => d.includes("nugget,flake,specimen|2") || d.includes("nugget,flake|3"))).toEqual([]);
    db.close();
  });
});
