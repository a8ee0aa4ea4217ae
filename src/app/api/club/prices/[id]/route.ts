import { z } from "zod";
import { priceChangeSchema } from "@/lib/club/schemas";
import { requireActor } from "@/server/auth/actor";
import { replacePrice, withdrawPrice } from "@/server/club/prices";
import { AppError } from "@/server/errors";
import { json, parseJsonBody, route } from "@/server/http";
import { requireSameOrigin } from "@/server/origin";

type Ctx = { params: Promise<{ id: string }> };

/** A wrong price: withdrawn with a reason, or replaced by its correction. Audited either way. */
export const POST = route<Ctx>(async (req, ctx) => {
  requireSameOrigin(req);
  const actor = await requireActor(req, "managePrices", "club");
  const change = await parseJsonBody(req, priceChangeSchema, "price");
  const id = z.uuid().safeParse((await ctx.params).id);
  if (!id.success) throw new AppError("not_found:price", "No such price.");
  return json(change.action === "withdraw" ? withdrawPrice(actor, id.data, change.note) : replacePrice(actor, id.data, change.price));
});
