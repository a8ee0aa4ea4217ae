import { sql } from "drizzle-orm";
import { v7 as uuidv7 } from "uuid";
import { index, integer, primaryKey, real, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { REVIEW_STATES } from "../../lib/club/ledger";
import {
  CLAIM_KINDS,
  FIND_KINDS,
  FINENESS_USED_BASES,
  LOCATION_SHARING,
  LOCATION_SOURCES,
  OUTING_METHODS,
  PHOTO_TYPES,
  RECOVERY_KINDS,
  REVIEW_ACTIONS,
  ROYALTY_KINDS,
} from "../../lib/entities/constants";
import { FINE_BASES } from "../../lib/figures/fine-basis";
import { ROLES } from "../../lib/roles";
import { CLAIM_PROFILE_DEFAULTS } from "../../lib/figures/claim-profile";

// Time stamps are milliseconds since the epoch, set by the server. Syncable tables carry
// `seq`, the value of the change sequence at their last write: pull cursors compare it,
// never a clock. Member records use client-made UUID v7 ids.

const now = sql`(unixepoch('subsec') * 1000)`;
const createdAt = () => integer("created_at", { mode: "number" }).notNull().default(now);
const seq = () => integer("seq").notNull().default(0);

export const members = sqliteTable("members", {
  id: text("id")
    .primaryKey()
    .$defaultFn(() => uuidv7()),
  email: text("email").notNull().unique(),
  name: text("name"),
  emailVerified: integer("email_verified", { mode: "timestamp_ms" }),
  image: text("image"),
  role: text("role", { enum: ROLES }).notNull().default("member"),
  passwordHash: text("password_hash"),
  active: integer("active", { mode: "boolean" }).notNull().default(true),
  /** Bumped to end every session of the member at once (deactivation, role change). */
  sessionVersion: integer("session_version").notNull().default(0),
  /** What officers see of this member's find positions. */
  locationSharing: text("location_sharing", { enum: LOCATION_SHARING }).notNull().default("exact"),
  /** The member asked to be told by e-mail when an officer queries one of their finds. */
  mailOnQuery: integer("mail_on_query", { mode: "boolean" }).notNull().default(false),
  createdAt: createdAt(),
});

// Auth.js adapter tables: the e-mail link provider keeps its one-time tokens here.
export const accounts = sqliteTable(
  "accounts",
  {
    userId: text("user_id")
      .notNull()
      .references(() => members.id, { onDelete: "cascade" }),
    type: text("type").notNull(),
    provider: text("provider").notNull(),
    providerAccountId: text("provider_account_id").notNull(),
    refresh_token: text("refresh_token"),
    access_token: text("access_token"),
    expires_at: integer("expires_at"),
    token_type: text("token_type"),
    scope: text("scope"),
    id_token: text("id_token"),
    session_state: text("session_state"),
  },
  (t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })],
);

export const authSessions = sqliteTable("auth_sessions", {
  sessionToken: text("session_token").primaryKey(),
  userId: text("user_id")
    .notNull()
    .references(() => members.id, { onDelete: "cascade" }),
  expires: integer("expires", { mode: "timestamp_ms" }).notNull(),
});

export const verificationTokens = sqliteTable(
  "verification_tokens",
  {
    identifier: text("identifier").notNull(),
    token: text("token").notNull(),
    expires: integer("expires", { mode: "timestamp_ms" }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.identifier, t.token] })],
);

export const invitations = sqliteTable("invitations", {
  id: text("id").primaryKey(),
  email: text("email").notNull(),
  role: text("role", { enum: ROLES }).notNull().default("member"),
  tokenHash: text("token_hash").notNull().unique(),
  invitedBy: text("invited_by").references(() => members.id),
  expiresAt: integer("expires_at").notNull(),
  acceptedAt: integer("accepted_at"),
  revokedAt: integer("revoked_at"),
  createdAt: createdAt(),
});

