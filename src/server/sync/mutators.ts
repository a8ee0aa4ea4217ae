import "server-only";
import { z } from "zod";
import { estimateSpecimen } from "@/lib/estimate";
import type { RecordEntity } from "@/lib/entities/keys";
import { reportedEstimateSchema, weighInSchema } from "@/lib/entities/weigh-in";
import { MUTATION_ARGS, type MutationArgs, type MutationName } from "@/lib/sync/mutations";
import type { Actor } from "../auth/actor";
import { insertRow, selectRow, statement, updateRow, type Sqlite } from "../db/rows";
import * as t from "../db/schema";
import { logger } from "../log";
import { inBoundary } from "@/lib/geo";
import { claimFacts, refreshReviewState, refreshWeighInFigures, weighInAdded, type ClaimFacts } from "../club/figures";
import { RejectError } from "./reject";
import { judgeChecks, namedCheckVerdict, serverDensity } from "./scale-checks";

// Server mutators are plain synchronous functions over the push's one SQLite transaction,
// on statements prepared once per connection (see ../db/rows).
/**
 * The push's transaction: its connection, change sequence numbers allocated for the batch, and
 * the finds and outings this push has written and not deleted (the member's own, alive), so a
 * weigh-in or photo sent with its find needs no lookup of it.
 */
export type PushTx = {
  db: Sqlite;
  seq: () => number;
  written: Map<string, "find" | "outing">;
  resendFindsOf: Set<string>;
  claims: Map<string | null, ClaimFacts>;
};
/** A stored record as the push reads it: its owner and tombstone, and the rest of its columns. */
type Owned = { id: string; memberId: string; deletedAt: number | null } & Record<string, unknown>;
type Entity = RecordEntity;
type Table = typeof t.outings | typeof t.finds | typeof t.photos | typeof t.weighIns | typeof t.scales | typeof t.barrenRocks | typeof t.answers;

const ENTITY: Record<Entity, Table> = {
  outing: t.outings,
  find: t.finds,
  photo: t.photos,
  weighIn: t.weighIns,
  scale: t.scales,
  barrenRock: t.barrenRocks,
  answer: t.answers,
};
const TABLE_NAME: Record<Entity, string> = {
  outing: "outings",
  find: "finds",
  photo: "photos",
  weighIn: "weigh_ins",
  scale: "scales",
  barrenRock: "barren_rocks",
  answer: "answers",
};

/**
 * Loads a member record for a write. Another member's record is refused (and logged);
 * a record deleted earlier wins over a late edit, whose content is kept in history.
 */
function loadForWrite(tx: PushTx, entity: Entity, id: string, actor: Actor, incoming?: unknown): Owned | undefined {
  const row = selectRow<Owned>(tx.db, ENTITY[entity], id);
  if (!row) return undefined;
  if (row.memberId !== actor.id) {
    logger.warn({ code: "forbidden:record", entity, id, actor: actor.id }, "push touched another member's record");
    throw new RejectError("not_owner", "This record belongs to another member.", "id");
  }
  if (row.deletedAt !== null) {
    // The written rule: a delete wins over a later edit; the edit is kept in history, not lost.
    const keep = incoming ? { entity, entityId: id, memberId: actor.id, version: { ...(incoming as object), lateEditAfterDelete: true } } : undefined;
    throw new RejectError("deleted", "This record was deleted on another device; your edit is kept in its history.", "id", keep);
  }
  return row;
}

export function keepHistory(db: Sqlite, entity: string, entityId: string, memberId: string, version: Record<string, unknown>) {
  insertRow(db, t.recordHistory, { entity, entityId, memberId, version });
}

/**
 * The parent a change names must be the member's, alive, and of the right kind: a written id of
 * the other kind falls through to the lookup in this kind's table, which refuses it (a foreign
 * key failing at the write would be a 5xx on every resend).
 */
function requireOwnedParent(tx: PushTx, parent: "find" | "outing", id: string, actor: Actor, field: string) {
  if (tx.written.get(id) === parent) return;
  // Raw rows: an array from the driver costs a fraction of an object built property by property.
  const row = statement(tx.db, `select member_id, deleted_at from ${TABLE_NAME[parent]} where id = ?`).raw().get(id) as [string, number | null] | undefined;
  if (!row || row[0] !== actor.id) throw new RejectError("unknown_parent", `The ${parent} this belongs to is not on the server.`, field);
  if (row[1] !== null) throw new RejectError("deleted", `The ${parent} this belongs to was deleted.`, field);
}

function requireClaim(tx: PushTx, claimId: string | null) {
  if (claimId === null) return;
  if (!statement(tx.db, "select 1 from claims where id = ?").get(claimId))
    throw new RejectError("unknown_claim", "That claim is not one of the club's.", "claimId");
}

