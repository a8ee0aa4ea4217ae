import { reviewInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { reviewFind } from "@/server/club/finds";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** Verify, query or annotate a find; the member's device gets it at the next sync. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "reviewFinds", "club");
  const input = await parseJsonBody(req, reviewInputSchema, "review");
  const id = await routeId(ctx, "find", "No such find.");
  return json(reviewFind(actor, id, input), { status: 201 });
});
