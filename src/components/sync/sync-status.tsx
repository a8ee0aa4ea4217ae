"use client";
import { useLiveQuery } from "@/client/live-query";
import { IntentLink } from "@/components/intent-link";
import { useSyncExternalStore } from "react";
import type { LodebookDb } from "@/client/device-db";
import { syncStatus } from "@/client/sync/status";
import { requestSync } from "@/client/sync/scheduler";
import type { SyncStatus } from "@/client/sync/status";

function useOnline() {
  return useSyncExternalStore(
    (fn) => {
      window.addEventListener("online", fn);
      window.addEventListener("offline", fn);
      return () => {
        window.removeEventListener("online", fn);
        window.removeEventListener("offline", fn);
      };
    },
    () => navigator.onLine,
    () => true,
  );
}

const since = (ms: number) => {
  const min = Math.round((Date.now() - ms) / 60_000);
  return min < 1 ? "just now" : min < 60 ? `${min} min ago` : `${Math.round(min / 60)} h ago`;
};

/** When the scheduler will really try again (its status carries the moment its timer fires). */
const until = (at: number) => {
  const s = Math.max(0, Math.round((at - Date.now()) / 1000));
  return s < 60 ? `in ${s} s` : `in ${Math.round(s / 60)} min`;
};

const NO_COUNTS = { waiting: 0, rejected: 0, stuck: 0, photos: 0 };

/** What waits, in one read: a sync that changes the outbox re-reads it and redraws once. */
const readCounts = (db: LodebookDb) =>
  db.transaction("r", [db.outbox, db.photos], async () => {
    const state = (s: string) => db.outbox.where("state").equals(s).count();
    const [waiting, rejected, stuck, photos] = await Promise.all([
      state("pending"),
      state("rejected"),
      state("stuck"),
      db.photos.where("uploaded").equals(0).count(),
    ]);
    return { waiting, rejected, stuck, photos };
  });

/** The one place that says what camp sync is doing, from the one status union. */
export function SyncStatusView({ db, compact = false }: { db: LodebookDb; compact?: boolean }) {
  const status: SyncStatus = useSyncExternalStore(syncStatus.subscribe, syncStatus.get, syncStatus.get);
  const online = useOnline();
  const { waiting, rejected, stuck, photos } = useLiveQuery(() => readCounts(db), [db], NO_COUNTS);

  let line: string;
  let tone = "text-ink";
  let progress: number | null = null;
  switch (status.kind) {
    case "syncing": {
      // Items here; the camp-sync screen adds the photos' bytes and the time left (photos-later.tsx).
      const phase = status.phase === "sending" ? "Sending changes" : status.phase === "photos" ? "Sending photos" : "Receiving from the club";
      line = `${phase}: ${status.done} of ${Math.max(status.total, status.done)}`;
      progress = status.phase === "photos" ? (status.bytesTotal ? status.bytesDone / status.bytesTotal : 0) : status.total ? status.done / status.total : 0;
      break;
    }
    case "done":
      line = `Synced ${since(status.at)}: ${status.sent} sent, ${status.received} received.`;
      tone = "text-moss";
      break;
    case "needs-sign-in":
      line =
        status.reason === "other-member"
          ? "Someone else is signed in here. Sign in as yourself to send your changes."
          : "Your session has ended. Sign in again to send your changes; they are safe here.";
      tone = "text-rust";
      break;
    case "outdated":
      line = "This copy of Lodebook is out of date. Reload to update; your changes are safe here.";
      tone = "text-rust";
      break;
    case "error":
      line = `Sync stopped: ${status.message} Trying again ${until(status.retryAt)}.`;
      tone = "text-rust";
      break;
    case "offline":
      // A network, but no way through to the club's server (a camp's Wi-Fi with no way out).
      line = "The club's server cannot be reached from here. Camp sync keeps trying; everything is kept on this device.";
      break;
    default:
      line = online ? "Ready to sync." : "No signal: everything is kept on this device until camp sync.";
  }
  if (!online && status.kind !== "syncing") line = "No signal: everything is kept on this device until camp sync.";

  return (
    <section
      aria-label="Camp sync"
      className={`sheet relative flex flex-col gap-2 ${compact ? "py-2" : ""}`}
      data-testid="sync-status"
      data-kind={online ? status.kind : "offline"}
    >
      <p className={`font-bold ${tone}`} role="status">
        {line}
      </p>
      {/* Along the card's lower edge, in its padding: a bar that comes and goes with each sync
          must not push the screen below it down and back up (a layout shift on every sync). */}
      {progress !== null && (
        <progress
          className={`absolute inset-x-3 h-1.5 w-auto accent-[var(--ochre)] ${compact ? "bottom-0.5" : "bottom-1.5"}`}
          value={progress}
          max={1}
          aria-label="Sync progress"
        >
          {Math.round(progress * 100)} %
        </progress>
      )}
      <p className="text-sm" data-testid="sync-waiting">
        Waiting to send: <strong>{waiting}</strong> change{waiting === 1 ? "" : "s"}
        {photos > 0 && (
          <>
            , <strong>{photos}</strong> photo{photos === 1 ? "" : "s"}
          </>
        )}
        {stuck > 0 && (
          <>
            {" "}
            ·{" "}
            <IntentLink href="/sync" className="font-bold text-rust underline">
              {stuck} stuck on the server
            </IntentLink>
          </>
        )}
        {rejected > 0 && (
          <>
            {" "}
            ·{" "}
            <IntentLink href="/sync" className="font-bold text-rust underline">
              {rejected} refused by the server
            </IntentLink>
          </>
        )}
      </p>
      {!compact && (
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn btn-primary" onClick={() => requestSync()} disabled={!online || status.kind === "syncing"}>
            Sync now
          </button>
          {status.kind === "needs-sign-in" && (
            <a className="btn" href="/sign-in?from=/sync">
              Sign in again
            </a>
          )}
          {status.kind === "outdated" && (
            <button type="button" className="btn" onClick={() => window.location.reload()}>
              Reload
            </button>
          )}
        </div>
      )}
    </section>
  );
}
