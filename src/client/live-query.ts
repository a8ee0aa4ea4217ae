"use client";
import { liveQuery } from "dexie";
import { useObservable } from "dexie-react-hooks";
import { startTransition } from "react";

type Observer<T> = { next?: (value: T) => void; error?: (error: unknown) => void } | ((value: T) => void);

// Answers waiting to be handed to React. A screen asks several queries at once (its records,
// the claims, the settings), and their answers come back a few milliseconds apart, each in a
// task of its own: handed over one by one, each was drawn and committed on its own, a screen's
// start drawing the same rows three or four times. Those that arrive before the next frame go
// together, in one transition, in the order they came (errors too, so none overtakes an answer).
let waiting: (() => void)[] = [];
let flushing = false;

function handOver(deliver: () => void) {
  waiting.push(deliver);
  if (flushing) return;
  flushing = true;
  const flush = () => {
    flushing = false;
    const now = waiting;
    waiting = [];
    startTransition(() => now.forEach((d) => d()));
  };
  // A hidden page draws no frames: its answers go after a task instead, so none is held back.
  if (typeof requestAnimationFrame === "function" && document.visibilityState === "visible") requestAnimationFrame(flush);
  else setTimeout(flush, 0);
}

/**
 * dexie-react-hooks' useLiveQuery, with each new answer handed to React as a transition. React
 * draws an ordinary update in one go; a transition it draws in slices of a few milliseconds,
 * giving way to taps and keys between them. A camp sync that writes a few hundred records
 * re-reads the screen's queries, and the new list was drawn as one long block of the main
 * thread, on a phone a few hundred milliseconds in which a tap waited. (The hook keeps each
 * answer as it is handed over, at the next frame at the latest, so a component redrawn for
 * another reason, a key typed in it, shows the new answer then: never an older one than it had.)
 */
export function useLiveQuery<T>(querier: () => Promise<T> | T, deps: unknown[]): T | undefined;
export function useLiveQuery<T, D>(querier: () => Promise<T> | T, deps: unknown[], defaultResult: D): T | D;
export function useLiveQuery<T, D>(querier: () => Promise<T> | T, deps: unknown[], defaultResult?: D): T | D | undefined {
  return useObservable(
    () => {
      const source = liveQuery(querier);
      return {
        subscribe(observer: Observer<T>, onError?: (error: unknown) => void) {
          const next = typeof observer === "function" ? observer : observer.next;
          const error = typeof observer === "function" ? onError : observer.error;
          return source.subscribe({
            next: (value) => handOver(() => next?.(value)),
            error: (e) => handOver(() => error?.(e)),
          });
        },
      };
    },
    deps,
    defaultResult,
  );
}