export const claims = sqliteTable(
  "claims",
  {
    id: text("id").primaryKey(),
    name: text("name").notNull(),
    kind: text("kind", { enum: CLAIM_KINDS }).notNull(),
    agencyRef: text("agency_ref"),
    /** GeoJSON Polygon or MultiPolygon, WGS 84 longitude/latitude. */
    boundary: text("boundary", { mode: "json" }).$type<GeoJsonPolygon>(),
    rules: text("rules").notNull().default(""),
    active: integer("active", { mode: "boolean" }).notNull().default(true),
    // The claim gold profile: its gold's fineness (‰) and its host rock's density (g/cm³), each
    // with its range and where it came from. New claims start from the club's presets.
    fineness: real("fineness").notNull().default(CLAIM_PROFILE_DEFAULTS.fineness),
    finenessLow: real("fineness_low").notNull().default(CLAIM_PROFILE_DEFAULTS.finenessLow),
    finenessHigh: real("fineness_high").notNull().default(CLAIM_PROFILE_DEFAULTS.finenessHigh),
    finenessSource: text("fineness_source").notNull().default(CLAIM_PROFILE_DEFAULTS.finenessSource),
    hostDensity: real("host_density").notNull().default(CLAIM_PROFILE_DEFAULTS.hostDensity),
    hostDensityLow: real("host_density_low").notNull().default(CLAIM_PROFILE_DEFAULTS.hostDensityLow),
    hostDensityHigh: real("host_density_high").notNull().default(CLAIM_PROFILE_DEFAULTS.hostDensityHigh),
    hostDensitySource: text("host_density_source").notNull().default(CLAIM_PROFILE_DEFAULTS.hostDensitySource),
    // The landowner's agreement, when the claim's land has one: to whom, and the royalty it sets
    // (a share of the value, or grams owed per troy ounce of fine gold).
    landowner: text("landowner"),
    royaltyKind: text("royalty_kind", { enum: ROYALTY_KINDS }),
    royaltyRate: real("royalty_rate"),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    seq: seq(),
  },
  (t) => [index("claims_seq").on(t.seq)],
);

export type GeoJsonPolygon = { type: "Polygon"; coordinates: number[][][] } | { type: "MultiPolygon"; coordinates: number[][][][] };

export const outings = sqliteTable(
  "outings",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    claimId: text("claim_id").references(() => claims.id),
    startedAt: integer("started_at").notNull(),
    endedAt: integer("ended_at"),
    companions: text("companions").notNull().default(""),
    method: text("method", { enum: OUTING_METHODS }).notNull(),
    hours: real("hours"),
    conditions: text("conditions").notNull().default(""),
    notes: text("notes").notNull().default(""),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [index("outings_member_seq").on(t.memberId, t.seq), index("outings_seq").on(t.seq)],
);

export const finds = sqliteTable(
  "finds",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    outingId: text("outing_id").references(() => outings.id),
    claimId: text("claim_id").references(() => claims.id),
    kind: text("kind", { enum: FIND_KINDS }).notNull(),
    weightGrams: real("weight_grams"),
    depthCm: real("depth_cm"),
    method: text("method", { enum: OUTING_METHODS }).notNull(),
    notes: text("notes").notNull().default(""),
    lat: real("lat"),
    lon: real("lon"),
    accuracyM: real("accuracy_m"),
    locationSource: text("location_source", { enum: LOCATION_SOURCES }),
    foundAt: integer("found_at").notNull(),
    /** The member's own figure for the gold's fineness (‰), when they know it. */
    purity: real("purity"),
    // The ledger's figures, kept on the row by the server so totals over a large club are one
    // pass over an index; never sent by devices. Inputs first: the latest weigh-in's estimate,
    // the latest assay, and the fineness the find was figured with (its claim's, or the club's
    // when off-claim, as it stood then: accepting a new fineness changes later figures only,
    // unless an officer re-figures a season).
    latestAlloyGrams: real("latest_alloy_grams"),
    weighedFine: real("weighed_fine"),
    weighedLow: real("weighed_low"),
    weighedHigh: real("weighed_high"),
    /** Mean in-air reading of the latest weigh-in, to compare with the recorded weight. */
    weighedAir: real("weighed_air"),
    assayFine: real("assay_fine"),
    assayLow: real("assay_low"),
    assayHigh: real("assay_high"),
    finenessUsed: real("fineness_used"),
    finenessUsedLow: real("fineness_used_low"),
    finenessUsedHigh: real("fineness_used_high"),
    finenessUsedBasis: text("fineness_used_basis", { enum: FINENESS_USED_BASES }),
    // Then the figure itself, worked out by SQLite from the inputs above with one rule
    // (FINE_FIGURE, db/fine-figure.ts), by triggers on every insert and on every change of an
    // input, so it always equals a recomputation. Plain columns, not generated ones: SQLite
    // reads an index on a generated column through the table, and the ledger's totals must come
    // from its covering index alone.
    fineBasis: text("fine_basis", { enum: FINE_BASES }),
    latestFineGrams: real("latest_fine_grams"),
    latestFineLow: real("latest_fine_low"),
    latestFineHigh: real("latest_fine_high"),
    /** The find's position lies outside the boundary of the claim it is recorded on (set as it arrives). */
    outsideClaim: integer("outside_claim", { mode: "boolean" }).notNull().default(false),
    /**
     * The latest weigh-in was made on a scale whose latest setup check passed (the server's
     * verdict); false when its scale's check failed, was never made, or no scale was named;
     * null when the find has no weigh-in. Kept with the weighed_* figures (club/figures.ts).
     */
    weighedScaleChecked: integer("weighed_scale_checked", { mode: "boolean" }),
    /** The latest weigh-in's air reading is more than a tenth off the find's recorded weight. */
    weighMismatch: integer("weigh_mismatch", { mode: "boolean" }).notNull().default(false),
    /**
     * The query thread's state, from the latest verify or query (club/figures.ts): "answered"
     * when the member has answered that query.
     */
    reviewState: text("review_state", { enum: REVIEW_STATES }).notNull().default("new"),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [
    index("finds_member_seq").on(t.memberId, t.seq),
    // Covers every filter and every total (TOTAL_COLUMNS), so ledger totals never read the table.
    index("finds_ledger").on(
      t.foundAt,
      t.deletedAt,
      t.claimId,
      t.memberId,
      t.kind,
      t.reviewState,
      t.weightGrams,
      t.latestFineGrams,
      t.latestFineLow,
      t.latestFineHigh,
      t.fineBasis,
      t.weighMismatch,
    ),
    index("finds_seq").on(t.seq),
    index("finds_claim_found").on(t.claimId, t.foundAt),
    index("finds_found").on(t.foundAt),
  ],
);

