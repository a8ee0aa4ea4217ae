import { memberChangeSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { changeMember } from "@/server/club/members";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** Change a member's role or deactivate them (records kept; sessions end at once). */
export const PATCH = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "manageMembers", "club");
  const change = await parseJsonBody(req, memberChangeSchema, "member");
  const id = await routeId(ctx, "member", "No such member.");
  return json(changeMember(actor, id, change));
});
