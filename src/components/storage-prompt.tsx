"use client";
import { useEffect, useState } from "react";

const ASKED = "lodebook-storage-asked";

/**
 * Once, on the member's home after signing in: asks the browser to keep this device's
 * logbook (persistent storage), saying why. Without it a browser may clear a site's data when
 * space runs low, with changes still waiting for camp sync.
 */
export function StoragePrompt() {
  const [show, setShow] = useState(false);
  useEffect(() => {
    if (!navigator.storage?.persisted || localStorage.getItem(ASKED)) return;
    let live = true;
    void navigator.storage.persisted().then((kept) => live && !kept && setShow(true));
    return () => {
      live = false;
    };
  }, []);
  if (!show) return null;
  const done = (text: string) => {
    localStorage.setItem(ASKED, text);
    setShow(false);
  };
  return (
    <section
      // Over the page, above the tab bar: it arrives after Today is drawn, and pushing Today
      // down would move what the member was about to tap (Lighthouse counted a 0.27 shift).
      // Under the tab bar and its More menu (z-20), which stay usable while it waits.
      className="sheet fixed inset-x-3 bottom-20 z-10 flex flex-col gap-2 border-2 border-ochre shadow-lg md:bottom-6 md:left-auto md:right-6 md:w-96"
      aria-labelledby="keep-title"
      data-testid="storage-prompt"
    >
      <h2 id="keep-title" className="font-bold">
        Keep your logbook on this device?
      </h2>
      {/* Two short lines: the prompt arrives after Today is drawn and must not become the
          screen's largest paint (the field caution is), which would count as a late first view. */}
      <p className="text-sm">Finds wait on this device until camp sync. Allowed to keep its data, a browser short of space will not clear them.</p>
      <div className="flex flex-wrap gap-2">
        <button type="button" className="btn btn-primary" onClick={() => void navigator.storage.persist().then((ok) => done(ok ? "granted" : "refused"))}>
          Keep it on this device
        </button>
        <button type="button" className="btn" onClick={() => done("later")}>
          Not now
        </button>
      </div>
      <p className="text-xs text-ink-soft">You can ask again in Settings.</p>
    </section>
  );
}
