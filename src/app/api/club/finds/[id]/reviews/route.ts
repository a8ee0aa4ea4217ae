import { z } from "zod";
import { reviewInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { reviewFind } from "@/server/club/finds";
import { AppError } from "@/server/errors";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** Verify, query or annotate a find; the member's device gets it at the next sync. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const input = await parseJsonBody(req, reviewInputSchema, "review");
  const actor = await requireActor(req, "reviewFinds", "club");
  const id = z.uuid().safeParse((await ctx.params).id);
  if (!id.success) throw new AppError("not_found:find", "No such find.");
  return json(reviewFind(actor, id.data, input), { status: 201 });
});
