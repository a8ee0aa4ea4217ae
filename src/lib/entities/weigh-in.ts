import { z } from "zod";
import { idSchema, timestampSchema } from "./common";
import { scaleCheckRefSchema } from "./scale";
import { specimenInputSchema } from "./specimen-input";

const pairSchema = z.tuple([z.number(), z.number()]);

/**
 * A warning as the engine gives it: a code and the numbers (or codes) behind it, worded by the
 * UI. Engines before 2.0.0 kept a sentence instead; devices not yet updated still send those.
 */
const warningSchema = z.union([
  z
    .object({
      code: z.string().max(60),
      params: z.record(z.string().max(40), z.union([z.number(), z.string().max(40)])).refine((p) => Object.keys(p).length <= 12, "Too many params."),
    })
    .strict(),
  z.object({ code: z.string().max(60), message: z.string().max(500) }).strict(),
]);

/** The values an engine of 2.0.0 or later worked with. */
const assumptionsSchema = z
  .object({
    airBuoyancyCorrection: z.boolean(),
    scaleResolutionGrams: z.number(),
    scaleAccuracyGrams: z.number(),
    waterTempC: z.number(),
    waterTempRangeC: pairSchema,
    hostDensity: z.number(),
    hostDensityRange: pairSchema,
    finenessPermille: z.number(),
    finenessRangePermille: pairSchema,
    goldAlloyDensity: z.number(),
  })
  .strict();

/**
 * The estimate as a device reports it, from whichever engine version made it (kept beside
 * it); the server recomputes its own under the current version and compares.
 */
export const reportedEstimateSchema = z
  .object({
    specimenDensity: z.number(),
    volumeCm3: z.number(),
    goldAlloyGrams: z.number(),
    fineGoldGrams: z.number(),
    goldMassPercent: z.number(),
    goldVolumePercent: z.number(),
    range: z.object({ goldAlloyGrams: pairSchema, fineGoldGrams: pairSchema }),
    standardUncertainty: z.object({ goldAlloyGrams: z.number(), fineGoldGrams: z.number() }),
    warnings: z.array(warningSchema).max(20),
    assumptions: assumptionsSchema.optional(),
    engineVersion: z.string().max(20),
  })
  .strict();

export type ReportedEstimate = z.infer<typeof reportedEstimateSchema>;

/** One hydrostatic weighing of a specimen find. */
export const weighInSchema = z
  .object({
    id: idSchema,
    findId: idSchema,
    input: specimenInputSchema,
    deviceEstimate: reportedEstimateSchema,
    weighedAt: timestampSchema,
    /** The member's scale profile it was weighed on, and that scale's latest setup check then. */
    scaleId: idSchema.nullable().default(null),
    scaleCheck: scaleCheckRefSchema.nullable().default(null),
  })
  .strict();

export type WeighIn = z.infer<typeof weighInSchema>;
