import Dexie, { type EntityTable } from "dexie";
import type { Answer } from "@/lib/entities/answer";
import type { ClaimView } from "@/lib/entities/claim";
import type { FineBasis } from "@/lib/figures/fine-basis";
import type { Find } from "@/lib/entities/find";
import type { Outing } from "@/lib/entities/outing";
import type { BarrenRock } from "@/lib/entities/barren-rock";
import type { Photo } from "@/lib/entities/photo";
import type { Scale } from "@/lib/entities/scale";
import type { WeighIn } from "@/lib/entities/weigh-in";
import type { MutationName } from "@/lib/sync/mutations";

/** Device time of the last local write: for display only, never for ordering. */
type Local = { updatedAt: number };

export type LocalOuting = Outing & Local;
/**
 * The server's fine-gold figure for a find, as of the last pull (never sent up): how it was
 * reached, its range, and whether its weigh-in disagrees with its weight. A find saved on the
 * device since has none until camp sync figures it again.
 */
export type ServerFigure = { basis: FineBasis | null; fineGrams: number | null; low: number | null; high: number | null; weighMismatch: boolean };
export type LocalFind = Find & Local & { figure?: ServerFigure | null };
export type LocalWeighIn = WeighIn & Local;
export type LocalScale = Scale & Local;
export type LocalBarrenRock = BarrenRock & Local;
/** A photo with its shrunk JPEG and a thumbnail; `uploaded` is 1 once the server holds the bytes. */
export type LocalPhoto = Photo & Local & { blob: Blob; thumb: Blob; uploaded: 0 | 1 };
export type LocalReview = { id: string; findId: string; action: "verify" | "query" | "note"; note: string; officerName: string | null; createdAt: number };
/** The member's answer to a query; `createdAt` is the server's time once it has arrived there. */
export type LocalAnswer = Answer & Local & { createdAt?: number };

/**
 * One change waiting for camp sync, in the order made (the auto-increment key). Its mutation
 * id for the server is given, and stored, just before it is first sent.
 */
export type OutboxEntry = {
  id?: number;
  mutationId?: number;
  name: MutationName;
  args: unknown;
  entityId: string;
  createdAt: number;
  /**
   * "stuck": the server failed on it (a 5xx) every time, alone; set aside so the rest moves,
   * kept with the server's error id for the member's report to the club.
   */
  state: "pending" | "rejected" | "stuck";
  reason?: string;
  field?: string;
  errorId?: string;
};

export type LocalPrice = { id: string; effectiveOn: string; pricePerTroyOunce: number; currency: string };

export type Setting = { key: string; value: unknown };
export type Meta = { key: string; value: unknown };
/**
 * Meta key, set while a device's first copy of the logbook is part-way through its pull pages
 * (applyPullPage): screens that wait for the copy keep waiting until the last page.
 */
export const FIRST_COPY_UNFINISHED = "firstCopyUnfinished";

export class LodebookDb extends Dexie {
  outings!: EntityTable<LocalOuting, "id">;
  finds!: EntityTable<LocalFind, "id">;
  photos!: EntityTable<LocalPhoto, "id">;
  weighIns!: EntityTable<LocalWeighIn, "id">;
  scales!: EntityTable<LocalScale, "id">;
  barrenRocks!: EntityTable<LocalBarrenRock, "id">;
  claims!: EntityTable<ClaimView, "id">;
  reviews!: EntityTable<LocalReview, "id">;
  answers!: EntityTable<LocalAnswer, "id">;
  prices!: EntityTable<LocalPrice, "id">;
  settings!: EntityTable<Setting, "key">;
  outbox!: EntityTable<OutboxEntry, "id">;
  meta!: EntityTable<Meta, "key">;

  constructor(name: string) {
    super(name);
    // A newer copy of the app (another tab, after an update) upgrades this database: step
    // aside so its upgrade can run, and reload into the new version. Nothing is lost: every
    // write was committed together with its outbox entry.
    this.on("versionchange", () => {
      this.close();
      onNewerSchema();
      return false;
    });
    // Version 1: the logbook's first tables.
    this.version(1).stores({
      outings: "id, startedAt",
      finds: "id, foundAt, outingId, kind",
      photos: "id, findId",
      weighIns: "id, findId",
      claims: "id",
      settings: "key",
      outbox: "++id",
    });
    // Version 2: indexes that let sync find its work without scanning tables (outbox state,
    // photos still to upload), finds by claim, officers' reviews, reference prices, and sync
    // bookkeeping (client id, cursor, mutation counter).
    this.version(2)
      .stores({
        finds: "id, foundAt, outingId, kind, claimId",
        photos: "id, findId, uploaded",
        outbox: "++id, state, entityId",
        reviews: "id, findId",
        prices: "id, effectiveOn",
        meta: "key",
      })
      .upgrade(async (tx) => {
        await tx
          .table("photos")
          .toCollection()
          .modify((p: Partial<LocalPhoto>) => {
            p.uploaded ??= 0;
          });
        await tx
          .table("outbox")
          .toCollection()
          .modify((e: Partial<OutboxEntry>) => {
            e.state ??= "pending";
          });
      });
    // Version 3: the member's scale profiles (with their setup checks) and barren-rock
    // weigh-ins by claim; weigh-ins made before name no scale.
    this.version(3)
      .stores({
        scales: "id",
        barrenRocks: "id, claimId, weighedAt",
      })
      .upgrade(async (tx) => {
        await tx
          .table("weighIns")
          .toCollection()
          .modify((w: Partial<LocalWeighIn>) => {
            w.scaleId ??= null;
            w.scaleCheck ??= null;
          });
      });
    // Version 4: the member's answers to officers' queries, by find. Reviews pulled before
    // came without their time (the pull dropped it): the cursor goes back to 0 so the next
    // camp sync brings every record again, reviews with their times.
    this.version(4)
      .stores({ answers: "id, findId, reviewId" })
      .upgrade(async (tx) => {
        if ((await tx.table("reviews").count()) > 0) await tx.table("meta").put({ key: "cursor", value: 0 });
      });
  }
}

export const DB_VERSION = 4;

let onNewerSchema = () => {
  if (typeof window !== "undefined") window.location.reload();
};

/** What a tab does when a newer version of the app upgrades its database (tests watch it). */
export function whenNewerSchema(handler: () => void): void {
  onNewerSchema = handler;
}

/** Each member has their own database on a device: a second member never sees the first's. */
export const databaseNameFor = (memberId: string) => `lodebook-member-${memberId}`;

const open = new Map<string, LodebookDb>();

export function memberDb(memberId: string): LodebookDb {
  let db = open.get(memberId);
  if (!db) {
    db = new LodebookDb(databaseNameFor(memberId));
    open.set(memberId, db);
  }
  return db;
}

export function closeMemberDbs(): void {
  for (const db of open.values()) db.close();
  open.clear();
}