/**
 * Upsert by id; the version it replaces goes to history (two devices: arrival order decides).
 * `server` holds the server's own fields of the row beside the device's values.
 */
function upsert(tx: PushTx, entity: Entity, existing: Owned | undefined, values: { id: string }, actor: Actor, server?: Record<string, unknown>) {
  const table = ENTITY[entity];
  const extra = server ?? (entity === "photo" ? { memberId: actor.id, seq: tx.seq() } : { memberId: actor.id, seq: tx.seq(), updatedAt: Date.now() });
  if (existing) {
    keepHistory(tx.db, entity, existing.id, actor.id, existing);
    updateRow(tx.db, table, existing.id, values as Record<string, unknown>, extra);
  } else {
    insertRow(tx.db, table, values as Record<string, unknown>, extra);
  }
  if (entity === "find" || entity === "outing") tx.written.set(values.id, entity);
}

function markDeleted(tx: PushTx, entity: Entity, id: string) {
  if (tx.written.get(id) === entity) tx.written.delete(id);
  statement(tx.db, `update ${TABLE_NAME[entity]} set deleted_at = ?, seq = ? where id = ?`).run(Date.now(), tx.seq(), id);
}

/** A claim's fineness and boundary, read once per push. */
function claimFactsOf(tx: PushTx, claimId: string | null): ClaimFacts {
  let f = tx.claims.get(claimId);
  if (!f) tx.claims.set(claimId, (f = claimFacts(tx.db, claimId)));
  return f;
}

/** A delete's check; its write, or nothing when the record never reached the server. */
function tombstone(tx: PushTx, entity: Entity, id: string, actor: Actor, after?: () => void): Write {
  const existing = loadForWrite(tx, entity, id, actor);
  if (!existing) return () => {};
  return () => {
    markDeleted(tx, entity, id);
    after?.();
  };
}

/**
 * A mutator checks everything first and throws RejectError only there; what it returns does
 * the writes. So a refused change has written nothing, with no savepoint per change (which
 * cost a quarter of a push's time).
 */
type Write = () => void;

/** A weigh-in's arguments with the device's estimate checked after the server's recomputation (see weighIn.put). */
const weighInArgsSchema = weighInSchema.extend({ deviceEstimate: z.unknown() });

/** Each change's arguments as its mutator gets them: parsed by its schema (a weigh-in's device estimate checked later). */
type ParsedArgs = { [N in MutationName]: N extends "weighIn.put" ? z.infer<typeof weighInArgsSchema> : MutationArgs<N> };
type Mutators = { [N in MutationName]: (tx: PushTx, actor: Actor, args: ParsedArgs[N]) => Write };

