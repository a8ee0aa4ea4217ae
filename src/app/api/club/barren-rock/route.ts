import { z } from "zod";
import { requireActor } from "@/server/auth/actor";
import { claimBarrenRock } from "@/server/club/barren-rock";
import { json, parseSearchParams, route } from "@/server/http";

const querySchema = z.object({ claimId: z.uuid("Not a valid claim id."), season: z.coerce.number().int().min(2000).max(2100) }).strict();

/** A claim's barren-rock weigh-ins of a season and the host density they propose (accepted through the claim's profile). */
export const GET = route(async (req) => {
  await requireActor(req, "manageClaims", "club");
  const q = parseSearchParams(req, querySchema, "barren_rock");
  return json(claimBarrenRock(q.claimId, q.season));
});
