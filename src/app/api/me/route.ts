import { CAPABILITIES } from "@/lib/roles";
import { requireActor } from "@/server/auth/actor";
import { json, route } from "@/server/http";

/** Who the session belongs to, and what the role may do (the UI reads the same map). */
export const GET = route(async (req) => {
  const actor = await requireActor(req);
  return json({ member: actor, capabilities: CAPABILITIES[actor.role] });
});
