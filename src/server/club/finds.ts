import "server-only";
import { asc, desc, eq } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import type { Actor } from "../auth/actor";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { nextSeq } from "../db/sequence";
import { AppError } from "../errors";
import { refreshReviewState } from "./figures";
import { mailQueryIfAsked, threadOf } from "./query-thread";
import { clubSettings } from "./settings";

/** One find as an officer opens it: photos, position (as the member shares it), every weigh-in, the review history and the query thread. */
export function findForOfficer(id: string) {
  const db = getDb();
  const find = db
    .select({
      id: t.finds.id,
      memberId: t.finds.memberId,
      memberName: t.members.name,
      sharing: t.members.locationSharing,
      claimId: t.finds.claimId,
      claimName: t.claims.name,
      kind: t.finds.kind,
      weightGrams: t.finds.weightGrams,
      depthCm: t.finds.depthCm,
      method: t.finds.method,
      notes: t.finds.notes,
      lat: t.finds.lat,
      lon: t.finds.lon,
      accuracyM: t.finds.accuracyM,
      locationSource: t.finds.locationSource,
      foundAt: t.finds.foundAt,
      deletedAt: t.finds.deletedAt,
    })
    .from(t.finds)
    .innerJoin(t.members, eq(t.members.id, t.finds.memberId))
    .leftJoin(t.claims, eq(t.claims.id, t.finds.claimId))
    .where(eq(t.finds.id, id))
    .get();
  if (!find || find.deletedAt) throw new AppError("not_found:find", "No such find.");
  const { sharing, deletedAt: _d, ...rest } = find;
  const position = sharing === "exact" ? { lat: rest.lat, lon: rest.lon, accuracyM: rest.accuracyM } : { lat: null, lon: null, accuracyM: null };
  return {
    /** The club's zone: the console shows every time on the club's clock. */
    timeZone: clubSettings().timeZone,
    find: { ...rest, ...position, positionShared: sharing === "exact" },
    photos: db
      .select({ id: t.photos.id, width: t.photos.width, height: t.photos.height, uploaded: t.photos.uploadedAt })
      .from(t.photos)
      .where(eq(t.photos.findId, id))
      .all()
      .filter((p) => p.uploaded),
    weighIns: db
      .select({
        id: t.weighIns.id,
        weighedAt: t.weighIns.weighedAt,
        input: t.weighIns.input,
        deviceEstimate: t.weighIns.deviceEstimate,
        serverEstimate: t.weighIns.serverEstimate,
        engineVersion: t.weighIns.engineVersion,
        mismatch: t.weighIns.mismatch,
        deletedAt: t.weighIns.deletedAt,
        // The scale it was made on and the server's verdict on that scale's latest check then.
        scaleName: t.scales.name,
        scaleCheck: t.weighIns.scaleCheck,
        scaleCheckPassed: t.weighIns.scaleCheckPassed,
      })
      .from(t.weighIns)
      .leftJoin(t.scales, eq(t.scales.id, t.weighIns.scaleId))
      .where(eq(t.weighIns.findId, id))
      .orderBy(desc(t.weighIns.weighedAt))
      .all()
      .filter((w) => !w.deletedAt),
    reviews: db
      .select({ id: t.reviews.id, action: t.reviews.action, note: t.reviews.note, createdAt: t.reviews.createdAt, officerName: t.members.name })
      .from(t.reviews)
      .leftJoin(t.members, eq(t.members.id, t.reviews.officerId))
      .where(eq(t.reviews.findId, id))
      .orderBy(asc(t.reviews.createdAt))
      .all(),
    thread: threadOf(id),
  };
}

/** An officer verifies, queries or annotates a find. Its own record: never conflicts with the member's edits. */
export function reviewFind(actor: Actor, findId: string, input: { action: "verify" | "query" | "note"; note: string }) {
  const db = getDb();
  const written = db.transaction((tx) => {
    const find = tx.select({ id: t.finds.id, deletedAt: t.finds.deletedAt }).from(t.finds).where(eq(t.finds.id, findId)).get();
    if (!find || find.deletedAt) throw new AppError("not_found:find", "No such find.");
    const review = { id: uuidv7(), findId, officerId: actor.id, action: input.action, note: input.note, seq: nextSeq(db.$client) };
    tx.insert(t.reviews).values(review).run();
    refreshReviewState(db.$client, findId);
    audit(tx, { actorId: actor.id, action: `review.${input.action}`, entity: "find", entityId: findId, after: { action: input.action, note: input.note } });
    return { id: review.id };
  });
  // After the commit: the member hears of a query only once it stands.
  if (input.action === "query") mailQueryIfAsked(findId, actor.name, input.note);
  return written;
}
