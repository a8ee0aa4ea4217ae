import { describe, expect, it } from "vitest";
import { queryStateOf } from "./thread";

// The device's copy of the server's REVIEW_STATE rule (club/figures.ts); the server's own is
// held by tests/integration/query-thread.test.ts.
describe("queryStateOf", () => {
  const r = (id: string, action: "verify" | "query" | "note", createdAt: number) => ({ id, action, createdAt });
  it("follows the latest verify or query; notes ask nothing", () => {
    expect(queryStateOf([], []).state).toBe("new");
    expect(queryStateOf([r("n", "note", 1)], []).state).toBe("new");
    expect(queryStateOf([r("q", "query", 1), r("n", "note", 2)], [])).toEqual({ state: "queried", latestQuery: { id: "q", createdAt: 1 } });
    expect(queryStateOf([r("q", "query", 1), r("v", "verify", 2)], [{ reviewId: "q" }]).state).toBe("verified");
  });
  it("is answered only by an answer naming the latest query", () => {
    const reviews = [r("q1", "query", 1), r("q2", "query", 3)];
    expect(queryStateOf(reviews, [{ reviewId: "q1" }]).state).toBe("queried");
    expect(queryStateOf(reviews, [{ reviewId: "q1" }, { reviewId: "q2" }]).state).toBe("answered");
  });
});
