import { z } from "zod";
import { wholeNumber } from "@/lib/web/whole-number";
import { requireActor } from "@/server/auth/actor";
import { AppError } from "@/server/errors";
import { json, parseSearchParams, route, routeId } from "@/server/http";
import { spend } from "@/server/limits";
import { requireSameOrigin } from "@/server/origin";
import { receiveChunk, uploadStatus } from "@/server/photo-uploads";

type Ctx = { params: Promise<{ id: string }> };
const chunkQuery = z.object({
  offset: wholeNumber("offset", 0, 1e9, {
    type: "offset must be a whole number of bytes, in decimal digits",
    min: "offset cannot be negative",
    max: "offset is past any photo's end",
  }),
});

/** Where a chunked upload stands, so a device resumes after a cut link: bytes held of the total. */
export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req, "logFinds", "photo");
  const id = await routeId(ctx, "photo", "No such photo.");
  return json(await uploadStatus(actor, id));
});

/** One chunk of a photo's bytes at ?offset=N (application/octet-stream); the last one stores the photo. */
export const PUT = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "logFinds", "photo");
  const id = await routeId(ctx, "photo", "No such photo.");
  const { offset } = parseSearchParams(req, chunkQuery, "offset");
  if (!(req.headers.get("content-type") ?? "").startsWith("application/octet-stream"))
    throw new AppError("unsupported:chunk", "Send a chunk as application/octet-stream.", { contentType: ["not application/octet-stream"] });
  await spend([["photoPerAccount", actor.id]]);
  const result = await receiveChunk(actor, id, offset, req);
  return json(result, { status: result.stored ? 201 : 200 });
});
