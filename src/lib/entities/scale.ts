import { z } from "zod";
import { MAX_STEP_GRAMS } from "@/lib/estimate/defaults";
import { idSchema, shortText, timestampSchema } from "./common";
import { densityInputSchema } from "./specimen-input";

export const REFERENCE_KINDS = ["copper", "gold-coin", "quartz", "own"] as const;

/** The object a setup check weighs: its density and standard uncertainty (k = 1), g/cm³. */
const referenceSchema = z
  .object({
    kind: z.enum(REFERENCE_KINDS, { error: "Choose the reference object." }),
    label: shortText(120),
    density: z.number({ error: "Enter the object's density in g/cm³." }).gt(1, "Above 1 g/cm³.").max(25, "At most 25 g/cm³."),
    uncertainty: z.number({ error: "Enter how well its density is known, in g/cm³." }).min(0, "At least 0.").max(5, "At most 5 g/cm³."),
  })
  .strict();

/** The verdict as the device's engine gave it (the server recomputes its own). */
const checkResultSchema = z
  .object({
    measuredDensity: z.number(),
    measuredUncertainty: z.number(),
    referenceDensity: z.number(),
    referenceUncertainty: z.number(),
    combinedUncertainty: z.number(),
    allowedDifference: z.number(),
    difference: z.number(),
    differencePercent: z.number(),
    passed: z.boolean(),
    coarse: z.boolean(),
    engineVersion: z.string().max(20),
  })
  .strict();

/** One setup check: a reference object of known density weighed on the rig, and the verdict. */
export const setupCheckSchema = z
  .object({
    id: idSchema,
    checkedAt: timestampSchema,
    reference: referenceSchema,
    input: densityInputSchema,
    result: checkResultSchema,
  })
  .strict();

/** A member's scale: its display step, its stated accuracy (null: the default for the step) and its checks, oldest first. */
export const scaleSchema = z
  .object({
    id: idSchema,
    name: z.string().trim().min(1, "Give the scale a name.").max(80, "At most 80 characters."),
    stepGrams: z
      .number({ error: "Enter the scale's step in grams." })
      .positive("The step must be more than zero.")
      .max(MAX_STEP_GRAMS, `At most ${MAX_STEP_GRAMS} g.`),
    accuracyGrams: z.number().min(0, "At least 0 g.").max(MAX_STEP_GRAMS, `At most ${MAX_STEP_GRAMS} g.`).nullable(),
    checks: z.array(setupCheckSchema).max(200, "At most 200 checks kept per scale."),
  })
  .strict();

/** What a weigh-in keeps of its scale's latest setup check at the time. */
export const scaleCheckRefSchema = z.object({ id: idSchema, passed: z.boolean(), checkedAt: timestampSchema }).strict();

export type SetupCheck = z.infer<typeof setupCheckSchema>;
export type Scale = z.infer<typeof scaleSchema>;
export type ScaleCheckRef = z.infer<typeof scaleCheckRefSchema>;
