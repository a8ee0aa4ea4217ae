import "server-only";
import { and, eq, isNull, ne, sql } from "drizzle-orm";
import type { z } from "zod";
import type { clubSettingsSchema } from "@/lib/club/schemas";
import type { Actor } from "../auth/actor";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { AppError } from "../errors";

export type ClubSettings = { name: string; currency: string; timeZone: string };

/** The club's name, currency and time zone (its one row, made by the migrations). */
export function clubSettings(): ClubSettings {
  const row = getDb()
    .select({ name: t.clubSettings.name, currency: t.clubSettings.currency, timeZone: t.clubSettings.timeZone })
    .from(t.clubSettings)
    .where(eq(t.clubSettings.id, 1))
    .get();
  return row ?? { name: "Our prospecting club", currency: "USD", timeZone: "UTC" };
}

/**
 * Sets the club's name, currency and time zone. The currency holds for every price in force:
 * it changes only once no price in another currency is in force (withdraw them first), so
 * totals never add two currencies. Audited.
 */
export function saveClubSettings(actor: Actor, input: z.infer<typeof clubSettingsSchema>): ClubSettings {
  const db = getDb();
  return db.transaction((tx) => {
    const before = clubSettings();
    if (input.currency !== before.currency) {
      const other = tx
        .select({ n: sql<number>`count(*)` })
        .from(t.referencePrices)
        .where(and(isNull(t.referencePrices.withdrawnAt), ne(t.referencePrices.currency, input.currency)))
        .get()!.n;
      if (other > 0) {
        throw new AppError(
          "conflict:club_settings",
          `${other} reference price${other === 1 ? " is" : "s are"} in force in ${before.currency}. Withdraw them first, then record prices in ${input.currency}.`,
          {
            currency: ["prices in force in another currency"],
          },
        );
      }
    }
    tx.insert(t.clubSettings)
      .values({ id: 1, ...input, updatedAt: Date.now() })
      .onConflictDoUpdate({ target: t.clubSettings.id, set: { ...input, updatedAt: Date.now() } })
      .run();
    audit(tx, { actorId: actor.id, action: "club.settings", entity: "club", entityId: "1", before, after: input });
    return input;
  });
}
