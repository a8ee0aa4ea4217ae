import { z } from "zod";
import { GOLD_DENSITY } from "@/lib/estimate/alloy";
import { MAX_READING_GRAMS, MAX_STEP_GRAMS } from "@/lib/estimate/defaults";

// Limits are the engine's own; the engine checks them again (and what depends on several
// fields, like a host that must stay below the gold alloy's density).
const reading = z.number({ error: "Enter a number in grams." }).finite().positive("Must be more than zero.").max(MAX_READING_GRAMS, "At most 100 000 g.");
const readings = z.array(reading).min(1, "Enter at least one reading.").max(20, "At most 20 readings.");
const pair = (min: number, max: number) =>
  z.tuple([z.number().min(min).max(max), z.number().min(min).max(max)]).refine(([lo, hi]) => lo <= hi, "Give the low value first.");

/** What a weigh-in records: the engine's SpecimenInput, checked at every edge. */
export const specimenInputSchema = z
  .object({
    method: z.enum(["hanging", "buoyancy"], { error: "Choose hanging or buoyancy." }),
    airGrams: readings,
    waterGrams: readings,
    scaleResolutionGrams: z.number().positive("Must be more than zero.").max(MAX_STEP_GRAMS).optional(),
    scaleAccuracyGrams: z.number().min(0, "At least 0 g.").max(MAX_STEP_GRAMS).optional(),
    waterTempC: z.number().min(0, "At least 0 °C.").max(40, "At most 40 °C.").optional(),
    waterTempToleranceC: z.number().min(0).max(20).optional(),
    hostDensity: z.number().gt(1, "Above 1 g/cm³.").lt(GOLD_DENSITY, "Below pure gold's 19.32 g/cm³.").optional(),
    hostDensityRange: pair(1, GOLD_DENSITY).optional(),
    finenessPermille: z.number().gt(0, "Above 0 ‰.").max(1000, "At most 1000 ‰.").optional(),
    finenessRangePermille: pair(0, 1000).optional(),
    goldDensity: z.number().gt(1).max(GOLD_DENSITY, "At most 19.32 g/cm³ (pure gold).").optional(),
    airBuoyancyCorrection: z.boolean().optional(),
  })
  .strict();

export type SpecimenInputData = z.infer<typeof specimenInputSchema>;

/** What a density measurement records (a setup check, a barren-rock piece): the rig and the readings. */
export const densityInputSchema = specimenInputSchema.pick({
  method: true,
  airGrams: true,
  waterGrams: true,
  scaleResolutionGrams: true,
  scaleAccuracyGrams: true,
  waterTempC: true,
  waterTempToleranceC: true,
  airBuoyancyCorrection: true,
});

export type DensityInputData = z.infer<typeof densityInputSchema>;
