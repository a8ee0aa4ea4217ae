"use client";
import { useRef, useState } from "react";
import { formatWhen } from "@/lib/format";
import { api, ApiError } from "./api";

export type BasemapFacts = { bytes: number; etag: string; updatedAt: string; minZoom: number; maxZoom: number; tileType: string };
type Problem = { field: string; message: string; bytes: number };

/** Chunks under the front door's body limit; a cut link costs at most one. */
const CHUNK_BYTES = 4 * 1024 * 1024;
const size = (bytes: number) => (bytes < 1024 * 1024 ? `${Math.ceil(bytes / 1024)} kB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`);

async function sendChunk(file: File, offset: number, signal: AbortSignal): Promise<{ received: number; complete: boolean; basemap?: BasemapFacts }> {
  const res = await fetch(`/api/basemap/upload?offset=${offset}&size=${file.size}`, {
    method: "PUT",
    headers: { "content-type": "application/octet-stream" },
    body: file.slice(offset, Math.min(file.size, offset + CHUNK_BYTES)),
    credentials: "same-origin",
    signal,
  });
  const data = await res.json().catch(() => ({}));
  // The server holds another amount (a chunk cut earlier): go on from there.
  if (res.status === 409 && data?.error?.fields?.offset) return { received: Number(data.error.fields.offset[0]), complete: false };
  if (!res.ok) throw new ApiError(data?.error?.message ?? `The server answered ${res.status}.`, res.status, data?.error?.fields);
  return data;
}

/**
 * The club's basemap in the console: what is there, uploading a PMTiles archive in chunks with
 * progress (going on from where a dropped link stopped), and removing it.
 */
/**
 * `initialSince` is the basemap's date as the page wrote it on the server, in the club's zone:
 * the same text renders and hydrates. A basemap uploaded here is dated in the browser.
 */
export function BasemapUpload({
  initial,
  initialSince,
  timeZone,
  problem,
  maxBytes,
}: {
  initial: BasemapFacts | null;
  initialSince: string;
  timeZone: string;
  problem: Problem | null;
  maxBytes: number;
}) {
  const [current, setCurrent] = useState(initial);
  const [shownProblem, setShownProblem] = useState(problem);
  const [file, setFile] = useState<File | null>(null);
  const [sent, setSent] = useState<number | null>(null);
  const [message, setMessage] = useState<{ text: string; error: boolean } | null>(null);
  const abort = useRef<AbortController | null>(null);

  const upload = async () => {
    if (!file) return;
    if (file.size > maxBytes) return setMessage({ text: `The archive is ${size(file.size)}; the club's server takes at most ${size(maxBytes)}.`, error: true });
    setMessage(null);
    const controller = new AbortController();
    abort.current = controller;
    let offset = 0;
    let failures = 0;
    setSent(0);
    try {
      for (;;) {
        try {
          const state = await sendChunk(file, offset, controller.signal);
          offset = state.received;
          failures = 0;
          setSent(offset);
          if (state.complete) {
            setCurrent(state.basemap ?? null);
            setShownProblem(null);
            setMessage({ text: "The basemap is in place. Members' maps use it now; phones that keep a copy are told a newer one is here.", error: false });
            break;
          }
        } catch (error) {
          if (error instanceof ApiError || controller.signal.aborted || ++failures > 3) throw error;
          // The link dropped: wait, ask where the server stands, go on from there.
          await new Promise((r) => setTimeout(r, 1000 * failures));
          offset = (await api<{ received: number }>(`/api/basemap/upload?size=${file.size}`)).received;
        }
      }
    } catch (error) {
      setMessage({
        text: controller.signal.aborted ? "Upload stopped." : error instanceof Error ? error.message : "The upload failed. Try again.",
        error: !controller.signal.aborted,
      });
    } finally {
      abort.current = null;
      setSent(null);
    }
  };

  const remove = async () => {
    if (!window.confirm("Remove the club's basemap? Members' maps go back to plain paper; phones keep their copies until their members remove them.")) return;
    try {
      await api("/api/basemap", { method: "DELETE" });
      setCurrent(null);
      setShownProblem(null);
      setMessage({ text: "Removed from the club's server.", error: false });
    } catch (error) {
      setMessage({ text: error instanceof Error ? error.message : "Not removed.", error: true });
    }
  };

  return (
    <section className="sheet flex flex-col gap-3" aria-labelledby="basemap-title" data-testid="basemap-upload">
      <h2 id="basemap-title" className="heading-bar self-start text-lg">
        Basemap for members&apos; maps
      </h2>
      <p>
        One PMTiles archive (version 3) of raster tiles (PNG, JPEG or WebP) covering the claims area, at most {size(maxBytes)}. Members see it under the claims
        on their map and can keep it on their phones for use with no signal. It is the ground, not a survey: claim lines stay the club&apos;s drawing.
      </p>
      <p data-testid="basemap-current">
        {current
          ? `In place: ${size(current.bytes)}, ${current.tileType.toUpperCase()} tiles at zoom ${current.minZoom}–${current.maxZoom}, since ${current === initial ? initialSince : formatWhen(Date.parse(current.updatedAt), timeZone)}.`
          : "No basemap yet: members' maps show the claims on plain paper."}
      </p>
      {shownProblem && (
        <p role="alert" className="field-error">
          The file in the data folder ({size(shownProblem.bytes)}) is not served: its {shownProblem.field} {shownProblem.message}.
        </p>
      )}
      <label className="flex flex-col">
        <span className="field-label">PMTiles archive</span>
        <input className="field-input" type="file" accept=".pmtiles,application/vnd.pmtiles" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
      </label>
      {sent !== null && file ? (
        <div className="flex flex-col gap-1">
          <progress className="w-full" max={file.size} value={sent} aria-label="Basemap upload" />
          <p className="figure">
            {size(sent)} of {size(file.size)}
          </p>
          <button type="button" className="btn self-start" onClick={() => abort.current?.abort()}>
            Stop
          </button>
        </div>
      ) : (
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn btn-primary" disabled={!file} onClick={() => void upload()}>
            {current ? "Replace the basemap" : "Upload the basemap"}
          </button>
          {(current || shownProblem) && (
            <button type="button" className="btn" onClick={() => void remove()}>
              Remove the basemap
            </button>
          )}
        </div>
      )}
      {message && (
        <p role={message.error ? "alert" : "status"} className={message.error ? "field-error" : "font-bold text-moss"}>
          {message.text}
        </p>
      )}
    </section>
  );
}
