import "server-only";
import { and, asc, eq, gt, inArray, sql, type SQL } from "drizzle-orm";
import type { PullChange, PullEntity, PullResponse } from "@/lib/sync/protocol";
import type { Actor } from "../auth/actor";
import { getDb, type Db } from "../db";
import * as t from "../db/schema";
import { tombstoneHorizon } from "./tombstones";
import type { AnySQLiteColumn } from "drizzle-orm/sqlite-core";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type Row = { seq: number; deletedAt?: number | null; id: string } & Record<string, unknown>;

/** Device-only and server-only columns a pull never sends. */
function publicRecord(row: Record<string, unknown>): Record<string, unknown> {
  const { seq: _s, deletedAt: _d, createdAt: _c, storageKey: _k, ...rest } = row;
  return rest;
}

const withCreatedAt = (r: Row) => ({ ...publicRecord(r), createdAt: r.createdAt });

function changesOf(entity: PullEntity, rows: Row[], shape: (r: Row) => Record<string, unknown> = publicRecord): PullChange[] {
  return rows.map((r) => (r.deletedAt ? { seq: r.seq, entity, op: "del" as const, id: r.id } : { seq: r.seq, entity, op: "put" as const, value: shape(r) }));
}

/**
 * One page of what the member may see after `cursor`: their own records (everyone's for an
 * officer asking for the club), the claims, the reference prices, and officers' reviews of
 * their finds. Read in one transaction with the client's last applied mutation id.
 */
export function pullChanges(actor: Actor, opts: { clientId: string; cursor: number; limit: number; scope: "own" | "club" }): PullResponse {
  const db = getDb();
  return db.transaction((tx) => {
    const head = tx.get<{ value: number | null }>(sql`select value from ${t.sequences} where name = 'change'`)?.value ?? 0;
    const client = tx
      .select({ memberId: t.syncClients.memberId, last: t.syncClients.lastMutationId })
      .from(t.syncClients)
      .where(eq(t.syncClients.id, opts.clientId))
      .get();
    const lastMutationId = client && client.memberId === actor.id ? client.last : 0;
    if (opts.cursor > head) return { changes: [], cursor: 0, more: true, lastMutationId, reset: true, resync: false };
    if (opts.cursor > 0 && opts.cursor < tombstoneHorizon(db.$client))
      return { changes: [], cursor: 0, more: true, lastMutationId, reset: false, resync: true };

    const take = opts.limit + 1;
    const after = (table: { seq: AnySQLiteColumn }) => gt(table.seq, opts.cursor);
    const mine = (table: { memberId: AnySQLiteColumn }): SQL | undefined => (opts.scope === "club" ? undefined : eq(table.memberId, actor.id));
    const page = <
      T extends typeof t.outings | typeof t.finds | typeof t.photos | typeof t.weighIns | typeof t.scales | typeof t.barrenRocks | typeof t.answers,
    >(
      table: T,
    ) =>
      tx
        .select()
        .from(table as typeof t.finds)
        .where(and(after(table), mine(table)))
        .orderBy(asc(table.seq))
        .limit(take)
        .all();

    const hidden = opts.scope === "club" ? positionsHiddenFor(tx, actor) : new Set<string>();
    const changes: PullChange[] = [
      ...changesOf("claim", tx.select().from(t.claims).where(after(t.claims)).orderBy(asc(t.claims.seq)).limit(take).all()),
      // A withdrawn price leaves devices as a deletion; the history stays on the server.
      ...changesOf(
        "price",
        tx
          .select()
          .from(t.referencePrices)
          .where(after(t.referencePrices))
          .orderBy(asc(t.referencePrices.seq))
          .limit(take)
          .all()
          .map((p) => ({ ...p, deletedAt: p.withdrawnAt })),
      ),
      ...changesOf("outing", page(t.outings)),
      ...changesOf("find", page(t.finds), (r) =>
        hidden.has(r.memberId as string) ? { ...publicRecord(r), lat: null, lon: null, accuracyM: null } : publicRecord(r),
      ),
      // `stored`: whether the bytes are here, so a device re-sends them if not (a cut upload, a restored server).
      ...changesOf("photo", page(t.photos), (r) => ({
        ...publicRecord(r),
        stored: r.storageKey != null,
        ...(hidden.has(r.memberId as string) ? { lat: null, lon: null } : {}),
      })),
      ...changesOf("weighIn", page(t.weighIns)),
      ...changesOf("scale", page(t.scales)),
      ...changesOf("barrenRock", page(t.barrenRocks)),
      // A review's and an answer's time is the server's, when it was written: the thread shows it.
      ...changesOf("review", reviewsAfter(tx, actor, opts, take), withCreatedAt),
      ...changesOf("answer", page(t.answers), withCreatedAt),
    ].sort((a, b) => a.seq - b.seq);

    const more = changes.length > opts.limit;
    const pageChanges = more ? changes.slice(0, opts.limit) : changes;
    return { changes: pageChanges, cursor: more ? pageChanges[pageChanges.length - 1].seq : head, more, lastMutationId, reset: false, resync: false };
  });
}

function reviewsAfter(tx: Tx, actor: Actor, opts: { cursor: number; scope: "own" | "club" }, take: number): Row[] {
  return tx
    .select({
      id: t.reviews.id,
      seq: t.reviews.seq,
      findId: t.reviews.findId,
      action: t.reviews.action,
      note: t.reviews.note,
      createdAt: t.reviews.createdAt,
      officerName: t.members.name,
    })
    .from(t.reviews)
    .innerJoin(t.finds, eq(t.finds.id, t.reviews.findId))
    .leftJoin(t.members, eq(t.members.id, t.reviews.officerId))
    .where(and(gt(t.reviews.seq, opts.cursor), opts.scope === "club" ? undefined : eq(t.finds.memberId, actor.id)))
    .orderBy(asc(t.reviews.seq))
    .limit(take)
    .all();
}

/** Members who share only the claim, not the exact spot, with officers. */
function positionsHiddenFor(tx: Tx, actor: Actor): Set<string> {
  const rows = tx
    .select({ id: t.members.id })
    .from(t.members)
    .where(inArray(t.members.locationSharing, ["claim"]))
    .all();
  return new Set(rows.map((r) => r.id).filter((id) => id !== actor.id));
}