const MUTATORS: Mutators = {
  "outing.put": (tx, actor, o) => {
    const existing = loadForWrite(tx, "outing", o.id, actor, o);
    requireClaim(tx, o.claimId);
    return () => upsert(tx, "outing", existing, o, actor);
  },
  "outing.delete": (tx, actor, { id }) => tombstone(tx, "outing", id, actor),
  "find.put": (tx, actor, f) => {
    const existing = loadForWrite(tx, "find", f.id, actor, f) as (Owned & { claimId: string | null; finenessUsedBasis: string | null }) | undefined;
    requireClaim(tx, f.claimId);
    if (f.outingId) requireOwnedParent(tx, "outing", f.outingId, actor, "outingId");
    return () => {
      // A find is figured with its claim's fineness as it stands when it arrives or moves to
      // another claim; later changes of the claim's fineness leave it as it was (fine-figure.ts).
      const refigure = !existing || existing.claimId !== f.claimId || existing.finenessUsedBasis === null;
      const facts = claimFactsOf(tx, f.claimId);
      const fineness = refigure ? facts : undefined;
      // The ledger flags a position outside the boundary of the claim the find is recorded on.
      const outsideClaim = facts.boundary !== null && f.lat !== null && f.lon !== null && !inBoundary(f.lat, f.lon, facts.boundary);
      upsert(tx, "find", existing, f, actor, {
        memberId: actor.id,
        seq: tx.seq(),
        updatedAt: Date.now(),
        outsideClaim,
        finenessUsed: fineness?.finenessUsed,
        finenessUsedLow: fineness?.finenessUsedLow,
        finenessUsedHigh: fineness?.finenessUsedHigh,
        finenessUsedBasis: fineness?.finenessUsedBasis,
      });
    };
  },
  "find.delete": (tx, actor, { id }) =>
    tombstone(tx, "find", id, actor, () => {
      // Its photos and weigh-ins go with it.
      for (const entity of ["photo", "weighIn"] as const) {
        const children = statement(tx.db, `select id from ${TABLE_NAME[entity]} where find_id = ? and deleted_at is null`).all(id) as { id: string }[];
        for (const c of children) markDeleted(tx, entity, c.id);
      }
    }),
  "photo.put": (tx, actor, p) => {
    const existing = loadForWrite(tx, "photo", p.id, actor, p);
    requireOwnedParent(tx, "find", p.findId, actor, "findId");
    if (existing && existing.sha256 !== p.sha256) {
      throw new RejectError("photo_changed", "A photo cannot change its bytes; add a new photo instead.", "sha256");
    }
    return () => upsert(tx, "photo", existing, p, actor);
  },
  "photo.delete": (tx, actor, { id }) => tombstone(tx, "photo", id, actor),
  "weighIn.put": (tx, actor, w) => {
    const existing = loadForWrite(tx, "weighIn", w.id, actor, w);
    requireOwnedParent(tx, "find", w.findId, actor, "findId");
    let server;
    try {
      server = estimateSpecimen(w.input);
    } catch (error) {
      throw new RejectError("estimate_input", (error as Error).message, `input.${(error as { field?: string }).field ?? ""}`);
    }
    // The server's recomputation stands, under the current ENGINE_VERSION and kept with it; a
    // device that disagrees is recorded, not hidden, and keeps its own engine's version. An
    // estimate is numbers and codes (warnings are { code, params }, worded by the UI), so
    // identity is every number to the bit and every code. A device figure equal to the
    // server's is valid by that equality; any other is checked (older engines' too).
    const mismatch = !sameValue(server, w.deviceEstimate);
    let deviceEstimate: unknown = server;
    if (mismatch) {
      const reported = reportedEstimateSchema.safeParse(w.deviceEstimate);
      if (!reported.success) throw rejectInvalid(reported.error, "deviceEstimate");
      logger.warn({ code: "estimate_mismatch", weighIn: w.id, device: reported.data.engineVersion, server: server.engineVersion }, "device estimate differs");
      deviceEstimate = reported.data;
    }
    const airGrams = w.input.airGrams.reduce((a, b) => a + b, 0) / w.input.airGrams.length;
    const scaleCheckPassed = namedCheckVerdict(tx.db, actor.id, w.scaleId, w.scaleCheck);
    return () => {
      const fields = {
        deviceEstimate,
        serverEstimate: server,
        engineVersion: server.engineVersion,
        fineGoldGrams: server.fineGoldGrams,
        goldAlloyGrams: server.goldAlloyGrams,
        airGrams,
        mismatch,
        scaleCheckPassed,
        memberId: actor.id,
        seq: tx.seq(),
        updatedAt: Date.now(),
      };
      upsert(tx, "weighIn", existing, w, actor, fields);
      // A weigh-in moved to another find leaves its first find's figures to be worked out again.
      const movedFrom = (existing as (Owned & { findId?: string }) | undefined)?.findId;
      if (movedFrom && movedFrom !== w.findId) refreshWeighInFigures(tx.db, movedFrom);
      if (existing) refreshWeighInFigures(tx.db, w.findId);
      else
        weighInAdded(tx.db, {
          id: w.id,
          findId: w.findId,
          weighedAt: w.weighedAt,
          alloyGrams: server.goldAlloyGrams,
          fineGrams: server.fineGoldGrams,
          fineRange: server.range.fineGoldGrams,
          airGrams,
          scaleChecked: scaleCheckPassed === true,
        });
    };
  },
  "weighIn.delete": (tx, actor, { id }) =>
    tombstone(tx, "weighIn", id, actor, () => {
      const row = statement(tx.db, "select find_id as findId from weigh_ins where id = ?").get(id) as { findId: string } | undefined;
      if (row) refreshWeighInFigures(tx.db, row.findId);
    }),
  "scale.put": (tx, actor, scale) => {
    const existing = loadForWrite(tx, "scale", scale.id, actor, scale);
    const standing = judgeChecks(scale.id, scale.checks);
    return () => upsert(tx, "scale", existing, scale, actor, { ...standing, memberId: actor.id, seq: tx.seq(), updatedAt: Date.now() });
  },
  "scale.delete": (tx, actor, { id }) => tombstone(tx, "scale", id, actor),
  "barrenRock.put": (tx, actor, b) => {
    const existing = loadForWrite(tx, "barrenRock", b.id, actor, b);
    if (!statement(tx.db, "select 1 from claims where id = ?").get(b.claimId))
      throw new RejectError("unknown_claim", "That claim is not one of the club's.", "claimId");
    const scaleCheckPassed = namedCheckVerdict(tx.db, actor.id, b.scaleId, b.scaleCheck);
    const density = serverDensity(b.input, b.deviceDensity, b.id);
    return () => upsert(tx, "barrenRock", existing, b, actor, { density, scaleCheckPassed, memberId: actor.id, seq: tx.seq(), updatedAt: Date.now() });
  },
  "barrenRock.delete": (tx, actor, { id }) => tombstone(tx, "barrenRock", id, actor),
  "answer.put": (tx, actor, a) => {
    const existing = loadForWrite(tx, "answer", a.id, actor, a) as (Owned & { findId: string }) | undefined;
    requireOwnedParent(tx, "find", a.findId, actor, "findId");
    // Only an officer's query of this very find can be answered (a verify or a note asks nothing).
    const review = statement(tx.db, "select find_id, action from reviews where id = ?").raw().get(a.reviewId) as [string, string] | undefined;
    if (!review || review[0] !== a.findId) throw new RejectError("unknown_parent", "The query this answers is not on the server.", "reviewId");
    if (review[1] !== "query") throw new RejectError("invalid", "Only an officer's query can be answered.", "reviewId");
    return () => {
      upsert(tx, "answer", existing, a, actor);
      refreshReviewState(tx.db, a.findId);
      // An answer moved to another find leaves its first find's thread open again.
      if (existing && existing.findId !== a.findId) refreshReviewState(tx.db, existing.findId);
    };
  },
  "settings.put": (tx, actor, s) => () => {
    if (s.mailOnQuery !== undefined) statement(tx.db, "update members set mail_on_query = ? where id = ?").run(s.mailOnQuery ? 1 : 0, actor.id);
    if (s.locationSharing === undefined) return;
    const changed = statement(tx.db, "update members set location_sharing = ? where id = ? and location_sharing <> ?").run(
      s.locationSharing,
      actor.id,
      s.locationSharing,
    ).changes;
    // Officers' copies of this member's finds change with the setting: they are re-sent once
    // at the end of the push (resendFinds), however many settings changes it holds.
    if (changed > 0) tx.resendFindsOf.add(actor.id);
  },
};

