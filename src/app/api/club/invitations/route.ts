import { invitationInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { invite, listInvitations } from "@/server/club/members";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

export const GET = route(async (req) => {
  await requireActor(req, "manageMembers", "club");
  return json({ invitations: listInvitations() });
});

export const POST = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageMembers", "club");
  const input = await parseJsonBody(req, invitationInputSchema, "invitation");
  return json(await invite(actor, input), { status: 201 });
});
