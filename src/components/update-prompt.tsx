"use client";
import { useEffect, useState } from "react";

/** Whether the member has typed into a form since it was last sent (a reload would lose it). */
let typing = false;
if (typeof window !== "undefined") {
  window.addEventListener("input", () => (typing = true), true);
  window.addEventListener("submit", () => (typing = false), true);
}

/**
 * "New version ready": shown at the top (never over a form's Save at the bottom) when a new
 * service worker waits. "Update" switches and reloads; "Later" hides it until the next start.
 * A switch made in another tab never reloads this one while a form here holds typing.
 */
export function UpdatePrompt() {
  const [waiting, setWaiting] = useState<ServiceWorker | null>(null);
  const [later, setLater] = useState(false);
  const [reloadWhenDone, setReloadWhenDone] = useState(false);

  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    let cancelled = false;
    // A first visit's worker takes the page over as soon as it is installed (clientsClaim):
    // that is no new version, and reloading then would load the first screen twice.
    const hadController = navigator.serviceWorker.controller !== null;
    navigator.serviceWorker.getRegistration().then((reg) => {
      if (!reg || cancelled) return;
      if (reg.waiting && navigator.serviceWorker.controller) setWaiting(reg.waiting);
      const watch = (next: ServiceWorker | null) =>
        next?.addEventListener("statechange", () => {
          if (next.state === "installed" && navigator.serviceWorker.controller) setWaiting(next);
        });
      // This prompt comes after the page's first paint: a new worker found before it is still
      // installing, and is watched as one found later.
      watch(reg.installing);
      reg.addEventListener("updatefound", () => watch(reg.installing));
    });
    const onChange = () => {
      if (!hadController) return;
      if (typing) setReloadWhenDone(true);
      else window.location.reload();
    };
    navigator.serviceWorker.addEventListener("controllerchange", onChange);
    return () => {
      cancelled = true;
      navigator.serviceWorker.removeEventListener("controllerchange", onChange);
    };
  }, []);

  if (reloadWhenDone) {
    return (
      <div role="status" className="sheet fixed inset-x-3 top-16 z-30 flex items-center justify-between gap-3 shadow-lg md:left-auto md:w-96">
        <span className="font-bold">Lodebook was updated. Save what you are typing, then reload.</span>
        <button type="button" className="btn" onClick={() => window.location.reload()}>
          Reload
        </button>
      </div>
    );
  }
  if (!waiting || later) return null;
  return (
    <div role="status" className="sheet fixed inset-x-3 top-16 z-30 flex flex-wrap items-center justify-between gap-3 shadow-lg md:left-auto md:w-96">
      <span className="font-bold">A new version of Lodebook is ready.</span>
      <span className="flex gap-2">
        <button type="button" className="btn" onClick={() => setLater(true)}>
          Later
        </button>
        <button
          type="button"
          className="btn btn-primary"
          onClick={() =>
            typing && !window.confirm("Updating reloads the page: what you are typing will be lost. Update now?")
              ? undefined
              : waiting.postMessage({ type: "SKIP_WAITING" })
          }
        >
          Update
        </button>
      </span>
    </div>
  );
}
