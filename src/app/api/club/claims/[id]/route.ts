import { MAX_CLAIM_BODY_BYTES } from "@/lib/club/geometry";
import { claimInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { saveClaim } from "@/server/club/claims";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

export const PUT = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const input = await parseJsonBody(req, claimInputSchema, "claim", MAX_CLAIM_BODY_BYTES);
  const id = await routeId(ctx, "claim", "No such claim.");
  return json(saveClaim(actor, id, input));
});
