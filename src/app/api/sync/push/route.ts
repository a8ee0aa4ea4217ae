import { MAX_PUSH_BYTES, PROTOCOL_VERSION, pushRequestSchema } from "@/lib/sync/protocol";
import { requireActor } from "@/server/auth/actor";
import { AppError } from "@/server/errors";
import { json, parseJsonBody, route } from "@/server/http";
import { clientAddress } from "@/server/client-address";
import { spend } from "@/server/limits";
import { requireSameOrigin } from "@/server/origin";
import { applyPushGrouped } from "@/server/sync/push";

/** Camp sync, device → server: a batch of changes applied exactly once. */
export const POST = route(async (req) => {
  requireSameOrigin(req);
  // Who and how often before reading up to MAX_PUSH_BYTES: a stranger's body costs nothing.
  const actor = await requireActor(req, "logFinds", "push");
  await spend([
    ["pushPerAccount", actor.id],
    ["pushPerAddress", clientAddress(req)],
  ]);
  const push = await parseJsonBody(req, pushRequestSchema, "push", MAX_PUSH_BYTES);
  if (push.protocolVersion !== PROTOCOL_VERSION) {
    throw new AppError("gone:protocol", "This copy of Lodebook is out of date. Reload to update it; your changes stay on the device.");
  }
  return json(await applyPushGrouped(actor, push));
});
