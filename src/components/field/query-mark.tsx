/** A find's mark while its query thread is open: queried (the member's turn) or answered (the officer's). */
export function QueryMark({ state }: { state: "queried" | "answered" | undefined }) {
  if (!state) return null;
  return state === "queried" ? (
    <span className="rounded border border-rust px-1 text-xs font-bold text-rust" data-testid="query-mark" data-state="queried">
      Queried: your answer?
    </span>
  ) : (
    <span className="rounded border border-rule px-1 text-xs text-ink-soft" data-testid="query-mark" data-state="answered">
      Answered
    </span>
  );
}
