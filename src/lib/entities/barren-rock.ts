import { z } from "zod";
import { idSchema, shortText, timestampSchema } from "./common";
import { scaleCheckRefSchema } from "./scale";
import { densityInputSchema } from "./specimen-input";

/**
 * A barren-rock weigh-in: one piece of gold-free vein rock from a claim, weighed to learn the
 * claim's host density. No find; the density is the engine's (the server recomputes it).
 */
export const barrenRockSchema = z
  .object({
    id: idSchema,
    claimId: idSchema,
    input: densityInputSchema,
    deviceDensity: z.number().positive().max(30),
    weighedAt: timestampSchema,
    scaleId: idSchema.nullable().default(null),
    scaleCheck: scaleCheckRefSchema.nullable().default(null),
    notes: shortText(500).default(""),
  })
  .strict();

export type BarrenRock = z.infer<typeof barrenRockSchema>;
