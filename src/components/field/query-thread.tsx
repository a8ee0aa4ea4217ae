"use client";
import { useState } from "react";
import type { LocalAnswer, LocalFind, LocalReview, LocalWeighIn, LodebookDb } from "@/client/device-db";
import { newId, saveAnswer } from "@/client/logbook";
import { requestSync } from "@/client/sync/scheduler";
import { queryStateOf } from "@/lib/club/thread";
import { formatWhen } from "@/lib/format";

const REVIEW_LABEL = { verify: "Verified", query: "Queried", note: "Note" } as const;

type Step =
  | { kind: "review"; id: string; at: number; action: "verify" | "query" | "note"; note: string; by: string | null }
  | { kind: "answer"; id: string; at: number; note: string; sent: boolean }
  | { kind: "edit"; id: string; at: number; what: string };

/**
 * The find's query thread on the member's phone: the officers' reviews, the member's answers
 * and the member's changes since the first review, in order, on the phone's clock. While the
 * latest query is open the member answers here (saved on the device, sent at camp sync)
 * and/or corrects the find in its form below. The reviews and answers come in the find's own
 * read, so the thread is drawn with the find and never pushes the screen down after it.
 */
export function QueryThread({
  db,
  find,
  reviews,
  answers,
  weighIns,
}: {
  db: LodebookDb;
  find: LocalFind;
  reviews: LocalReview[];
  answers: LocalAnswer[];
  weighIns: LocalWeighIn[];
}) {
  const [text, setText] = useState("");
  const [error, setError] = useState<string | null>(null);
  if (reviews.length === 0) return null;
  const data = { reviews, answers };

  const { state, latestQuery } = queryStateOf(data.reviews, data.answers);
  const first = Math.min(...data.reviews.map((r) => r.createdAt));
  // An answer not yet at the club has no server time: the phone's time of writing stands in.
  const steps: Step[] = [
    ...data.reviews.map((r) => ({ kind: "review" as const, id: r.id, at: r.createdAt, action: r.action, note: r.note, by: r.officerName })),
    ...data.answers.map((a) => ({ kind: "answer" as const, id: a.id, at: a.createdAt ?? a.updatedAt, note: a.note, sent: a.createdAt !== undefined })),
    ...(find.updatedAt > first ? [{ kind: "edit" as const, id: "find", at: find.updatedAt, what: "You changed this find." }] : []),
    ...weighIns.filter((w) => w.updatedAt > first).map((w) => ({ kind: "edit" as const, id: w.id, at: w.updatedAt, what: "You weighed it." })),
  ].sort((a, b) => a.at - b.at);

  const send = async () => {
    if (!latestQuery) return;
    setError(null);
    try {
      await saveAnswer(db, { id: newId(), findId: find.id, reviewId: latestQuery.id, note: text });
      setText("");
      requestSync();
    } catch (e) {
      const fields = (e as { fields?: Record<string, string[]> }).fields;
      setError(fields?.note?.[0] ?? (e as Error).message);
    }
  };

  return (
    <section className="sheet flex flex-col gap-2" aria-labelledby="thread-title" data-testid="query-thread" data-state={state}>
      <h2 id="thread-title" className="heading-bar self-start text-lg">
        From the club&apos;s officers
      </h2>
      <ol className="flex flex-col gap-2" data-testid="thread-steps">
        {steps.map((s) => (
          <li key={`${s.kind}:${s.id}`} data-kind={s.kind} data-action={s.kind === "review" ? s.action : undefined} className="border-b border-rule pb-1">
            {s.kind === "review" && (
              <>
                <strong className={s.action === "query" ? "text-rust" : s.action === "verify" ? "text-moss" : ""}>{REVIEW_LABEL[s.action]}</strong>
                {s.by ? ` by ${s.by}` : ""} · <time dateTime={new Date(s.at).toISOString()}>{formatWhen(s.at)}</time>
                {s.note && <span className="block">{s.note}</span>}
              </>
            )}
            {s.kind === "answer" && (
              <>
                <strong>Your answer</strong> ·{" "}
                {s.sent ? <time dateTime={new Date(s.at).toISOString()}>{formatWhen(s.at)}</time> : "on this device, goes at the next camp sync"}
                <span className="block">{s.note}</span>
              </>
            )}
            {s.kind === "edit" && (
              <span className="text-ink-soft">
                {s.what} · <time dateTime={new Date(s.at).toISOString()}>{formatWhen(s.at)}</time>
              </span>
            )}
          </li>
        ))}
      </ol>
      {(state === "queried" || state === "answered") && (
        <div className="flex flex-col gap-2">
          <label className="flex flex-col">
            <span className="field-label">{state === "queried" ? "Your answer to the officer" : "Add to your answer"}</span>
            <textarea rows={3} className="field-input" value={text} onChange={(e) => setText(e.target.value)} />
          </label>
          {error && <p className="field-error">{error}</p>}
          <button type="button" className="btn btn-primary self-start" onClick={() => void send()} disabled={text.trim().length === 0}>
            Send answer
          </button>
          <p className="text-sm text-ink-soft">To correct the find itself, change it in the form below: the officer sees that it changed since the query.</p>
        </div>
      )}
    </section>
  );
}
