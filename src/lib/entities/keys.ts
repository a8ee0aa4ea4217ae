import type { Answer } from "./answer";
import type { BarrenRock } from "./barren-rock";
import type { ClaimView } from "./claim";
import type { Find } from "./find";
import type { Outing } from "./outing";
import type { Photo } from "./photo";
import type { Scale } from "./scale";
import type { WeighIn } from "./weigh-in";

// The fields of each member record as it syncs, listed once and without zod, so the sync
// engine's chunk does not carry the validator. keys.test.ts holds each list equal to its
// schema: a field added to a schema and forgotten here fails there, not on a member's device.

export const OUTING_KEYS = [
  "id",
  "claimId",
  "startedAt",
  "endedAt",
  "companions",
  "method",
  "hours",
  "conditions",
  "notes",
] as const satisfies readonly (keyof Outing)[];
export const FIND_KEYS = [
  "id",
  "outingId",
  "claimId",
  "kind",
  "weightGrams",
  "purity",
  "depthCm",
  "method",
  "notes",
  "lat",
  "lon",
  "accuracyM",
  "locationSource",
  "foundAt",
] as const satisfies readonly (keyof Find)[];
export const PHOTO_KEYS = [
  "id",
  "findId",
  "sha256",
  "contentType",
  "bytes",
  "width",
  "height",
  "takenAt",
  "lat",
  "lon",
] as const satisfies readonly (keyof Photo)[];
export const WEIGH_IN_KEYS = ["id", "findId", "input", "deviceEstimate", "weighedAt", "scaleId", "scaleCheck"] as const satisfies readonly (keyof WeighIn)[];
export const SCALE_KEYS = ["id", "name", "stepGrams", "accuracyGrams", "checks"] as const satisfies readonly (keyof Scale)[];
export const ANSWER_KEYS = ["id", "findId", "reviewId", "note"] as const satisfies readonly (keyof Answer)[];
export const BARREN_ROCK_KEYS = [
  "id",
  "claimId",
  "input",
  "deviceDensity",
  "weighedAt",
  "scaleId",
  "scaleCheck",
  "notes",
] as const satisfies readonly (keyof BarrenRock)[];

/** A claim as devices keep it (read-only there; officers change claims on the server). */
export const CLAIM_KEYS = [
  "id",
  "name",
  "kind",
  "agencyRef",
  "boundary",
  "rules",
  "active",
  "fineness",
  "finenessLow",
  "finenessHigh",
  "finenessSource",
  "hostDensity",
  "hostDensityLow",
  "hostDensityHigh",
  "hostDensitySource",
] as const satisfies readonly (keyof ClaimView)[];

/** A member record's entity as sync names it, with its record type. */
export type RecordEntities = { outing: Outing; find: Find; photo: Photo; weighIn: WeighIn; scale: Scale; barrenRock: BarrenRock; answer: Answer };
export type RecordEntity = keyof RecordEntities;

export const RECORD_KEYS: { [E in RecordEntity]: readonly (keyof RecordEntities[E])[] } = {
  outing: OUTING_KEYS,
  find: FIND_KEYS,
  photo: PHOTO_KEYS,
  weighIn: WEIGH_IN_KEYS,
  scale: SCALE_KEYS,
  barrenRock: BARREN_ROCK_KEYS,
  answer: ANSWER_KEYS,
};

/** The record as it syncs: exactly its entity's fields (a missing one as null), nothing a device or server adds. */
export function pickRecord<E extends RecordEntity>(entity: E, value: Record<string, unknown>): RecordEntities[E] {
  return Object.fromEntries(RECORD_KEYS[entity].map((k) => [k, value[k as string] ?? null])) as RecordEntities[E];
}
