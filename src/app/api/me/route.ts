import { CAPABILITIES } from "@/lib/roles";
import { requireActor } from "@/server/auth/actor";
import { json, route } from "@/server/http";
import { datePatternFor } from "@/server/locale/date-patterns";

/**
 * Who the session belongs to, and what the role may do (the UI reads the same map), with the
 * date pattern of the browser's language, which the device keeps to write dates with no Intl
 * formatter (date-pattern.ts).
 */
export const GET = route(async (req) => {
  const actor = await requireActor(req);
  return json({ member: actor, capabilities: CAPABILITIES[actor.role], datePattern: datePatternFor(req) });
});
