"use client";
import { useEffect, useState } from "react";

/** "New version ready": shown when a new service worker waits; reloading switches to it. */
export function UpdatePrompt() {
  const [waiting, setWaiting] = useState<ServiceWorker | null>(null);

  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    let cancelled = false;
    navigator.serviceWorker.getRegistration().then((reg) => {
      if (!reg || cancelled) return;
      if (reg.waiting && navigator.serviceWorker.controller) setWaiting(reg.waiting);
      reg.addEventListener("updatefound", () => {
        const next = reg.installing;
        next?.addEventListener("statechange", () => {
          if (next.state === "installed" && navigator.serviceWorker.controller) setWaiting(next);
        });
      });
    });
    const onChange = () => window.location.reload();
    navigator.serviceWorker.addEventListener("controllerchange", onChange);
    return () => {
      cancelled = true;
      navigator.serviceWorker.removeEventListener("controllerchange", onChange);
    };
  }, []);

  if (!waiting) return null;
  return (
    <div role="status" className="sheet fixed inset-x-3 bottom-20 z-30 flex items-center justify-between gap-3 shadow-lg md:bottom-4 md:left-auto md:w-96">
      <span className="font-bold">A new version of Lodebook is ready.</span>
      <button type="button" className="btn btn-primary" onClick={() => waiting.postMessage({ type: "SKIP_WAITING" })}>
        Update
      </button>
    </div>
  );
}
