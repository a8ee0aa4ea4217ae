"use client";
import { liveQuery } from "dexie";
import { useObservable } from "dexie-react-hooks";
import { startTransition } from "react";

type Observer<T> = { next?: (value: T) => void; error?: (error: unknown) => void } | ((value: T) => void);

/**
 * dexie-react-hooks' useLiveQuery, with each new answer handed to React as a transition. React
 * draws an ordinary update in one go; a transition it draws in slices of a few milliseconds,
 * giving way to taps and keys between them. A camp sync that writes a few hundred records
 * re-reads the screen's queries, and the new list was drawn as one long block of the main
 * thread, on a phone a few hundred milliseconds in which a tap waited. (The hook keeps the
 * answer as it arrives, so a component redrawn for another reason, a key typed in it, shows
 * the new answer at once: never an older one than it had.)
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
            next: (value) => startTransition(() => next?.(value)),
            error: (e) => error?.(e),
          });
        },
      };
    },
    deps,
    defaultResult,
  );
}
