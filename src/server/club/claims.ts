import "server-only";
import { area } from "@turf/area";
import { feature, featureCollection } from "@turf/helpers";
import { intersect } from "@turf/intersect";
import { and, asc, eq, ne, sql } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import type { z } from "zod";
import { boundaryFromCorners, readBoundary } from "@/lib/club/geometry";
import type { claimInputSchema, claimProfileInputSchema } from "@/lib/club/schemas";
import { seasonBounds } from "@/lib/season";
import type { Actor } from "../auth/actor";
import { audit } from "../audit";
import { getDb } from "../db";
import * as t from "../db/schema";
import { refreshOutsideClaim } from "../db/outside-claim";
import { nextSeq } from "../db/sequence";
import { AppError } from "../errors";
import { refigureFineness } from "./figures";
import { clubSettings } from "./settings";

type ClaimInput = z.infer<typeof claimInputSchema>;

const PROFILE_COLUMNS = {
  fineness: t.claims.fineness,
  finenessLow: t.claims.finenessLow,
  finenessHigh: t.claims.finenessHigh,
  finenessSource: t.claims.finenessSource,
  hostDensity: t.claims.hostDensity,
  hostDensityLow: t.claims.hostDensityLow,
  hostDensityHigh: t.claims.hostDensityHigh,
  hostDensitySource: t.claims.hostDensitySource,
};

export function listClaims() {
  return getDb()
    .select({
      id: t.claims.id,
      name: t.claims.name,
      kind: t.claims.kind,
      agencyRef: t.claims.agencyRef,
      boundary: t.claims.boundary,
      rules: t.claims.rules,
      active: t.claims.active,
      updatedAt: t.claims.updatedAt,
      landowner: t.claims.landowner,
      royaltyKind: t.claims.royaltyKind,
      royaltyRate: t.claims.royaltyRate,
      ...PROFILE_COLUMNS,
    })
    .from(t.claims)
    .orderBy(asc(t.claims.name))
    .all();
}

function boundaryOf(input: ClaimInput): t.GeoJsonPolygon | null | undefined {
  if (input.corners && input.corners.trim()) {
    const r = boundaryFromCorners(input.corners);
    if (!r.ok) throw new AppError("bad_request:claim", r.message, { corners: [r.message] });
    return r.polygon;
  }
  if (input.boundary === undefined) return undefined;
  if (input.boundary === null) return null;
  const r = readBoundary(input.boundary);
  if (!r.ok) throw new AppError("bad_request:claim", r.message, { boundary: [r.message] });
  return r.polygon;
}

/** Square metres where two outlines overlap (0 when they only touch along an edge). */
function overlapArea(a: t.GeoJsonPolygon, b: t.GeoJsonPolygon): number {
  const shared = intersect(featureCollection([feature(a), feature(b)]));
  return shared ? area(shared) : 0;
}

/**
 * Creates or edits a claim; devices receive it at their next sync. Audited with before and
 * after. Two claims may not share a name; an outline overlapping another active claim is
 * saved only once the officer has seen the overlap named (acceptOverlap).
 */
