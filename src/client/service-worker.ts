// The service worker's first install fetches and compiles every member screen and chunk (its
// precache): on a phone that is a second or more of CPU, on the cores the first screen needs
// to draw. So the worker is registered once the page has settled: a few seconds after load,
// at an idle moment. A new member signs in first, and the worker installs on the sign-in page
// while they type. (Camp sync does not start it: its module would then be in every member
// screen's first load twice, in the shell's chunk and the screen's.)
// (@serwist/next's own registration is off in next.config.mjs; its window object does this.)

import { whenIdle } from "./when-idle";

const SETTLE_MS = 3000;
let started = false;

type SerwistWindow = Window & { serwist?: { register: () => Promise<unknown> } };

/** Registers the worker, once per page load (later calls do nothing). */
export function startServiceWorker(): void {
  if (started || typeof window === "undefined") return;
  started = true;
  void (window as SerwistWindow).serwist?.register().catch(() => undefined);
}

/** Registers the worker when the page has settled: load, then SETTLE_MS, then an idle moment. */
export function startServiceWorkerWhenSettled(): () => void {
  let stopWaiting = () => {};
  const afterLoad = () => (stopWaiting = whenIdle(startServiceWorker, { afterMs: SETTLE_MS, timeoutMs: 2000 }));
  if (document.readyState === "complete") afterLoad();
  else window.addEventListener("load", afterLoad, { once: true });
  return () => {
    window.removeEventListener("load", afterLoad);
    stopWaiting();
  };
}
