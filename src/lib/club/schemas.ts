import { z } from "zod";
import { ROLES } from "../roles";

export const claimInputSchema = z
  .object({
    name: z.string().trim().min(1, "Give the claim a name.").max(120, "At most 120 characters."),
    kind: z.enum(["placer", "lode"], { error: "Choose placer or lode." }),
    agencyRef: z.string().trim().max(120, "At most 120 characters.").nullable().default(null),
    rules: z.string().max(8000, "At most 8000 characters.").default(""),
    active: z.boolean().default(true),
    /** GeoJSON, checked by readBoundary; or null to clear. */
    boundary: z.unknown().optional(),
    /** Corners as "latitude, longitude" lines, an alternative to `boundary`. */
    corners: z.string().max(20_000).optional(),
  })
  .strict();

export const reviewInputSchema = z
  .object({
    action: z.enum(["verify", "query", "note"], { error: "Choose verify, query or note." }),
    note: z.string().trim().max(2000, "At most 2000 characters.").default(""),
  })
  .strict()
  .refine((r) => r.action === "verify" || r.note.length > 0, { message: "Say what the member should look at.", path: ["note"] });

export const priceInputSchema = z
  .object({
    effectiveOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use YYYY-MM-DD."),
    pricePerTroyOunce: z.number({ error: "Enter the price as a number." }).positive("The price must be above zero.").max(1_000_000, "That price is implausible."),
    currency: z.string().regex(/^[A-Z]{3}$/, "Use a three-letter currency code, like USD."),
  })
  .strict();

export const invitationInputSchema = z.object({ email: z.email("Enter an e-mail address.").max(254), role: z.enum(ROLES).default("member") }).strict();

export const memberChangeSchema = z
  .object({ role: z.enum(ROLES).optional(), active: z.boolean().optional() })
  .strict()
  .refine((c) => c.role !== undefined || c.active !== undefined, "Change the role or the status.");
