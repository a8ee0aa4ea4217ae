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