export const photos = sqliteTable(
  "photos",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    findId: text("find_id")
      .notNull()
      .references(() => finds.id),
    sha256: text("sha256").notNull(),
    contentType: text("content_type", { enum: PHOTO_TYPES }).notNull(),
    bytes: integer("bytes").notNull(),
    width: integer("width"),
    height: integer("height"),
    storageKey: text("storage_key"),
    /** What storage actually holds for this photo (the quota counts this, not the record's `bytes`). */
    storedBytes: integer("stored_bytes"),
    takenAt: integer("taken_at"),
    /** Position from the photo's EXIF, kept in the record; served bytes never carry it. */
    lat: real("lat"),
    lon: real("lon"),
    uploadedAt: integer("uploaded_at"),
    createdAt: createdAt(),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [index("photos_find").on(t.findId), index("photos_member_seq").on(t.memberId, t.seq)],
);

/** Photo bytes to remove from storage: written with the purge that made them final, removed once gone. */
export const photoBytesToDelete = sqliteTable("photo_bytes_to_delete", {
  storageKey: text("storage_key").primaryKey(),
  since: integer("since").notNull(),
});

export const weighIns = sqliteTable(
  "weigh_ins",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    findId: text("find_id")
      .notNull()
      .references(() => finds.id),
    /** The SpecimenInput as the member entered it. */
    input: text("input", { mode: "json" }).notNull().$type<Record<string, unknown>>(),
    /** The estimate as the device computed it, and as the server recomputed it. */
    deviceEstimate: text("device_estimate", { mode: "json" }).$type<Record<string, unknown>>(),
    serverEstimate: text("server_estimate", { mode: "json" }).$type<Record<string, unknown>>(),
    engineVersion: text("engine_version"),
    fineGoldGrams: real("fine_gold_grams"),
    goldAlloyGrams: real("gold_alloy_grams"),
    /** Mean of the in-air readings (g), to compare with the find's recorded weight. */
    airGrams: real("air_grams"),
    /** True when the device's figures differ from the server's recomputation. */
    mismatch: integer("mismatch", { mode: "boolean" }).notNull().default(false),
    /** The member's scale profile it was weighed on, and that scale's latest setup check then. */
    scaleId: text("scale_id"),
    scaleCheck: text("scale_check", { mode: "json" }).$type<Record<string, unknown>>(),
    /** The server's verdict on that check (recomputed with the engine); null when none was named. */
    scaleCheckPassed: integer("scale_check_passed", { mode: "boolean" }),
    weighedAt: integer("weighed_at").notNull(),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [index("weigh_ins_find").on(t.findId, t.weighedAt), index("weigh_ins_member_seq").on(t.memberId, t.seq)],
);

/**
 * A member's scale profile: its display step, its stated accuracy (null: the engine's default
 * for the step) and the history of its setup checks, as the device recorded them.
 */
