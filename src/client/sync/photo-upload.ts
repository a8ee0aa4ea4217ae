import type { Answer } from "./transport";
import { photoUploadStatus, sendPhotoChunk } from "./transport";

/**
 * 256 kB: about 2 s of a 1 Mbit/s uplink, so a "sending…" answer comes often, and a typical
 * shrunk photo (~170 kB) goes in one request with no extra round trip. The server keeps
 * whatever arrives of a cut chunk, so the chunk size does not bound what a cut costs.
 */
export const CHUNK_BYTES = 256 * 1024;
/** Two photos at once: one's round trip (600 ms on a satellite link) overlaps the other's bytes. */
export const PARALLEL_UPLOADS = 2;
/** Cuts in a row, without a byte getting through, before camp sync stops and waits for the link. */
const CUTS_WITHOUT_PROGRESS = 4;

type Failure = Extract<Answer<unknown>, { ok: false }>;
const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * Sends one photo in chunks from where the server stands. It starts at 0 (or where the server
 * says it holds more: a 409 names its offset), and after a cut link asks the server what
 * arrived and goes on from there, so a cut costs only the bytes in flight. `onBytes` is told
 * how the server's count moved.
 */
export async function sendPhoto(
  photo: { id: string; blob: Blob },
  onBytes: (delta: number) => void,
  wait: (ms: number) => Promise<unknown> = pause,
): Promise<{ ok: true } | Failure> {
  const size = photo.blob.size;
  let offset = 0;
  let misses = 0;
  const moveTo = (received: number) => {
    onBytes(received - offset);
    if (received > offset) misses = 0;
    offset = received;
  };
  for (;;) {
    const answer = await sendPhotoChunk(photo.id, offset, photo.blob.slice(offset, Math.min(size, offset + CHUNK_BYTES)));
    if (answer.ok) {
      moveTo(answer.body.received);
      if (answer.body.complete) return { ok: true };
      continue;
    }
    if (answer.kind !== "offset" && answer.kind !== "offline") return answer;
    if (++misses > CUTS_WITHOUT_PROGRESS) return answer;
    if (answer.kind === "offset" && Number.isFinite(answer.expected)) {
      moveTo(answer.expected!);
      continue;
    }
    // The link was cut: no signal at all waits for the next sync; a poor one tries again shortly.
    if (typeof navigator !== "undefined" && navigator.onLine === false) return answer;
    await wait(1000 * misses);
    const state = await photoUploadStatus(photo.id);
    if (state.ok) {
      moveTo(state.body.received);
      if (state.body.complete) return { ok: true };
    }
  }
}
