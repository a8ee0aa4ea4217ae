import { z } from "zod";
import { requireActor } from "@/server/auth/actor";
import { AppError } from "@/server/errors";
import { json, route } from "@/server/http";
import { spend } from "@/server/limits";
import { requireSameOrigin } from "@/server/origin";
import { receivePhoto, servePhoto } from "@/server/photos";

type Ctx = { params: Promise<{ id: string }> };
const idSchema = z.uuid();

async function photoId(ctx: Ctx): Promise<string> {
  const parsed = idSchema.safeParse((await ctx.params).id);
  if (!parsed.success) throw new AppError("not_found:photo", "No such photo.");
  return parsed.data;
}

/** Upload a photo's bytes (after its record synced). Idempotent. */
export const PUT = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "logFinds", "photo");
  const id = await photoId(ctx);
  if (!(req.headers.get("content-type") ?? "").startsWith("image/jpeg")) throw new AppError("unsupported:photo", "Send the photo as image/jpeg.");
  await spend([["photoPerAccount", actor.id]]);
  const result = await receivePhoto(actor, id, req);
  return json(result, { status: result.stored ? 201 : 200 });
});

/** A photo for its owner or an officer: JPEG only, no EXIF, never sniffed as anything else. */
export const GET = route<Ctx>(async (req, ctx) => {
  const actor = await requireActor(req, undefined, "photo");
  const id = await photoId(ctx);
  const bytes = await servePhoto(actor, id);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "Content-Type": "image/jpeg",
      "X-Content-Type-Options": "nosniff",
      "Content-Disposition": "inline",
      "Cache-Control": "private, max-age=86400",
      "Content-Security-Policy": "default-src 'none'",
    },
  });
});
