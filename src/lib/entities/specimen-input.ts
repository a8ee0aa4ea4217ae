import { z } from "zod";
import { unknownFieldsText } from "@/lib/text/controls";
import { GOLD_DENSITY } from "@/lib/estimate/alloy";
import { MAX_READING_GRAMS, MAX_STEP_GRAMS } from "@/lib/estimate/defaults";

// Limits are the engine's own; the engine checks them again (and what depends on several
// fields, like a host that must stay below the gold alloy's density).
/** A number, or a message saying so (zod's own names a type: "expected number, received string"). */
const number = () => z.number({ error: "Enter a number." });
const reading = number().finite().positive("Must be more than zero.").max(MAX_READING_GRAMS, "At most 100 000 g.");
const readings = z.array(reading, { error: "Enter the readings as a list of numbers." }).min(1, "Enter at least one reading.").max(20, "At most 20 readings.");
const between = (min: number, max: number, unit: string) => number().min(min, `At least ${min}${unit}.`).max(max, `At most ${max}${unit}.`);
const pair = (min: number, max: number, unit: string) =>
  z
    .tuple([between(min, max, unit), between(min, max, unit)], { error: "Give a low and a high value." })
    .refine(([lo, hi]) => lo <= hi, "Give the low value first.");

/** An object's own refusals: a field it does not know, named; anything but an object. */
const objectError = (what: string) => (issue: { code: string; keys?: string[] }) => {
  if (issue.code === "unrecognized_keys" && issue.keys) return `${unknownFieldsText(issue.keys)}: send ${what}'s own fields only.`;
  if (issue.code === "invalid_type") return `Send ${what} as an object of named fields.`;
  return undefined;
};

/** What a weigh-in records: the engine's SpecimenInput, checked at every edge. */
export const specimenInputSchema = z
  .object(
    {
      method: z.enum(["hanging", "buoyancy"], { error: "Choose hanging or buoyancy." }),
      airGrams: readings,
      waterGrams: readings,
      scaleResolutionGrams: number().positive("Must be more than zero.").max(MAX_STEP_GRAMS, `At most ${MAX_STEP_GRAMS} g.`).optional(),
      scaleAccuracyGrams: between(0, MAX_STEP_GRAMS, " g").optional(),
      waterTempC: between(0, 40, " °C").optional(),
      waterTempToleranceC: between(0, 20, " °C").optional(),
      hostDensity: number().gt(1, "Above 1 g/cm³.").lt(GOLD_DENSITY, "Below pure gold's 19.32 g/cm³.").optional(),
      hostDensityRange: pair(1, GOLD_DENSITY, " g/cm³").optional(),
      finenessPermille: number().gt(0, "Above 0 ‰.").max(1000, "At most 1000 ‰.").optional(),
      finenessRangePermille: pair(0, 1000, " ‰").optional(),
      goldDensity: number().gt(1, "Above 1 g/cm³.").max(GOLD_DENSITY, "At most 19.32 g/cm³ (pure gold).").optional(),
      airBuoyancyCorrection: z.boolean({ error: "Give true or false." }).optional(),
    },
    { error: objectError("the weighing") },
  )
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
