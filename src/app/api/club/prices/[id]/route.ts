import { priceChangeSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { replacePrice, withdrawPrice } from "@/server/club/prices";
import { json, parseJsonBody, route, routeId } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** A wrong price: withdrawn with a reason, or replaced by its correction. Audited either way. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "managePrices", "club");
  const change = await parseJsonBody(req, priceChangeSchema, "price");
  const id = await routeId(ctx, "price", "No such price.");
  return json(change.action === "withdraw" ? withdrawPrice(actor, id, change.note) : replacePrice(actor, id, change.price));
});
