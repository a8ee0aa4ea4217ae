import { CLAIM_KEYS, pickRecord } from "@/lib/entities/keys";
import type { PullChange } from "@/lib/sync/protocol";
import type { LodebookDb, ServerFigure } from "../device-db";

// eslint-disable-next-line @typescript-eslint/no-explicit-any -- claims arrive as JSON; the keys are CLAIM_KEYS, held equal to the schema
const pick = (value: Record<string, unknown>, keys: readonly string[]): any => Object.fromEntries(keys.map((k) => [k, value[k] ?? null]));

/** The server's figure kept beside a pulled find (columns of its own, never pushed back). */
const figureOf = (v: Record<string, unknown>): ServerFigure => ({
  basis: (v.fineBasis as ServerFigure["basis"]) ?? null,
  fineGrams: (v.latestFineGrams as number | null) ?? null,
  low: (v.latestFineLow as number | null) ?? null,
  high: (v.latestFineHigh as number | null) ?? null,
  weighMismatch: !!v.weighMismatch,
});

/**
 * Applies one pull page and stores its cursor in the same transaction. A record with a change
 * still waiting on this device is left as the device has it: that change goes up next.
 */
export async function applyPullPage(db: LodebookDb, changes: PullChange[], cursor: number, lastMutationId: number): Promise<void> {
  await db.transaction(
    "rw",
    [db.outings, db.finds, db.photos, db.weighIns, db.scales, db.barrenRocks, db.claims, db.reviews, db.answers, db.prices, db.outbox, db.meta],
    async () => {
      const pendingIds = new Set((await db.outbox.where("state").equals("pending").toArray()).map((e) => e.entityId));
      for (const c of changes) {
        const id = c.op === "put" ? (c.value.id as string) : c.id;
        if (pendingIds.has(id)) continue;
        if (c.op === "del") {
          const table = {
            outing: db.outings,
            find: db.finds,
            photo: db.photos,
            weighIn: db.weighIns,
            scale: db.scales,
            barrenRock: db.barrenRocks,
            claim: db.claims,
            review: db.reviews,
            answer: db.answers,
            price: db.prices,
            settings: undefined,
          }[c.entity];
          await table?.delete(id);
          continue;
        }
        const v = c.value;
        const updatedAt = typeof v.updatedAt === "number" ? v.updatedAt : Date.now();
        switch (c.entity) {
          case "outing":
            await db.outings.put({ ...pickRecord("outing", v), updatedAt });
            break;
          case "find":
            await db.finds.put({ ...pickRecord("find", v), updatedAt, figure: figureOf(v) });
            break;
          case "photo": {
            // Bytes of a photo taken on another device are fetched when shown, not here.
            const local = await db.photos.get(id);
            const uploaded = v.stored === true ? 1 : local && local.blob.size > 0 ? 0 : 1;
            await db.photos.put({ ...pickRecord("photo", v), updatedAt, blob: local?.blob ?? new Blob(), thumb: local?.thumb ?? new Blob(), uploaded });
            break;
          }
          case "weighIn":
            await db.weighIns.put({ ...pickRecord("weighIn", v), updatedAt });
            break;
          case "scale":
            await db.scales.put({ ...pickRecord("scale", v), updatedAt });
            break;
          case "barrenRock":
            await db.barrenRocks.put({ ...pickRecord("barrenRock", v), updatedAt });
            break;
          case "claim":
            await db.claims.put(pick(v, CLAIM_KEYS) as never);
            break;
          case "review":
            await db.reviews.put({
              id,
              findId: v.findId as string,
              action: v.action as "verify",
              note: (v.note as string) ?? "",
              officerName: (v.officerName as string) ?? null,
              createdAt: v.createdAt as number,
            });
            break;
          case "answer":
            await db.answers.put({ ...pickRecord("answer", v), updatedAt, createdAt: v.createdAt as number });
            break;
          case "price":
            await db.prices.put({ id, effectiveOn: v.effectiveOn as string, pricePerTroyOunce: v.pricePerTroyOunce as number, currency: v.currency as string });
            break;
        }
      }
      // A full resync marks what it brings; what it never brings is dropped at its end.
      const resync = (await db.meta.get("resync"))?.value as string[] | undefined;
      if (resync) {
        for (const c of changes) if (c.op === "put") resync.push(`${c.entity}:${c.value.id as string}`);
        await db.meta.put({ key: "resync", value: resync });
      }
      // Changes the server applied whose answer never arrived: they are done.
      if (lastMutationId > 0) {
        await db.outbox.filter((e) => e.state === "pending" && e.mutationId !== undefined && e.mutationId <= lastMutationId).delete();
      }
      await db.meta.put({ key: "cursor", value: cursor });
    },
  );
}

/** Starts a full resync (deletions this device may have missed were purged): from cursor 0, marking what arrives. */
export async function beginResync(db: LodebookDb): Promise<void> {
  await db.meta.bulkPut([
    { key: "resync", value: [] },
    { key: "cursor", value: 0 },
  ]);
}

/**
 * Ends a full resync: a record the full pull did not bring was deleted on the server, so it
 * goes from this device too, unless a change to it is still waiting here, or it is a photo
 * whose bytes have not gone up yet (those stay, and go up or are refused with a reason).
 */
export async function finishResync(db: LodebookDb): Promise<number> {
  return db.transaction(
    "rw",
    [db.outings, db.finds, db.photos, db.weighIns, db.scales, db.barrenRocks, db.claims, db.reviews, db.answers, db.prices, db.outbox, db.meta],
    async () => {
      const marks = (await db.meta.get("resync"))?.value as string[] | undefined;
      if (!marks) return 0;
      const seen = new Set(marks);
      const waiting = new Set((await db.outbox.toArray()).map((e) => e.entityId));
      const unsentPhotos = new Set((await db.photos.filter((p) => p.blob.size > 0 && p.uploaded === 0).toArray()).map((p) => p.id));
      const tables = [
        ["outing", db.outings],
        ["find", db.finds],
        ["photo", db.photos],
        ["weighIn", db.weighIns],
        ["scale", db.scales],
        ["barrenRock", db.barrenRocks],
        ["claim", db.claims],
        ["review", db.reviews],
        ["answer", db.answers],
        ["price", db.prices],
      ] as const;
      let dropped = 0;
      for (const [entity, table] of tables) {
        const ids = (await (table as unknown as { toCollection: () => { primaryKeys: () => Promise<string[]> } }).toCollection().primaryKeys()) as string[];
        const gone = ids.filter((id) => !seen.has(`${entity}:${id}`) && !waiting.has(id) && !unsentPhotos.has(id));
        await (table as unknown as { bulkDelete: (ids: string[]) => Promise<void> }).bulkDelete(gone);
        dropped += gone.length;
      }
      await db.meta.delete("resync");
      return dropped;
    },
  );
}