export const scales = sqliteTable(
  "scales",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    name: text("name").notNull(),
    stepGrams: real("step_grams").notNull(),
    accuracyGrams: real("accuracy_grams"),
    checks: text("checks", { mode: "json" }).notNull().$type<Record<string, unknown>[]>(),
    /** The server's verdict on the latest check, recomputed with the engine; null when never checked. */
    latestCheckPassed: integer("latest_check_passed", { mode: "boolean" }),
    latestCheckedAt: integer("latest_checked_at"),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [index("scales_member_seq").on(t.memberId, t.seq), index("scales_seq").on(t.seq)],
);

/**
 * A barren-rock weigh-in: a piece of gold-free vein rock from a claim, weighed to learn the
 * claim's host density. No find; the density is the server's recomputation with the engine.
 */
export const barrenRocks = sqliteTable(
  "barren_rocks",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    claimId: text("claim_id")
      .notNull()
      .references(() => claims.id),
    input: text("input", { mode: "json" }).notNull().$type<Record<string, unknown>>(),
    deviceDensity: real("device_density"),
    density: real("density").notNull(),
    scaleId: text("scale_id"),
    scaleCheck: text("scale_check", { mode: "json" }).$type<Record<string, unknown>>(),
    scaleCheckPassed: integer("scale_check_passed", { mode: "boolean" }),
    notes: text("notes").notNull().default(""),
    weighedAt: integer("weighed_at").notNull(),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [index("barren_rocks_claim").on(t.claimId, t.weighedAt), index("barren_rocks_member_seq").on(t.memberId, t.seq), index("barren_rocks_seq").on(t.seq)],
);

export const reviews = sqliteTable(
  "reviews",
  {
    id: text("id").primaryKey(),
    findId: text("find_id")
      .notNull()
      .references(() => finds.id),
    officerId: text("officer_id")
      .notNull()
      .references(() => members.id),
    action: text("action", { enum: REVIEW_ACTIONS }).notNull(),
    note: text("note").notNull().default(""),
    createdAt: createdAt(),
    seq: seq(),
  },
  (t) => [index("reviews_find").on(t.findId, t.createdAt), index("reviews_seq").on(t.seq)],
);

/**
 * A member's answer to an officer's query of one of their finds: the member's own record,
 * written on the device and synced like any other; it names the query it answers.
 */
export const answers = sqliteTable(
  "answers",
  {
    id: text("id").primaryKey(),
    memberId: text("member_id")
      .notNull()
      .references(() => members.id),
    findId: text("find_id")
      .notNull()
      .references(() => finds.id),
    reviewId: text("review_id")
      .notNull()
      .references(() => reviews.id),
    note: text("note").notNull(),
    createdAt: createdAt(),
    updatedAt: integer("updated_at").notNull().default(now),
    deletedAt: integer("deleted_at"),
    seq: seq(),
  },
  (t) => [
    index("answers_find").on(t.findId, t.createdAt),
    index("answers_review").on(t.reviewId),
    index("answers_member_seq").on(t.memberId, t.seq),
    index("answers_seq").on(t.seq),
  ],
);

export const referencePrices = sqliteTable(
  "reference_prices",
  {
    id: text("id").primaryKey(),
    /** ISO date (YYYY-MM-DD, the club's own calendar) from which this price is in force. */
    effectiveOn: text("effective_on").notNull(),
    pricePerTroyOunce: real("price_per_troy_ounce").notNull(),
    currency: text("currency").notNull(),
    recordedBy: text("recorded_by").references(() => members.id),
    /** A wrong price is withdrawn (kept, audited), never edited or deleted. */
    withdrawnAt: integer("withdrawn_at"),
    withdrawnBy: text("withdrawn_by").references(() => members.id),
    /** The entry this one corrects, when it was entered as a replacement. */
    replaces: text("replaces"),
    note: text("note").notNull().default(""),
    createdAt: createdAt(),
    seq: seq(),
  },
  (t) => [index("reference_prices_effective").on(t.effectiveOn)],
);

/**
 * What was actually recovered: a melt of a batch of finds (the fine gold it gave) or an assay
 * of one find, with its document. The finds' figures then come from it (basis "assay").
 */
