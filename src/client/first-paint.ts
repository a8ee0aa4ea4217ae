"use client";
import { useEffect, useState } from "react";

/**
 * Runs `then` once the page has drawn its first words (the browser's first contentful paint),
 * or after `limitMs` if it has not: a tab opened in the background draws nothing until shown.
 * Work the first screen does not need (the first camp sync, the prompts' chunks) waits for it,
 * so on a slow link it does not share the line with the screen's own files, and on a slow
 * phone its code does not run before the screen's words are up. Later screens of the same
 * page load find the paint done and go at once. Returns a cancel.
 */
export function afterFirstPaint(then: () => void, limitMs = 3000): () => void {
  let done = false;
  let observer: PerformanceObserver | undefined;
  const already = painted();
  const limit = setTimeout(() => run(), already ? 0 : limitMs);
  const stop = () => {
    done = true;
    observer?.disconnect();
    clearTimeout(limit);
  };
  const run = () => {
    if (done) return;
    stop();
    then();
  };
  if (already) return stop; // a later screen of the same page load: the limit of 0 runs it
  if (typeof PerformanceObserver !== "undefined" && (PerformanceObserver.supportedEntryTypes ?? []).includes("paint")) {
    observer = new PerformanceObserver((list) => {
      if (list.getEntriesByName("first-contentful-paint").length > 0) setTimeout(run, 0);
    });
    observer.observe({ type: "paint", buffered: true });
  } else if (typeof requestAnimationFrame === "function") {
    // A browser that does not report paints: after its next frame.
    requestAnimationFrame(() => setTimeout(run, 0));
  } else setTimeout(run, 0);
  return stop;
}

/** Whether the page has drawn its first words: see afterFirstPaint. */
function painted(): boolean {
  return (
    typeof performance !== "undefined" &&
    typeof performance.getEntriesByName === "function" &&
    performance.getEntriesByName("first-contentful-paint").length > 0
  );
}

/** False until the page has drawn its first words (afterFirstPaint), then true. */
export function useAfterFirstPaint(): boolean {
  const [done, setDone] = useState(false);
  useEffect(() => afterFirstPaint(() => setDone(true)), []);
  return done;
}
