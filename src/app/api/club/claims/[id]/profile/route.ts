import { z } from "zod";
import { claimProfileInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { saveClaimProfile } from "@/server/club/claims";
import { AppError } from "@/server/errors";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** The claim gold profile: fineness and host density, each a range with its source. */
export const PUT = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const input = await parseJsonBody(req, claimProfileInputSchema, "claim_profile");
  const id = z.uuid().safeParse((await ctx.params).id);
  if (!id.success) throw new AppError("not_found:claim", "No such claim.");
  return json(saveClaimProfile(actor, id.data, input));
});
