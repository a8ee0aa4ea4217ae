import { z } from "zod";
import { can } from "@/lib/roles";
import { PROTOCOL_VERSION, pullQuerySchema } from "@/lib/sync/protocol";
import { requireActor } from "@/server/auth/actor";
import { AppError } from "@/server/errors";
import { json, parseSearchParams, route } from "@/server/http";
import { pullChanges } from "@/server/sync/pull";

const querySchema = pullQuerySchema.extend({ scope: z.enum(["own", "club"]).default("own") });

/** Camp sync, server → device: changes after the device's cursor, one page at a time. */
export const GET = route(async (req) => {
  const actor = await requireActor(req, "logFinds", "pull");
  const query = parseSearchParams(req, querySchema, "pull");
  if (query.protocolVersion !== PROTOCOL_VERSION) {
    throw new AppError("gone:protocol", "This copy of Lodebook is out of date. Reload to update it; your changes stay on the device.");
  }
  if (query.scope === "club" && !can(actor.role, "viewLedger")) throw new AppError("forbidden:pull", "Only officers may pull the whole club.");
  return json(pullChanges(actor, query));
});
