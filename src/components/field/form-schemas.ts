import { z } from "zod";
import { parseTyped, readNumber, type NumberRule } from "@/lib/parse-number";
import { methodSchema } from "@/lib/entities/common";
import { FIND_KINDS } from "@/lib/entities/constants";

// The field screens' form schemas: fields as typed (strings), checked before the shared entity
// schema checks the record. Loaded with a form's first check (see ./lazy-resolver).

/** A number field, optional, read as people type it (by the browser's decimal mark), with the real problem named. */
const optionalNumber = (rule: NumberRule) =>
  z.string().superRefine((v, ctx) => {
    const { error } = readNumber(v, rule);
    if (error) ctx.addIssue({ code: "custom", message: error });
  });

export const findFormSchema = z
  .object({
    kind: z.enum(FIND_KINDS, { error: "Choose what you found." }),
    weight: optionalNumber({ label: "weight", above: 0 }),
    purity: optionalNumber({ label: "purity", above: 0, max: 1000, unit: "‰" }),
    depthCm: optionalNumber({ label: "depth", min: 0, max: 10_000, unit: "cm" }),
    method: methodSchema,
    claimId: z.string(),
    notes: z.string().max(4000, "At most 4000 characters."),
    foundAt: z.string().min(1, "When was it found?"),
    lat: optionalNumber({ label: "latitude", min: -90, max: 90 }),
    lon: optionalNumber({ label: "longitude", min: -180, max: 180 }),
  })
  .refine((v) => (v.lat.trim() === "") === (v.lon.trim() === ""), { message: "Give both latitude and longitude, or neither.", path: ["lat"] });

export const outingFormSchema = z.object({
  claimId: z.string(),
  method: methodSchema,
  startedAt: z.string().min(1, "When did it start?"),
  endedAt: z.string(),
  hours: z.string().refine((v) => {
    const n = parseTyped(v);
    return n === undefined || (!Number.isNaN(n) && n >= 0 && n <= 240);
  }, "Hours: a number from 0 to 240, or empty."),
  companions: z.string().max(300, "At most 300 characters."),
  conditions: z.string().max(300, "At most 300 characters."),
  notes: z.string().max(4000, "At most 4000 characters."),
});

export type FindFormValues = z.infer<typeof findFormSchema>;
export type OutingFormValues = z.infer<typeof outingFormSchema>;
