import { z } from "zod";
import { idSchema, timestampSchema } from "./common";
import { specimenInputSchema } from "./specimen-input";

/** The estimate as a device reports it; the server recomputes its own and compares. */
export const reportedEstimateSchema = z
  .object({
    specimenDensity: z.number(),
    volumeCm3: z.number(),
    goldAlloyGrams: z.number(),
    fineGoldGrams: z.number(),
    goldMassPercent: z.number(),
    goldVolumePercent: z.number(),
    range: z.object({ goldAlloyGrams: z.tuple([z.number(), z.number()]), fineGoldGrams: z.tuple([z.number(), z.number()]) }),
    standardUncertainty: z.object({ goldAlloyGrams: z.number(), fineGoldGrams: z.number() }),
    warnings: z.array(z.object({ code: z.string().max(60), message: z.string().max(500) })).max(20),
    engineVersion: z.string().max(20),
  })
  .strict();

/** One hydrostatic weighing of a specimen find. */
export const weighInSchema = z
  .object({
    id: idSchema,
    findId: idSchema,
    input: specimenInputSchema,
    deviceEstimate: reportedEstimateSchema,
    weighedAt: timestampSchema,
  })
  .strict();

export type WeighIn = z.infer<typeof weighInSchema>;