/** Deep equality of JSON values, to the last bit of every number (the device's figures against the server's). */
function sameValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  // As JSON carries them: a number that is not finite travels as null.
  if (typeof a === "number" && !Number.isFinite(a)) return b === null;
  if (typeof a !== "object" || typeof b !== "object" || a === null || b === null) return false;
  if (Array.isArray(a)) {
    if (!Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!sameValue(a[i], b[i])) return false;
    return true;
  }
  if (Array.isArray(b)) return false;
  // Same keys, same values; counted rather than listed, so no arrays are made per object.
  const x = a as Record<string, unknown>;
  const y = b as Record<string, unknown>;
  let n = 0;
  for (const k in x) {
    if (!Object.hasOwn(y, k) || !sameValue(x[k], y[k])) return false;
    n++;
  }
  for (const k in y) if (Object.hasOwn(y, k)) n--;
  return n === 0;
}

/** Parses a mutation's arguments with the shared schema, checks the change, then writes it. Throws RejectError before any write. */
export function applyMutation(tx: PushTx, actor: Actor, name: MutationName, rawArgs: unknown): void {
  const parsed = (name === "weighIn.put" ? weighInArgsSchema : MUTATION_ARGS[name]).safeParse(rawArgs);
  if (!parsed.success) throw rejectInvalid(parsed.error);
  // One cast where the name picks the mutator: TypeScript cannot tie parsed.data to that name.
  const write = (MUTATORS[name] as (tx: PushTx, actor: Actor, args: unknown) => Write)(tx, actor, parsed.data);
  write();
}

function rejectInvalid(error: z.ZodError, under?: string): RejectError {
  const issue = error.issues[0];
  const path = [...(under ? [under] : []), ...issue.path].join(".");
  return new RejectError("invalid", issue.message, path || undefined);
}

/**
 * Gives every find of the member a new change number, so officers' devices pull them again:
 * one set-based statement over a block of numbers reserved from the push's sequence.
 */
export function resendFinds(tx: PushTx, memberId: string, reserve: (n: number) => number): void {
  const n = (statement(tx.db, "select count(*) as n from finds where member_id = ?").get(memberId) as { n: number }).n;
  if (n === 0) return;
  const first = reserve(n);
  statement(
    tx.db,
    `update finds set seq = ? + r.rn from (select id, row_number() over (order by id) - 1 as rn from finds where member_id = ?) r where finds.id = r.id`,
  ).run(first, memberId);
}
