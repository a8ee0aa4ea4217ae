/**
 * One step of a find's query thread, as both sides read it: an officer's review (verify,
 * query, note), the member's answer, or a change the member made to the find between them.
 * `at` is the server's time (when it arrived there); the thread is in that order.
 */
export type ThreadEvent =
  | { kind: "review"; id: string; at: number; action: "verify" | "query" | "note"; note: string; by: string | null }
  | { kind: "answer"; id: string; at: number; note: string; by: string | null }
  | { kind: "edit"; id: string; at: number; fields: string[] }
  | { kind: "weighIn"; id: string; at: number; removed: boolean };

/** The find fields a member's change can name, worded as the thread says them. */
export const FIND_FIELD_LABELS: Record<string, string> = {
  outingId: "outing",
  claimId: "claim",
  kind: "kind",
  weightGrams: "weight",
  purity: "purity",
  depthCm: "depth",
  method: "method",
  notes: "notes",
  lat: "position",
  lon: "position",
  accuracyM: "position",
  locationSource: "position",
  foundAt: "when found",
};

/** Where a find's query thread stands, from the latest verify or query and the answers to it. */
export type QueryState = "new" | "verified" | "queried" | "answered";

/**
 * The rule the server keeps on the find row (club/figures.ts REVIEW_STATE), for the member's
 * device: the latest verify or query decides; a query with an answer naming it is answered.
 */
export function queryStateOf(
  reviews: readonly { id: string; action: "verify" | "query" | "note"; createdAt: number }[],
  answers: readonly { reviewId: string }[],
): { state: QueryState; latestQuery: { id: string; createdAt: number } | null } {
  let latest: (typeof reviews)[number] | null = null;
  for (const r of reviews) if (r.action !== "note" && (latest === null || r.createdAt >= latest.createdAt)) latest = r;
  if (latest === null) return { state: "new", latestQuery: null };
  if (latest.action === "verify") return { state: "verified", latestQuery: null };
  const answered = answers.some((a) => a.reviewId === latest.id);
  return { state: answered ? "answered" : "queried", latestQuery: { id: latest.id, createdAt: latest.createdAt } };
}
