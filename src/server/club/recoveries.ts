import "server-only";
import { and, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import type { z } from "zod";
import type { recoveryInputSchema } from "@/lib/club/schemas";
import { proposeFineness, recoveryRatios, type RecoveryFigures } from "@/lib/figures/proposal";
import type { Actor } from "../auth/actor";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { nextSeq } from "../db/sequence";
import { AppError } from "../errors";

type RecoveryInput = z.infer<typeof recoveryInputSchema>;

/** A fire assay's fineness is good to about ± 5 ‰ (common practice); each find's share carries it. */
const ASSAY_RELATIVE = 0.005;

/**
 * Records a melt or an assay. Its fine gold is shared among the finds that went in, in
 * proportion to what each was estimated to hold (by weight when none had an estimate), and
 * each find is figured from its share from then on (basis "assay"). The estimate before is
 * kept beside it, so the club can see how its estimates compare with what it recovers.
 */
export function recordRecovery(actor: Actor, input: RecoveryInput) {
  const db = getDb();
  return db.transaction((tx) => {
    const finds = tx
      .select({
        id: t.finds.id,
        claimId: t.finds.claimId,
        kind: t.finds.kind,
        weight: t.finds.weightGrams,
        fine: t.finds.latestFineGrams,
        basis: t.finds.fineBasis,
      })
      .from(t.finds)
      .where(and(inArray(t.finds.id, input.findIds), isNull(t.finds.deletedAt)))
      .all();
    const missing = input.findIds.filter((id) => !finds.some((f) => f.id === id));
    if (missing.length)
      throw new AppError("bad_request:recovery", `${missing.length} of the chosen finds are not on the server (or were deleted).`, {
        findIds: ["unknown finds"],
      });
    if (input.claimId && finds.some((f) => f.claimId !== input.claimId)) {
      throw new AppError("bad_request:recovery", "Every find in it must be on the chosen claim.", { findIds: ["finds from another claim"] });
    }
    const already = tx.select({ id: t.recoveryFinds.findId }).from(t.recoveryFinds).where(inArray(t.recoveryFinds.findId, input.findIds)).all();
    if (already.length)
      throw new AppError("conflict:recovery", `${already.length} of the chosen finds are already in a melt or assay.`, { findIds: ["already recovered"] });

    const estimated = finds.reduce((n, f) => n + (f.fine ?? 0), 0);
    const gross = finds.reduce((n, f) => n + (f.weight ?? 0), 0);
    const placer = finds.filter((f) => f.kind !== "specimen").reduce((n, f) => n + (f.weight ?? 0), 0);
    const id = uuidv7();
    tx.insert(t.recoveries)
      .values({
        id,
        kind: input.kind,
        claimId: input.claimId,
        recordedOn: input.recordedOn,
        fineGrams: input.fineGrams,
        fineness: input.fineness,
        estimatedGrams: estimated,
        grossGrams: gross,
        placerGrams: placer,
        note: input.note,
        recordedBy: actor.id,
      })
      .run();
    for (const f of finds) {
      const share = estimated > 0 ? (f.fine ?? 0) / estimated : gross > 0 ? (f.weight ?? 0) / gross : 1 / finds.length;
      const allocated = input.fineGrams * share;
      tx.insert(t.recoveryFinds).values({ recoveryId: id, findId: f.id, estimatedGrams: f.fine, allocatedGrams: allocated }).run();
      // A new change number: members' devices pull the find's new figure.
      tx.update(t.finds)
        .set({ assayFine: allocated, assayLow: allocated * (1 - ASSAY_RELATIVE), assayHigh: allocated * (1 + ASSAY_RELATIVE), seq: nextSeq(db.$client) })
        .where(eq(t.finds.id, f.id))
        .run();
    }
    audit(tx, { actorId: actor.id, action: `recovery.${input.kind}`, entity: "recovery", entityId: id, after: { ...input, estimatedGrams: estimated } });
    return { id, estimatedGrams: estimated, finds: finds.length };
  });
}

const DOCUMENT_TYPES = { "application/pdf": "pdf", "image/jpeg": "jpg", "image/png": "png" } as const;
export type DocumentType = keyof typeof DOCUMENT_TYPES;

/** What the bytes are, by their first bytes (never by what the sender says). */
export function documentTypeOf(bytes: Buffer): DocumentType | null {
  if (bytes.subarray(0, 5).toString("latin1") === "%PDF-") return "application/pdf";
  if (bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return "image/jpeg";
  if (bytes.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return "image/png";
  return null;
}

export const documentExtension = (type: DocumentType) => DOCUMENT_TYPES[type];

export function recoveryRow(id: string) {
  const row = getDb().select().from(t.recoveries).where(eq(t.recoveries.id, id)).get();
  if (!row) throw new AppError("not_found:recovery", "No such melt or assay.");
  return row;
}

export function attachDocument(actor: Actor, id: string, key: string, type: DocumentType, name: string) {
  const db = getDb();
  db.transaction((tx) => {
    tx.update(t.recoveries).set({ documentKey: key, documentType: type, documentName: name }).where(eq(t.recoveries.id, id)).run();
    audit(tx, { actorId: actor.id, action: "recovery.document", entity: "recovery", entityId: id, after: { type, name } });
  });
}

/** A claim's melts and assays in a season, how they compare with the estimates, and the fineness they propose. */
export function claimRecoveries(claimId: string, season: number) {
  // recordedOn is a club day, so the season is its year.
  const first = `${season}-01-01`;
  const last = `${season}-12-31`;
  const rows = getDb()
    .select({
      id: t.recoveries.id,
      kind: t.recoveries.kind,
      recordedOn: t.recoveries.recordedOn,
      fineGrams: t.recoveries.fineGrams,
      fineness: t.recoveries.fineness,
      estimatedGrams: t.recoveries.estimatedGrams,
      grossGrams: t.recoveries.grossGrams,
      placerGrams: t.recoveries.placerGrams,
      documentName: t.recoveries.documentName,
      hasDocument: sql<number>`${t.recoveries.documentKey} is not null`,
      note: t.recoveries.note,
      finds: sql<number>`(select count(*) from recovery_finds rf where rf.recovery_id = ${t.recoveries.id})`,
    })
    .from(t.recoveries)
    .where(and(eq(t.recoveries.claimId, claimId), sql`${t.recoveries.recordedOn} >= ${first} and ${t.recoveries.recordedOn} <= ${last}`))
    .orderBy(desc(t.recoveries.recordedOn))
    .all()
    .map((r) => ({ ...r, hasDocument: !!r.hasDocument }));
  const figures: RecoveryFigures[] = rows;
  return { season, recoveries: rows, comparison: recoveryRatios(figures), proposal: proposeFineness(figures) };
}
