"use client";
import { useLiveQuery } from "@/client/live-query";
import { useState, useSyncExternalStore } from "react";
import type { LodebookDb } from "@/client/device-db";
import { useSettings } from "@/client/hooks";
import { saveSettings } from "@/client/settings";
import { requestSync } from "@/client/sync/scheduler";
import { syncStatus } from "@/client/sync/status";
import { formatBytes, photoBytesWords } from "./progress-words";

/**
 * "Records now, photos later", for a weak connection: camp sync sends records and receives the
 * club's changes, and photos stay on this device until the member sends them or turns it off.
 */
export function PhotosLater({ db }: { db: LodebookDb }) {
  const saved = useSettings(db).photosLater;
  // Shown as tapped at once; the stored setting catches up a moment later.
  const [tapped, setTapped] = useState<boolean | null>(null);
  const photosLater = tapped ?? saved;
  const waiting = useLiveQuery(async () => {
    const photos = await db.photos.where("uploaded").equals(0).toArray();
    return { count: photos.length, bytes: photos.reduce((n, p) => n + p.blob.size, 0) };
  }, [db]);
  const count = waiting?.count ?? 0;
  const status = useSyncExternalStore(syncStatus.subscribe, syncStatus.get, syncStatus.get);
  return (
    <section className="sheet flex flex-col gap-2" aria-labelledby="photos-later-title" data-testid="photos-later">
      <h2 id="photos-later-title" className="heading-bar self-start text-lg">
        Photos on a weak connection
      </h2>
      <label className="flex items-start gap-2">
        <input
          type="checkbox"
          className="mt-1 size-5"
          checked={photosLater}
          onChange={async (e) => {
            const on = e.target.checked;
            setTapped(on);
            await saveSettings(db, { photosLater: on });
            if (!on) requestSync();
          }}
        />
        <span>
          <span className="font-bold">Records now, photos later</span>
          <br />
          <span className="text-sm">Camp sync sends your finds and weigh-ins and leaves photos on this device until you send them.</span>
        </span>
      </label>
      {status.kind === "syncing" && status.phase === "photos" && (
        <p className="font-bold" role="status" data-testid="photo-progress">
          {photoBytesWords(status)}
        </p>
      )}
      <p data-testid="photos-waiting">{count === 0 ? "No photos waiting." : `Photos waiting: ${count} (${formatBytes(waiting!.bytes)}).`}</p>
      {photosLater && count > 0 && (
        <button type="button" className="btn self-start" onClick={() => requestSync({ photosNow: true })}>
          Send photos now
        </button>
      )}
    </section>
  );
}
