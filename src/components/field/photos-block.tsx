"use client";
import { useLiveQuery } from "@/client/live-query";
import { lazy, Suspense, useEffect, useMemo, useState } from "react";
import type { LodebookDb, LocalPhoto } from "@/client/device-db";
import { deletePhoto } from "@/client/logbook";
import { requestSync } from "@/client/sync/scheduler";

// The drop area (react-dropzone) loads just after the block itself: the camera button and the
// photos already here show at once.
const PhotoDrop = lazy(() => import("./photo-drop").then((m) => ({ default: m.PhotoDrop })));
const dropPlaceholder = <div className="rounded-md border-2 border-dashed border-edge p-4 text-center">Drop photos here, or tap to choose</div>;

function Thumb({ photo, onDelete }: { photo: LocalPhoto; onDelete: () => void }) {
  // A photo taken on another device has no bytes here: the club's server has it.
  const url = useMemo(() => (photo.thumb.size === 0 ? `/api/photos/${photo.id}` : URL.createObjectURL(photo.thumb)), [photo]);
  useEffect(() => () => (url.startsWith("blob:") ? URL.revokeObjectURL(url) : undefined), [url]);
  return (
    <li className="flex flex-col gap-1">
      {/* eslint-disable-next-line @next/next/no-img-element -- a local blob URL, not an optimisable asset */}
      {url && <img src={url} alt="Photo of the find" className="h-28 w-28 rounded-md border border-rule object-cover" />}
      <span className="text-xs text-ink-soft">{photo.uploaded ? "at the club" : "on this device"}</span>
      <button type="button" className="btn px-2 text-sm" onClick={onDelete}>
        Remove
      </button>
    </li>
  );
}

/** Photos of a find: dropped, chosen or taken with the camera; shrunk and stored on the device. */
export function PhotosBlock({ db, findId }: { db: LodebookDb; findId: string }) {
  const photos = useLiveQuery(() => db.photos.where("findId").equals(findId).toArray(), [db, findId]);
  const [message, setMessage] = useState<{ tone: "ok" | "bad"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function take(files: File[]) {
    setBusy(true);
    setMessage(null);
    // Shrinking and storing load with the first photo added (a precached chunk, so offline too).
    let photosLib: typeof import("@/client/photos") | undefined;
    try {
      photosLib = await import("@/client/photos");
      let fromPhoto = false;
      for (const file of files) {
        const result = await photosLib.addPhoto(db, findId, file);
        fromPhoto ||= result.positionFromPhoto;
      }
      setMessage({ tone: "ok", text: fromPhoto ? "Photo saved. The find's position was taken from the photo." : "Photo saved on this device." });
      requestSync();
    } catch (error) {
      setMessage({
        tone: "bad",
        text:
          photosLib && error instanceof photosLib.StorageFullError ? error.message : `That photo could not be read (${(error as Error).message}). Try another.`,
      });
    } finally {
      setBusy(false);
    }
  }

  const onRefused = () => setMessage({ tone: "bad", text: "Only JPEG, PNG or WebP photos up to 40 MB." });

  return (
    <section className="sheet flex flex-col gap-3" aria-labelledby="photos-title">
      <h2 id="photos-title" className="heading-bar self-start text-lg">
        Photos
      </h2>
      <ul className="flex flex-wrap gap-3">
        {(photos ?? []).map((p) => (
          <Thumb
            key={p.id}
            photo={p}
            onDelete={async () => {
              await deletePhoto(db, p.id);
              requestSync();
            }}
          />
        ))}
      </ul>
      <Suspense fallback={dropPlaceholder}>
        <PhotoDrop busy={busy} onFiles={(files) => void take(files)} onRefused={onRefused} />
      </Suspense>
      <label className="btn self-start">
        Take a photo
        <input
          type="file"
          accept="image/*"
          capture="environment"
          className="sr-only"
          onChange={(e) => {
            const files = Array.from(e.currentTarget.files ?? []);
            if (files.length) void take(files);
            e.currentTarget.value = "";
          }}
        />
      </label>
      {message && (
        <p role="status" className={message.tone === "ok" ? "font-bold text-moss" : "field-error"}>
          {message.text}
        </p>
      )}
    </section>
  );
}
