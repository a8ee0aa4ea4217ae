"use client";
import { useCallback, useEffect, useRef, useState } from "react";
import {
  BasemapError,
  canKeepBasemap,
  downloadBasemap,
  mb,
  removeStoredBasemap,
  serverBasemap,
  storedBasemap,
  type ServerBasemap,
  type StoredBasemap,
} from "@/client/basemap-store";

type ServerState = { kind: "checking" } | { kind: "none" } | { kind: "unreachable" } | { kind: "ready"; basemap: ServerBasemap };

const day = (iso: string) => (iso ? new Date(iso).toLocaleDateString(undefined, { dateStyle: "medium" }) : "");

/**
 * Settings' part for the club's basemap on this device: its size before downloading, progress
 * while it comes, whether the server holds a newer one, and removing it. Loaded on its own
 * (React lazy), so Settings' first load does not carry it.
 */
export default function BasemapOffline({ onStored }: { onStored: (bytes: number | null) => void }) {
  const [server, setServer] = useState<ServerState>({ kind: "checking" });
  const [stored, setStored] = useState<StoredBasemap | null | undefined>(undefined);
  const [progress, setProgress] = useState<{ received: number; total: number } | null>(null);
  const [message, setMessage] = useState<{ text: string; error: boolean } | null>(null);
  const abort = useRef<AbortController | null>(null);

  const keep = useCallback(
    (kept: StoredBasemap | null) => {
      setStored(kept);
      onStored(kept?.bytes ?? null);
    },
    [onStored],
  );
  const readStored = () =>
    storedBasemap()
      .catch(() => null)
      .then(keep);

  useEffect(() => {
    storedBasemap()
      .catch(() => null)
      .then(keep);
    let live = true;
    const controller = new AbortController();
    const timer = setTimeout(() => controller.abort(), 15_000);
    serverBasemap(controller.signal)
      .then((basemap) => live && setServer(basemap ? { kind: "ready", basemap } : { kind: "none" }))
      .catch(() => live && setServer({ kind: "unreachable" }))
      .finally(() => clearTimeout(timer));
    return () => {
      live = false;
      controller.abort();
      abort.current?.abort();
    };
  }, [keep]);

  const download = async () => {
    setMessage(null);
    const controller = new AbortController();
    abort.current = controller;
    setProgress({ received: 0, total: server.kind === "ready" ? server.basemap.bytes : 0 });
    try {
      await downloadBasemap((received, total) => setProgress({ received, total }), controller.signal);
      setMessage({ text: "Kept on this device. The map shows the ground with no signal.", error: false });
    } catch (error) {
      setMessage({ text: error instanceof BasemapError ? error.message : "The download failed. Try again.", error: true });
    } finally {
      abort.current = null;
      setProgress(null);
      await readStored();
    }
  };

  const remove = async () => {
    await removeStoredBasemap();
    setMessage({ text: "Removed from this device. The map shows claims and the grid on plain paper with no signal.", error: false });
    await readStored();
  };

  const latest = server.kind === "ready" ? server.basemap : null;
  const newer = latest && stored && stored.etag !== latest.etag;
  const pct = progress && progress.total > 0 ? Math.floor((100 * progress.received) / progress.total) : 0;

  return (
    <div className="flex flex-col gap-2" data-testid="basemap-section">
      <h3 className="font-bold">The ground under the claims, offline</h3>
      <p className="text-sm text-ink-soft">
        The club&apos;s basemap shows relief, tracks and washes around its claims. Keep a copy on this device and the map shows it with no signal.
      </p>
      {!canKeepBasemap() && <p>This browser cannot keep it: open Lodebook at the club&apos;s https address.</p>}
      {stored && (
        <p data-testid="basemap-stored">
          On this device: <strong>{mb(stored.bytes)}</strong>, kept {day(stored.savedAt)}
          {latest && !newer ? ", the club's latest." : "."}
        </p>
      )}
      {server.kind === "checking" && <p className="text-ink-soft">Asking the club&apos;s server about its basemap…</p>}
      {server.kind === "unreachable" && (
        <p>{stored ? "No link to the club's server: the map uses the copy on this device." : "No link to the club's server: connect to see its basemap."}</p>
      )}
      {server.kind === "none" && !stored && <p>The club has no basemap yet. An officer adds one in the club console.</p>}
      {newer && (
        <p className="font-bold" data-testid="basemap-newer">
          A newer basemap is on the club&apos;s server ({mb(latest.bytes)}, {day(latest.updatedAt)}).
        </p>
      )}
      {progress ? (
        <div className="flex flex-col gap-1" data-testid="basemap-progress">
          <progress className="w-full" max={progress.total || 1} value={progress.received} aria-label="Basemap download" />
          <p className="figure" aria-live="polite">
            {mb(progress.received)} of {mb(progress.total)} ({pct} %)
          </p>
          <button type="button" className="btn self-start" onClick={() => abort.current?.abort()}>
            Stop
          </button>
        </div>
      ) : (
        <div className="flex flex-wrap gap-2">
          {latest && (!stored || newer) && canKeepBasemap() && (
            <button type="button" className="btn btn-primary" onClick={() => void download()}>
              {newer ? `Get the newer basemap (${mb(latest.bytes)})` : `Keep the basemap on this device (${mb(latest.bytes)})`}
            </button>
          )}
          {stored && (
            <button type="button" className="btn" onClick={() => void remove()}>
              Remove it from this device
            </button>
          )}
        </div>
      )}
      {message && (
        <p role={message.error ? "alert" : "status"} className={message.error ? "field-error" : "font-bold text-moss"}>
          {message.text}
        </p>
      )}
    </div>
  );
}
