import "server-only";
import { z } from "zod";
import { wholeNumber } from "@/lib/web/whole-number";
import { audit } from "@/server/audit";
import { requireActor } from "@/server/auth/actor";
import { basemapUploadStatus, receiveBasemapChunk } from "@/server/basemap/upload";
import { getDb } from "@/server/db";
import { AppError } from "@/server/errors";
import { json, parseSearchParams, route } from "@/server/http";
import { spend } from "@/server/limits";
import { requireSameOrigin } from "@/server/origin";

const bytes = (what: string, min = 0, below = `${what} cannot be negative`) =>
  wholeNumber(what, min, Number.MAX_SAFE_INTEGER, {
    type: `${what} must be a whole number of bytes, in decimal digits`,
    min: below,
    max: `${what} is too large`,
  });
const sizeQuery = z.object({ size: bytes("size", 127, "size must be at least the 127-byte header of a PMTiles archive") });
const chunkQuery = sizeQuery.extend({ offset: bytes("offset") });

/** Where an officer's upload of an archive of ?size=N bytes stands (bytes the server holds), to go on after a cut. */
export const GET = route(async (req) => {
  const actor = await requireActor(req, "manageClaims", "basemap");
  const { size } = parseSearchParams(req, sizeQuery, "basemap");
  return json(await basemapUploadStatus(actor, size));
});

/**
 * One chunk (application/octet-stream, at most 4 MB) of a PMTiles archive of ?size=N bytes, at
 * ?offset=M. The first chunk starts the upload; the last puts the archive in place (201).
 */
export const PUT = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "basemap");
  const { offset, size } = parseSearchParams(req, chunkQuery, "basemap");
  if (!(req.headers.get("content-type") ?? "").startsWith("application/octet-stream"))
    throw new AppError("unsupported:chunk", "Send a chunk as application/octet-stream.", { contentType: ["not application/octet-stream"] });
  await spend([["basemapChunkPerAccount", actor.id]]);
  const state = await receiveBasemapChunk(actor, offset, size, req);
  if (state.complete) audit(getDb(), { actorId: actor.id, action: "basemap.upload", entity: "basemap", entityId: null, after: state.basemap ?? null });
  return json(state, { status: state.complete ? 201 : 200 });
});
