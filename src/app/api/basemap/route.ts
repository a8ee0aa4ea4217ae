import "server-only";
import { Readable } from "node:stream";
import { byteRange } from "@/lib/web/byte-range";
import { audit } from "@/server/audit";
import { requireActor } from "@/server/auth/actor";
import { openBasemap } from "@/server/basemap/archive-file";
import { removeBasemap } from "@/server/basemap/upload";
import { getDb } from "@/server/db";
import { AppError } from "@/server/errors";
import { json, route } from "@/server/http";
import { spend } from "@/server/limits";
import { requireSameOrigin } from "@/server/origin";

/**
 * The club's basemap, a PMTiles archive, to any signed-in member: whole (a device keeping it
 * for offline use) or by byte range (the map reading tiles from it), with its size and ETag.
 * Not kept by browsers' HTTP caches: a device keeps its own copy, and the service worker never
 * caches API answers.
 */
export const GET = route((req) => answer(req, true));

/** The same headers with no body: a HEAD answered by GET would open a stream nobody reads. */
export const HEAD = route((req) => answer(req, false));

async function answer(req: Request, withBody: boolean): Promise<Response> {
  const actor = await requireActor(req, undefined, "basemap");
  const open = await openBasemap();
  if (open.kind === "none") throw new AppError("not_found:basemap", "The club has no basemap yet.");
  if (open.kind === "refused") {
    await open.handle.close();
    throw new AppError("not_found:basemap", "The club's basemap cannot be read: an officer should upload it again.");
  }
  const { handle, info } = open;
  try {
    // A reader holding another version's ETag gets the whole new one, never a piece of it.
    const ifRange = req.headers.get("if-range");
    const range = ifRange !== null && ifRange !== info.etag ? null : byteRange(req.headers.get("range"), info.bytes);
    const headers: Record<string, string> = {
      "Content-Type": "application/vnd.pmtiles",
      "Accept-Ranges": "bytes",
      ETag: info.etag,
      "Last-Modified": new Date(info.updatedAt).toUTCString(),
      "Cache-Control": "private, no-store",
      "Content-Disposition": 'attachment; filename="basemap.pmtiles"',
      "X-Content-Type-Options": "nosniff",
      // Next drops Content-Length from a handler's answer: the archive's size rides here too,
      // for a device's download progress (Content-Range carries it in a range's answer).
      "X-Basemap-Bytes": String(info.bytes),
    };
    if (range === "unsatisfiable") {
      await handle.close();
      const body = { error: { code: "range_not_satisfiable:basemap", message: `The basemap has ${info.bytes} bytes.` } };
      return new Response(JSON.stringify(body), {
        status: 416,
        headers: { ...headers, "Content-Type": "application/json", "Content-Range": `bytes */${info.bytes}` },
      });
    }
    const { start, end } = range ?? { start: 0, end: info.bytes - 1 };
    // What is sent counts, however it was asked for: the whole archive (no range, a range that
    // could not be read, another version's, or one covering it all) as a whole download; a
    // piece by its size.
    if (withBody) {
      const whole = start === 0 && end === info.bytes - 1;
      await spend([whole ? ["basemapWholePerAccount", actor.id] : ["basemapRangeKiBPerAccount", actor.id, Math.ceil((end - start + 1) / 1024)]]);
    }
    const init = {
      status: range ? 206 : 200,
      headers: { ...headers, "Content-Length": String(end - start + 1), ...(range ? { "Content-Range": `bytes ${start}-${end}/${info.bytes}` } : {}) },
    };
    if (!withBody) {
      await handle.close();
      return new Response(null, init);
    }
    const stream = handle.createReadStream({ start, end, autoClose: true });
    return new Response(Readable.toWeb(stream) as ReadableStream<Uint8Array>, init);
  } catch (error) {
    await handle.close();
    throw error;
  }
}

/** An officer removes the club's basemap. Devices keep their copies until their members remove them. */
export const DELETE = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "basemap");
  const removed = await removeBasemap();
  if (removed) audit(getDb(), { actorId: actor.id, action: "basemap.remove", entity: "basemap", entityId: null });
  return json({ removed });
});
