import { z } from "zod";
import { CLAIM_KINDS, RECOVERY_KINDS, REVIEW_ACTIONS, ROYALTY_KINDS } from "../entities/constants";
import { ROLES } from "../roles";
import { calendarDate } from "../time/calendar-date";

export const claimInputSchema = z
  .object({
    name: z.string().trim().min(1, "Give the claim a name.").max(120, "At most 120 characters."),
    kind: z.enum(CLAIM_KINDS, { error: "Choose placer or lode." }),
    agencyRef: z.string().trim().max(120, "At most 120 characters.").nullable().default(null),
    rules: z.string().max(8000, "At most 8000 characters.").default(""),
    active: z.boolean().default(true),
    /** GeoJSON, checked by readBoundary; or null to clear. */
    boundary: z.unknown().optional(),
    /** Corners as "latitude, longitude" lines, an alternative to `boundary`. */
    corners: z.string().max(20_000).optional(),
    /** Set once the officer has seen which claims the outline overlaps, and means it. */
    acceptOverlap: z.boolean().default(false),
    landowner: z.string().trim().max(200, "At most 200 characters.").nullable().default(null),
    royaltyKind: z.enum(ROYALTY_KINDS, { error: "Choose a share of the value or grams per troy ounce." }).nullable().default(null),
    royaltyRate: z.number({ error: "Give the royalty as a number." }).min(0, "A royalty cannot be negative.").max(100, "At most 100.").nullable().default(null),
  })
  .strict()
  .refine((c) => (c.royaltyKind === null) === (c.royaltyRate === null), {
    message: "Give both the kind of royalty and its rate, or neither.",
    path: ["royaltyRate"],
  })
  .refine((c) => c.royaltyKind !== "grams_per_troy_ounce" || (c.royaltyRate ?? 0) <= 31.1034768, {
    message: "At most 31.1 g per troy ounce (all of it).",
    path: ["royaltyRate"],
  });

/**
 * A claim's gold profile as an officer sets it: each quantity as its range, whose middle is its
 * value (the estimate takes every assumption as spread evenly over its range), and a source.
 */
export const claimProfileInputSchema = z
  .object({
    finenessLow: z.number({ error: "Fineness, lowest: a number of ‰." }).min(1, "Fineness is more than 0 ‰.").max(1000, "Fineness is at most 1000 ‰."),
    finenessHigh: z.number({ error: "Fineness, highest: a number of ‰." }).min(1, "Fineness is more than 0 ‰.").max(1000, "Fineness is at most 1000 ‰."),
    finenessSource: z.string().trim().min(3, "Say where the fineness comes from (an assay, a melt, a preset).").max(300, "At most 300 characters."),
    hostDensityLow: z
      .number({ error: "Host density, lowest: a number of g/cm³." })
      .min(1.5, "Host rock is denser than 1.5 g/cm³.")
      .max(8, "Host rock is at most 8 g/cm³."),
    hostDensityHigh: z
      .number({ error: "Host density, highest: a number of g/cm³." })
      .min(1.5, "Host rock is denser than 1.5 g/cm³.")
      .max(8, "Host rock is at most 8 g/cm³."),
    hostDensitySource: z.string().trim().min(3, "Say where the host density comes from (barren-rock weigh-ins, a preset).").max(300, "At most 300 characters."),
  })
  .strict()
  .refine((p) => p.finenessLow <= p.finenessHigh, { message: "The lowest fineness must not be above the highest.", path: ["finenessLow"] })
  // At most 8 g/cm³ (galena, the densest common gangue, is about 7.6 [memory]): always below
  // silver's 10.49, so the estimate can tell host from alloy at any fineness.
  .refine((p) => p.hostDensityLow <= p.hostDensityHigh, { message: "The lowest host density must not be above the highest.", path: ["hostDensityLow"] });

export const refigureInputSchema = z.object({ season: z.number().int().min(2000).max(2100) }).strict();

export const reviewInputSchema = z
  .object({
    action: z.enum(REVIEW_ACTIONS, { error: "Choose verify, query or note." }),
    note: z.string().trim().max(2000, "At most 2000 characters.").default(""),
  })
  .strict()
  .refine((r) => r.action === "verify" || r.note.length > 0, { message: "Say what the member should look at.", path: ["note"] });

export const priceInputSchema = z
  .object({
    effectiveOn: calendarDate(),
    pricePerTroyOunce: z
      .number({ error: "Enter the price as a number." })
      .positive("The price must be more than 0.")
      .max(1_000_000, "That price is implausible: at most 1 000 000 an ounce."),
    currency: z.string().regex(/^[A-Z]{3}$/, "Use a three-letter currency code, like USD."),
    note: z.string().trim().max(300, "At most 300 characters.").default(""),
    /** Set when the officer has seen the warning about a jump of more than half from the price then in force. */
    confirmJump: z.boolean().default(false),
  })
  .strict();

export const priceChangeSchema = z.discriminatedUnion(
  "action",
  [
    z.object({ action: z.literal("withdraw"), note: z.string().trim().min(3, "Say why the price is withdrawn.").max(300, "At most 300 characters.") }).strict(),
    z.object({ action: z.literal("replace"), price: priceInputSchema }).strict(),
  ],
  { error: "Choose withdraw or replace." },
);

export const clubSettingsSchema = z
  .object({
    name: z.string().trim().min(2, "Give the club's name.").max(120, "At most 120 characters."),
    currency: z.string().regex(/^[A-Z]{3}$/, "Use a three-letter currency code, like USD."),
    timeZone: z.string().refine(isTimeZone, "Choose a time zone from the list (IANA names, like America/Los_Angeles)."),
  })
  .strict();

function isTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: zone });
    return zone.length <= 64;
  } catch {
    return false;
  }
}

export const invitationInputSchema = z.object({ email: z.email("Enter an e-mail address.").max(254), role: z.enum(ROLES).default("member") }).strict();

export const memberChangeSchema = z
  .object({ role: z.enum(ROLES).optional(), active: z.boolean().optional() })
  .strict()
  .refine((c) => c.role !== undefined || c.active !== undefined, "Change the role or the status.");

/** A melt of a batch of finds or an assay of one, as an officer records it. */
export const recoveryInputSchema = z
  .object({
    kind: z.enum(RECOVERY_KINDS, { error: "Choose melt or assay." }),
    claimId: z.uuid("Choose the claim.").nullable(),
    recordedOn: calendarDate(),
    fineGrams: z.number({ error: "Enter the fine gold in grams." }).positive("Fine gold must be more than 0 g.").max(1_000_000, "At most 1000 kg."),
    fineness: z
      .number({ error: "Enter the fineness in ‰." })
      .min(1, "Fineness is more than 0 ‰.")
      .max(1000, "Fineness is at most 1000 ‰.")
      .nullable()
      .default(null),
    findIds: z.array(z.uuid()).min(1, "Choose the finds that went in.").max(5000, "At most 5000 finds in one melt."),
    note: z.string().trim().max(500, "At most 500 characters.").default(""),
  })
  .strict()
  .refine((r) => r.kind !== "assay" || r.findIds.length === 1, { message: "An assay is of one find.", path: ["findIds"] })
  .refine((r) => r.kind !== "assay" || r.fineness !== null, { message: "Give the assayed fineness.", path: ["fineness"] });