export const recoveries = sqliteTable(
  "recoveries",
  {
    id: text("id").primaryKey(),
    kind: text("kind", { enum: RECOVERY_KINDS }).notNull(),
    claimId: text("claim_id").references(() => claims.id),
    /** The club day of the melt or the assay report. */
    recordedOn: text("recorded_on").notNull(),
    /** Fine gold recovered or assayed (g). */
    fineGrams: real("fine_grams").notNull(),
    /** Fineness (‰) of the bar or the assayed gold, when the document gives it. */
    fineness: real("fineness"),
    /** What the finds' figures said before (g): the estimate this recovery is compared with. */
    estimatedGrams: real("estimated_grams").notNull(),
    /** Gross weight of the finds that went in (g), and how much of it was gold without host rock. */
    grossGrams: real("gross_grams").notNull(),
    placerGrams: real("placer_grams").notNull(),
    documentKey: text("document_key"),
    documentType: text("document_type"),
    documentName: text("document_name"),
    note: text("note").notNull().default(""),
    recordedBy: text("recorded_by").references(() => members.id),
    createdAt: createdAt(),
  },
  (t) => [index("recoveries_claim").on(t.claimId, t.recordedOn)],
);

export const recoveryFinds = sqliteTable(
  "recovery_finds",
  {
    recoveryId: text("recovery_id")
      .notNull()
      .references(() => recoveries.id),
    findId: text("find_id")
      .notNull()
      .references(() => finds.id),
    /** The find's figure before, and its share of what was recovered. */
    estimatedGrams: real("estimated_grams"),
    allocatedGrams: real("allocated_grams").notNull(),
  },
  (t) => [primaryKey({ columns: [t.recoveryId, t.findId] }), index("recovery_finds_find").on(t.findId)],
);

/** The club itself: one row. Its name heads reports; its currency and calendar hold everywhere. */
export const clubSettings = sqliteTable("club_settings", {
  id: integer("id").primaryKey(),
  name: text("name").notNull().default("Our prospecting club"),
  /** ISO 4217 code; every reference price is in it. */
  currency: text("currency").notNull().default("USD"),
  /** IANA time zone: the club's days, seasons and the day a price takes effect. */
  timeZone: text("time_zone").notNull().default("UTC"),
  updatedAt: integer("updated_at").notNull().default(now),
});

export const syncClients = sqliteTable("sync_clients", {
  id: text("id").primaryKey(),
  memberId: text("member_id")
    .notNull()
    .references(() => members.id),
  /** The mutation id of the last change applied from this client (0: none yet). */
  lastMutationId: integer("last_mutation_id").notNull().default(0),
  createdAt: createdAt(),
  updatedAt: integer("updated_at").notNull().default(now),
});

/**
 * A digest of each change applied (or refused) from a client, for its recent mutation ids:
 * a resend with the same content is a replay (skipped); different content under a used id
 * is a second device sharing the client id (a copied profile), answered as a reuse.
 */
export const syncMutations = sqliteTable(
  "sync_mutations",
  {
    clientId: text("client_id")
      .notNull()
      .references(() => syncClients.id),
    mutationId: integer("mutation_id").notNull(),
    /** SHA-256 of the change's name and arguments as sent, base64url, first 16 bytes. */
    digest: text("digest").notNull(),
  },
  (t) => [primaryKey({ columns: [t.clientId, t.mutationId] })],
);

/** Named counters; "change" is the server sequence that orders every syncable write. */
export const sequences = sqliteTable("sequences", {
  name: text("name").primaryKey(),
  value: integer("value").notNull().default(0),
});

/** Earlier versions of a record replaced by a later arrival (two devices of one member). */
export const recordHistory = sqliteTable(
  "record_history",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    entity: text("entity").notNull(),
    entityId: text("entity_id").notNull(),
    memberId: text("member_id").notNull(),
    version: text("version", { mode: "json" }).notNull().$type<Record<string, unknown>>(),
    replacedAt: integer("replaced_at").notNull().default(now),
  },
  (t) => [index("record_history_entity").on(t.entity, t.entityId)],
);

export const auditLog = sqliteTable(
  "audit_log",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    at: integer("at").notNull().default(now),
    actorId: text("actor_id"),
    action: text("action").notNull(),
    entity: text("entity").notNull(),
    entityId: text("entity_id"),
    before: text("before", { mode: "json" }).$type<unknown>(),
    after: text("after", { mode: "json" }).$type<unknown>(),
  },
  (t) => [index("audit_log_entity").on(t.entity, t.entityId)],
);

export type Member = typeof members.$inferSelect;
export type Claim = typeof claims.$inferSelect;
export type Find = typeof finds.$inferSelect;
export type Outing = typeof outings.$inferSelect;
export type WeighIn = typeof weighIns.$inferSelect;
export type Scale = typeof scales.$inferSelect;
export type BarrenRock = typeof barrenRocks.$inferSelect;
export type Answer = typeof answers.$inferSelect;
