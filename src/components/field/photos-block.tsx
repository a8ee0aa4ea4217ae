"use client";
import { useLiveQuery } from "dexie-react-hooks";
import { useEffect, useMemo, useState } from "react";
import { useDropzone } from "react-dropzone";
import type { LodebookDb, LocalPhoto } from "@/client/device-db";
import { deletePhoto } from "@/client/logbook";
import { addPhoto, StorageFullError } from "@/client/photos";
import { requestSync } from "@/client/sync/scheduler";

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
    try {
      let fromPhoto = false;
      for (const file of files) {
        const result = await addPhoto(db, findId, file);
        fromPhoto ||= result.positionFromPhoto;
      }
      setMessage({ tone: "ok", text: fromPhoto ? "Photo saved. The find's position was taken from the photo." : "Photo saved on this device." });
      requestSync();
    } catch (error) {
      setMessage({ tone: "bad", text: error instanceof StorageFullError ? error.message : `That photo could not be read (${(error as Error).message}). Try another.` });
    } finally {
      setBusy(false);
    }
  }

  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    accept: { "image/jpeg": [".jpg", ".jpeg"], "image/png": [".png"], "image/webp": [".webp"] },
    maxSize: 40 * 1024 * 1024,
    onDrop: (accepted, refused) => {
      if (refused.length) setMessage({ tone: "bad", text: "Only JPEG, PNG or WebP photos up to 40 MB." });
      if (accepted.length) void take(accepted);
    },
  });

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
      <div {...getRootProps({ className: `rounded-md border-2 border-dashed p-4 text-center ${isDragActive ? "border-ochre" : "border-rule"}` })}>
        <input {...getInputProps({ "aria-label": "Add photos" })} data-testid="photo-input" />
        <p>{busy ? "Shrinking and saving…" : "Drop photos here, or tap to choose"}</p>
      </div>
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
