import { priceInputSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { listPrices, recordPrice } from "@/server/club/prices";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

export const GET = route(async (req) => {
  await requireActor(req, "viewLedger", "club");
  return json({ prices: listPrices() });
});

export const POST = route(async (req) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "managePrices", "club");
  const input = await parseJsonBody(req, priceInputSchema, "price");
  return json(recordPrice(actor, input), { status: 201 });
});
