import { requireActor } from "@/server/auth/actor";
import { json, route } from "@/server/http";
import { listMembers } from "@/server/queries/members";

/** The club roll, for officers. */
export const GET = route(async (req) => {
  await requireActor(req, "manageMembers", "club");
  return json({ members: listMembers() });
});
