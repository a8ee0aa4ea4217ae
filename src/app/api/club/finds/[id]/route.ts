import { requireActor } from "@/server/auth/actor";
import { findForOfficer } from "@/server/club/finds";
import { json, route, routeId } from "@/server/http";

type Ctx = { params: Promise<{ id: string }> };

/** A find as an officer opens it from the ledger. */
export const GET = route<Ctx>(async (req, ctx) => {
  await requireActor(req, "viewLedger", "club");
  return json(findForOfficer(await routeId(ctx, "find", "No such find.")));
});
