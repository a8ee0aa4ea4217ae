import "server-only";
import { and, desc, eq, isNull, lte } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import type { z } from "zod";
import type { priceInputSchema } from "@/lib/club/schemas";
import type { Actor } from "../auth/actor";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { nextSeq } from "../db/sequence";
import { AppError } from "../errors";
import { clubSettings } from "./settings";

type PriceInput = z.infer<typeof priceInputSchema>;
type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

/** A price more than this far from the one in force then asks the officer to confirm it. */
export const PRICE_JUMP = 0.5;

const COLUMNS = {
  id: t.referencePrices.id,
  effectiveOn: t.referencePrices.effectiveOn,
  pricePerTroyOunce: t.referencePrices.pricePerTroyOunce,
  currency: t.referencePrices.currency,
  createdAt: t.referencePrices.createdAt,
  withdrawnAt: t.referencePrices.withdrawnAt,
  replaces: t.referencePrices.replaces,
  note: t.referencePrices.note,
  recordedBy: t.members.name,
};

/**
 * Every reference price ever entered, newest first, withdrawn ones included (the history), each
 * marked with whether it is in force: not withdrawn, in the club's currency.
 */
export function listPrices() {
  const { currency } = clubSettings();
  return getDb()
    .select(COLUMNS)
    .from(t.referencePrices)
    .leftJoin(t.members, eq(t.members.id, t.referencePrices.recordedBy))
    .orderBy(desc(t.referencePrices.effectiveOn), desc(t.referencePrices.createdAt))
    .all()
    .map((p) => ({ ...p, inForce: p.withdrawnAt === null && p.currency === currency }));
}

/** The prices that value finds: in force, newest first. */
export function pricesInForce() {
  return listPrices().filter((p) => p.inForce);
}

/** The price in force on a day (the latest dated on or before it), for the plausibility check. */
function priceOn(tx: Tx, day: string, currency: string) {
  return tx
    .select({ price: t.referencePrices.pricePerTroyOunce, on: t.referencePrices.effectiveOn })
    .from(t.referencePrices)
    .where(and(isNull(t.referencePrices.withdrawnAt), eq(t.referencePrices.currency, currency), lte(t.referencePrices.effectiveOn, day)))
    .orderBy(desc(t.referencePrices.effectiveOn), desc(t.referencePrices.createdAt))
    .get();
}

/** Checks a price against the club's currency and the price in force then; inserts it. */
function insertPrice(tx: Tx, actor: Actor, input: PriceInput, replaces: string | null): string {
  const { currency } = clubSettings();
  if (input.currency !== currency) {
    throw new AppError(
      "bad_request:price",
      `The club keeps its prices in ${currency}. Record this one in ${currency}, or change the club's currency in its settings.`,
      { currency: [`must be ${currency}`] },
    );
  }
  const then = priceOn(tx, input.effectiveOn, currency);
  if (then && !input.confirmJump && Math.abs(input.pricePerTroyOunce / then.price - 1) > PRICE_JUMP) {
    const pct = Math.round(Math.abs(input.pricePerTroyOunce / then.price - 1) * 100);
    const way = input.pricePerTroyOunce > then.price ? "above" : "below";
    throw new AppError(
      "conflict:price_jump",
      `That is ${pct} % ${way} the price in force then (${then.price.toFixed(2)} ${currency} from ${then.on}). Check it; record it anyway if it is right.`,
      {
        pricePerTroyOunce: [`${pct} % ${way} the price then`],
      },
    );
  }
  const id = uuidv7();
  const { confirmJump: _confirmed, ...values } = input;
  tx.insert(t.referencePrices)
    .values({ id, ...values, replaces, recordedBy: actor.id, seq: nextSeq(getDb().$client) })
    .run();
  return id;
}

export function recordPrice(actor: Actor, input: PriceInput) {
  const db = getDb();
  return db.transaction((tx) => {
    const id = insertPrice(tx, actor, input, null);
    audit(tx, { actorId: actor.id, action: "price.record", entity: "price", entityId: id, after: input });
    return { id };
  });
}

function withdrawIn(tx: Tx, actor: Actor, id: string, note: string) {
  const before = tx.select().from(t.referencePrices).where(eq(t.referencePrices.id, id)).get();
  if (!before) throw new AppError("not_found:price", "No such price.");
  if (before.withdrawnAt !== null) throw new AppError("conflict:price", "That price was already withdrawn.");
  tx.update(t.referencePrices)
    .set({ withdrawnAt: Date.now(), withdrawnBy: actor.id, note: note || before.note, seq: nextSeq(getDb().$client) })
    .where(eq(t.referencePrices.id, id))
    .run();
  return before;
}

/** Takes a wrong price out of force; it stays in the history with why. Audited. */
export function withdrawPrice(actor: Actor, id: string, note: string) {
  const db = getDb();
  return db.transaction((tx) => {
    const before = withdrawIn(tx, actor, id, note);
    audit(tx, { actorId: actor.id, action: "price.withdraw", entity: "price", entityId: id, before, after: { note } });
    return { withdrawn: id };
  });
}

/** Withdraws a price and records its correction in one step. Audited. */
export function replacePrice(actor: Actor, id: string, input: PriceInput) {
  const db = getDb();
  return db.transaction((tx) => {
    const before = withdrawIn(tx, actor, id, input.note || "replaced");
    const next = insertPrice(tx, actor, input, id);
    audit(tx, { actorId: actor.id, action: "price.replace", entity: "price", entityId: next, before, after: input });
    return { id: next, withdrawn: id };
  });
}