export function saveClaim(actor: Actor, id: string | null, input: ClaimInput) {
  const boundary = boundaryOf(input);
  const db = getDb();
  return db.transaction((tx) => {
    const sameName = tx
      .select({ id: t.claims.id })
      .from(t.claims)
      .where(and(sql`lower(trim(${t.claims.name})) = lower(trim(${input.name}))`, id ? ne(t.claims.id, id) : undefined))
      .get();
    if (sameName)
      throw new AppError("conflict:claim", `The club already has a claim named ${input.name.trim()}. Give this one another name.`, {
        name: ["already a claim of that name"],
      });
    if (boundary && !input.acceptOverlap) {
      const others = tx.select({ id: t.claims.id, name: t.claims.name, boundary: t.claims.boundary }).from(t.claims).where(eq(t.claims.active, true)).all();
      const overlaps = others
        .filter((o) => o.id !== id && o.boundary)
        .map((o) => ({ name: o.name, m2: overlapArea(boundary, o.boundary!) }))
        .filter((o) => o.m2 >= 1);
      if (overlaps.length) {
        const list = overlaps.map((o) => `${o.name} (about ${Math.round(o.m2).toLocaleString("en-US")} m²)`).join(", ");
        throw new AppError("conflict:claim_overlap", `This outline overlaps ${list}. Check the corners; save again to accept the overlap.`, {
          boundary: [`overlaps ${list}`],
        });
      }
    }
    const values = {
      name: input.name,
      kind: input.kind,
      agencyRef: input.agencyRef,
      rules: input.rules,
      active: input.active,
      landowner: input.landowner,
      royaltyKind: input.royaltyKind,
      royaltyRate: input.royaltyRate,
      ...(boundary !== undefined ? { boundary } : {}),
    };
    if (id) {
      const before = tx.select().from(t.claims).where(eq(t.claims.id, id)).get();
      if (!before) throw new AppError("not_found:claim", "No such claim.");
      tx.update(t.claims)
        .set({ ...values, updatedAt: Date.now(), seq: nextSeq(db.$client) })
        .where(eq(t.claims.id, id))
        .run();
      if (boundary !== undefined) refreshOutsideClaim(db.$client, id);
      audit(tx, { actorId: actor.id, action: "claim.update", entity: "claim", entityId: id, before, after: values });
      return { id };
    }
    const newId = uuidv7();
    tx.insert(t.claims)
      .values({ id: newId, ...values, boundary: boundary ?? null, seq: nextSeq(db.$client) })
      .run();
    audit(tx, { actorId: actor.id, action: "claim.create", entity: "claim", entityId: newId, after: values });
    return { id: newId };
  });
}

/**
 * Sets a claim's gold profile (values are the middles of their ranges). Devices receive it at
 * their next sync; finds figured before keep the fineness they were figured with. Audited.
 */
export function saveClaimProfile(actor: Actor, id: string, input: z.infer<typeof claimProfileInputSchema>) {
  const db = getDb();
  return db.transaction((tx) => {
    const before = tx.select(PROFILE_COLUMNS).from(t.claims).where(eq(t.claims.id, id)).get();
    if (!before) throw new AppError("not_found:claim", "No such claim.");
    const after = {
      fineness: (input.finenessLow + input.finenessHigh) / 2,
      finenessLow: input.finenessLow,
      finenessHigh: input.finenessHigh,
      finenessSource: input.finenessSource,
      hostDensity: (input.hostDensityLow + input.hostDensityHigh) / 2,
      hostDensityLow: input.hostDensityLow,
      hostDensityHigh: input.hostDensityHigh,
      hostDensitySource: input.hostDensitySource,
    };
    tx.update(t.claims)
      .set({ ...after, updatedAt: Date.now(), seq: nextSeq(db.$client) })
      .where(eq(t.claims.id, id))
      .run();
    audit(tx, { actorId: actor.id, action: "claim.profile", entity: "claim", entityId: id, before, after });
    return after;
  });
}

/** Re-figures a season's finds on the claim with its fineness as it stands now. Audited with the count. */
export function refigureSeason(actor: Actor, id: string, season: number) {
  const db = getDb();
  return db.transaction((tx) => {
    const claim = tx
      .select({ id: t.claims.id, ...PROFILE_COLUMNS })
      .from(t.claims)
      .where(eq(t.claims.id, id))
      .get();
    if (!claim) throw new AppError("not_found:claim", "No such claim.");
    const { start, end } = seasonBounds(season, clubSettings().timeZone);
    const finds = refigureFineness(db.$client, { claimId: id, start, end });
    audit(tx, {
      actorId: actor.id,
      action: "claim.refigure",
      entity: "claim",
      entityId: id,
      after: { season, finds, fineness: claim.fineness, finenessLow: claim.finenessLow, finenessHigh: claim.finenessHigh },
    });
    return { finds };
  });
}
