import { claimProfileInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { saveClaimProfile } from "@/server/club/claims";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** The claim gold profile: fineness and host density, each a range with its source. */
export const PUT = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const input = await parseJsonBody(req, claimProfileInputSchema, "claim_profile");
  const id = await routeId(ctx, "claim", "No such claim.");
  return json(saveClaimProfile(actor, id, input));
});
