import { z } from "zod";
import { requireActor } from "@/server/auth/actor";
import { resendInvitation, revokeInvitation } from "@/server/club/members";
import { AppError } from "@/server/errors";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

async function invitationId(ctx: Ctx) {
  const id = z.uuid().safeParse((await ctx.params).id);
  if (!id.success) throw new AppError("not_found:invitation", "No open invitation with that id.");
  return id.data;
}

/** Resend: a fresh link, the old one stops working. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  await parseJsonBody(req, z.object({ action: z.literal("resend") }).strict(), "invitation");
  const actor = await requireActor(req, "manageMembers", "club");
  return json(await resendInvitation(actor, await invitationId(ctx)));
});

export const DELETE = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageMembers", "club");
  revokeInvitation(actor, await invitationId(ctx));
  return json({ revoked: true });
});
