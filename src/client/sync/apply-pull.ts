import { CLAIM_KEYS, pickRecord } from "@/lib/entities/keys";
import type { PullChange } from "@/lib/sync/protocol";
import { FIRST_COPY_UNFINISHED, type LocalPhoto, type LodebookDb, type ServerFigure } from "../device-db";

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

/** The device's row for a pulled record. */
function rowFor(entity: Exclude<PullChange["entity"], "settings">, id: string, v: Record<string, unknown>, localPhoto?: LocalPhoto): unknown {
  const updatedAt = typeof v.updatedAt === "number" ? v.updatedAt : Date.now();
  switch (entity) {
    case "outing":
      return { ...pickRecord("outing", v), updatedAt };
    case "find":
      return { ...pickRecord("find", v), updatedAt, figure: figureOf(v) };
    case "photo": {
      // Bytes of a photo taken on another device are fetched when shown, not here.
      const uploaded = v.stored === true ? 1 : localPhoto && localPhoto.blob.size > 0 ? 0 : 1;
      return { ...pickRecord("photo", v), updatedAt, blob: localPhoto?.blob ?? new Blob(), thumb: localPhoto?.thumb ?? new Blob(), uploaded };
    }
    case "weighIn":
      return { ...pickRecord("weighIn", v), updatedAt };
    case "scale":
      return { ...pickRecord("scale", v), updatedAt };
    case "barrenRock":
      return { ...pickRecord("barrenRock", v), updatedAt };
    case "claim":
      return pick(v, CLAIM_KEYS);
    case "review":
      return {
        id,
        findId: v.findId as string,
        action: v.action as "verify",
        note: (v.note as string) ?? "",
        officerName: (v.officerName as string) ?? null,
        createdAt: v.createdAt as number,
      };
    case "answer":
      return { ...pickRecord("answer", v), updatedAt, createdAt: v.createdAt as number };
    case "price":
      return { id, effectiveOn: v.effectiveOn as string, pricePerTroyOunce: v.pricePerTroyOunce as number, currency: v.currency as string };
  }
}

/**
 * Applies one pull page and stores its cursor in the same transaction. A record with a change
 * still waiting on this device is left as the device has it: that change goes up next.
 *
 * `more` says the server has further pages. A device's first copy that takes several pages is
 * marked unfinished (FIRST_COPY_UNFINISHED) from its first page to its last, in the same
 * transactions, so screens waiting for the copy (useQueryOnceCopied) do not draw the first
 * page's records and then move as the later pages arrive. A device that already held a cursor
 * (every device in the field, a resync) is never marked.
 */
export async function applyPullPage(db: LodebookDb, changes: PullChange[], cursor: number, lastMutationId: number, more = false): Promise<void> {
  await db.transaction(
    "rw",
    [db.outings, db.finds, db.photos, db.weighIns, db.scales, db.barrenRocks, db.claims, db.reviews, db.answers, db.prices, db.outbox, db.meta],
    async () => {
      const [held, unfinished] = await db.meta.bulkGet(["cursor", FIRST_COPY_UNFINISHED]);
      const pendingIds = new Set((await db.outbox.where("state").equals("pending").toArray()).map((e) => e.entityId));
      // Each table's changes, last one wins per id (as applying them in order would), written
      // with one bulk call per table: a put per record held the main thread for a first pull.
      const tables = {
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
      } as const;
      type Entity = keyof typeof tables;
      const latest = new Map<Entity, Map<string, Record<string, unknown> | null>>();
      for (const c of changes) {
        if (c.entity === "settings") continue;
        const id = c.op === "put" ? (c.value.id as string) : c.id;
        if (pendingIds.has(id)) continue;
        let byId = latest.get(c.entity);
        if (!byId) latest.set(c.entity, (byId = new Map()));
        byId.delete(id); // keep arrival order for the last change of each id
        byId.set(id, c.op === "put" ? c.value : null);
      }
      const photoIds = [...(latest.get("photo")?.entries() ?? [])].filter(([, v]) => v !== null).map(([id]) => id);
      const localPhotos = new Map((await db.photos.bulkGet(photoIds)).flatMap((p) => (p ? [[p.id, p] as const] : [])));
      for (const [entity, byId] of latest) {
        const puts: unknown[] = [];
        const dels: string[] = [];
        for (const [id, v] of byId) {
          if (v === null) dels.push(id);
          else puts.push(rowFor(entity, id, v, localPhotos.get(id)));
        }
        const table = tables[entity] as unknown as { bulkPut(rows: unknown[]): Promise<unknown>; bulkDelete(ids: string[]): Promise<void> };
        if (dels.length) await table.bulkDelete(dels);
        if (puts.length) await table.bulkPut(puts);
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
      if (more && held === undefined) await db.meta.put({ key: FIRST_COPY_UNFINISHED, value: true });
      else if (!more && unfinished) await db.meta.delete(FIRST_COPY_UNFINISHED);
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
