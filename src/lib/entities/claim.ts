import { z } from "zod";
import { CLAIM_KINDS } from "./constants";

/** [longitude, latitude] (an optional altitude is allowed and ignored), WGS 84. */
const position = z
  .array(z.number())
  .min(2, "A position needs longitude and latitude.")
  .max(3)
  .refine(([lon, lat]) => Math.abs(lon) <= 180 && Math.abs(lat) <= 90, "Longitude must be within ±180 and latitude within ±90.");
const ring = z.array(position).min(4, "A ring needs at least four positions (the first repeated last).");

export const polygonSchema = z.union([
  z.object({ type: z.literal("Polygon"), coordinates: z.array(ring).min(1) }),
  z.object({ type: z.literal("MultiPolygon"), coordinates: z.array(z.array(ring).min(1)).min(1) }),
]);

/** A claim as members' devices keep it (read-only on the device). */
export const claimViewSchema = z.object({
  id: z.string(),
  name: z.string(),
  kind: z.enum(CLAIM_KINDS),
  agencyRef: z.string().nullable(),
  boundary: polygonSchema.nullable(),
  rules: z.string(),
  active: z.boolean(),
  // The claim gold profile (servers before it sent none: the weigh-in then starts from presets).
  fineness: z.number().optional(),
  finenessLow: z.number().optional(),
  finenessHigh: z.number().optional(),
  finenessSource: z.string().optional(),
  hostDensity: z.number().optional(),
  hostDensityLow: z.number().optional(),
  hostDensityHigh: z.number().optional(),
  hostDensitySource: z.string().optional(),
});

export type ClaimView = z.infer<typeof claimViewSchema>;
export type Polygon = z.infer<typeof polygonSchema>;
