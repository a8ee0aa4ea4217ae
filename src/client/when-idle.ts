"use client";

/**
 * Runs `then` at the browser's next idle moment, or after `timeoutMs` if none comes; with
 * `afterMs`, only starts waiting for that moment once that long has passed. Where there is no
 * idle callback (Safari), it runs in a task of its own once the delay is over. Returns a
 * cancel, which holds at every stage (during the delay, while waiting for idle).
 */
export function whenIdle(then: () => void, { timeoutMs, afterMs = 0 }: { timeoutMs: number; afterMs?: number }): () => void {
  let idle: number | undefined;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const hasIdle = typeof requestIdleCallback === "function";
  const waitForIdle = () => {
    if (hasIdle) idle = requestIdleCallback(() => then(), { timeout: timeoutMs });
    else then(); // in the delay's own task
  };
  if (afterMs > 0 || !hasIdle) timer = setTimeout(waitForIdle, afterMs);
  else waitForIdle();
  return () => {
    clearTimeout(timer);
    if (idle !== undefined && typeof cancelIdleCallback === "function") cancelIdleCallback(idle);
  };
}
