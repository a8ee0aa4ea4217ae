import { z } from "zod";
import { requireActor } from "@/server/auth/actor";
import { resendInvitation, revokeInvitation } from "@/server/club/members";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

const invitationId = (ctx: Ctx) => routeId(ctx, "invitation", "No open invitation with that id.");

/** Resend: a fresh link, the old one stops working. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageMembers", "club");
  await parseJsonBody(req, z.object({ action: z.literal("resend") }).strict(), "invitation");
  return json(await resendInvitation(actor, await invitationId(ctx)));
});

export const DELETE = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageMembers", "club");
  revokeInvitation(actor, await invitationId(ctx));
  return json({ revoked: true });
});
