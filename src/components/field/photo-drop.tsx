"use client";
import { useDropzone } from "react-dropzone";

/** Photos dropped or chosen from the device's files (JPEG, PNG or WebP; up to 40 MB before shrinking). */
export function PhotoDrop({ busy, onFiles, onRefused }: { busy: boolean; onFiles: (files: File[]) => void; onRefused: () => void }) {
  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    accept: { "image/jpeg": [".jpg", ".jpeg"], "image/png": [".png"], "image/webp": [".webp"] },
    maxSize: 40 * 1024 * 1024,
    onDrop: (accepted, refused) => {
      if (refused.length) onRefused();
      if (accepted.length) onFiles(accepted);
    },
  });
  return (
    <div {...getRootProps({ className: `rounded-md border-2 border-dashed p-4 text-center ${isDragActive ? "border-ochre" : "border-edge"}` })}>
      <input {...getInputProps({ "aria-label": "Add photos" })} data-testid="photo-input" />
      <p>{busy ? "Shrinking and saving…" : "Drop photos here, or tap to choose"}</p>
    </div>
  );
}
