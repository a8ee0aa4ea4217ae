import { refigureInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { refigureSeason } from "@/server/club/claims";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** Re-figures one season's finds on the claim with the claim's fineness as it stands now. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const input = await parseJsonBody(req, refigureInputSchema, "refigure");
  const id = await routeId(ctx, "claim", "No such claim.");
  return json(refigureSeason(actor, id, input.season));
});
