import "server-only";
import fs from "node:fs/promises";
import { AppError } from "./errors";

/**
 * Appends a request's body to a partial file as it streams (a resumable upload's chunk): at
 * most `room` bytes (what is left of the whole) and `maxChunk`. A body cut off by the link keeps
 * what arrived, and the sender asks where to go on; one that runs past either limit is undone
 * to where it started and refused. Returns the bytes written. Photo and basemap uploads use it.
 */
export async function appendChunk(req: Request, file: string, limits: { room: number; maxChunk: number; pastEnd: string; durable?: boolean }): Promise<number> {
  const handle = await fs.open(file, "a");
  let written = 0;
  try {
    if (!req.body) return 0;
    const reader = req.body.getReader();
    for (;;) {
      let part: ReadableStreamReadResult<Uint8Array>;
      try {
        part = await reader.read();
      } catch {
        break; // the link was cut: keep what arrived
      }
      if (part.done) break;
      if (written + part.value.byteLength > Math.min(limits.room, limits.maxChunk)) {
        await reader.cancel().catch(() => undefined);
        await handle.truncate((await handle.stat()).size - written);
        throw written + part.value.byteLength > limits.room
          ? new AppError("bad_request:offset", limits.pastEnd, { offset: ["past the end"] })
          : new AppError("too_large:chunk", `A chunk may be at most ${limits.maxChunk} bytes.`, { chunk: ["too large"] });
      }
      await handle.write(part.value);
      written += part.value.byteLength;
    }
    if (limits.durable) await handle.datasync();
    return written;
  } finally {
    await handle.close();
  }
}
