import { can } from "@/lib/roles";
import { requireActor } from "@/server/auth/actor";
import { describeBasemap } from "@/server/basemap/archive-file";
import { json, route } from "@/server/http";

/**
 * The basemap's size, version (ETag), zoom levels and bounds, or null: a device shows the size
 * before downloading and tells a stored copy from a newer one. Officers also learn why a file
 * placed in the data folder is not served.
 */
export const GET = route(async (req) => {
  const actor = await requireActor(req, undefined, "basemap");
  const { info, problem } = await describeBasemap();
  return json({ basemap: info, ...(problem && can(actor.role, "manageClaims") ? { problem } : {}) });
});
