import "server-only";
import { desc, eq } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import type { z } from "zod";
import type { priceInputSchema } from "@/lib/club/schemas";
import type { Actor } from "../auth/actor";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { nextSeq } from "../db/sequence";

/** The club's reference prices, newest first. Never edited: a new price is a new row. */
export function listPrices() {
  return getDb()
    .select({ id: t.referencePrices.id, effectiveOn: t.referencePrices.effectiveOn, pricePerTroyOunce: t.referencePrices.pricePerTroyOunce, currency: t.referencePrices.currency, createdAt: t.referencePrices.createdAt, recordedBy: t.members.name })
    .from(t.referencePrices)
    .leftJoin(t.members, eq(t.members.id, t.referencePrices.recordedBy))
    .orderBy(desc(t.referencePrices.effectiveOn), desc(t.referencePrices.createdAt))
    .all();
}

export function recordPrice(actor: Actor, input: z.infer<typeof priceInputSchema>) {
  const db = getDb();
  return db.transaction((tx) => {
    const id = uuidv7();
    tx.insert(t.referencePrices).values({ id, ...input, recordedBy: actor.id, seq: nextSeq(db.$client) }).run();
    audit(tx, { actorId: actor.id, action: "price.record", entity: "price", entityId: id, after: input });
    return { id };
  });
}
