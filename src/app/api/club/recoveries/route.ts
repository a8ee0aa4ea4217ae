import { z } from "zod";
import { wholeNumber } from "@/lib/web/whole-number";
import { recoveryInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { claimRecoveries, recordRecovery } from "@/server/club/recoveries";
import { json, parseJsonBody, parseSearchParams, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

const querySchema = z.object({ claimId: z.uuid("Not a valid claim id."), season: wholeNumber("season", 2000, 2100) }).strict();

/** A claim's melts and assays of a season, estimate against recovered, and the fineness they propose. */
export const GET = route(async (req) => {
  await requireActor(req, "manageClaims", "club");
  const q = parseSearchParams(req, querySchema, "recoveries");
  return json(claimRecoveries(q.claimId, q.season));
});

/** Records a melt of a batch of finds, or an assay of one. */
export const POST = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageClaims", "club");
  const input = await parseJsonBody(req, recoveryInputSchema, "recovery");
  return json(recordRecovery(actor, input), { status: 201 });
});
