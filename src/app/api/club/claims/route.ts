import { MAX_CLAIM_BODY_BYTES } from "@/lib/club/geometry";
import { claimInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { listClaims, saveClaim } from "@/server/club/claims";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

export const GET = route(async (req) => {
  await requireActor(req, "manageClaims", "club");
  return json({ claims: listClaims() });
});

export const POST = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const input = await parseJsonBody(req, claimInputSchema, "claim", MAX_CLAIM_BODY_BYTES);
  return json(saveClaim(actor, null, input), { status: 201 });
});
