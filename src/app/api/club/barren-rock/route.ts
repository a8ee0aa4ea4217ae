import { z } from "zod";
import { wholeNumber } from "@/lib/web/whole-number";
import { requireActor } from "@/server/auth/actor";
import { claimBarrenRock } from "@/server/club/barren-rock";
import { json, parseSearchParams, route } from "@/server/http";

const querySchema = z.object({ claimId: z.uuid("Not a valid claim id."), season: wholeNumber("season", 2000, 2100) }).strict();

/** A claim's barren-rock weigh-ins of a season and the host density they propose (accepted through the claim's profile). */
export const GET = route(async (req) => {
  await requireActor(req, "manageClaims", "club");
  const q = parseSearchParams(req, querySchema, "barren_rock");
  return json(claimBarrenRock(q.claimId, q.season));
});
