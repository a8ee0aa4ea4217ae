import { z } from "zod";
import { parseNumber } from "@/lib/parse-number";
import { methodSchema } from "@/lib/entities/common";
import { FIND_KINDS } from "@/lib/entities/constants";

// The field screens' form schemas: fields as typed (strings), checked before the shared entity
// schema checks the record. Loaded with a form's first check (see ./lazy-resolver).

const optionalNumber = (message: string, ok: (n: number) => boolean) =>
  z.string().refine((v) => {
    const n = parseNumber(v);
    return n === undefined || (!Number.isNaN(n) && ok(n));
  }, message);

export const findFormSchema = z
  .object({
    kind: z.enum(FIND_KINDS, { error: "Choose what you found." }),
    weight: optionalNumber("The weight must be a number above zero, or empty.", (n) => n > 0),
    purity: optionalNumber("Purity is parts per thousand gold, above 0 and at most 1000, or empty.", (n) => n > 0 && n <= 1000),
    depthCm: optionalNumber("The depth must be a number of centimetres, or empty.", (n) => n >= 0 && n <= 10_000),
    method: methodSchema,
    claimId: z.string(),
    notes: z.string().max(4000, "At most 4000 characters."),
    foundAt: z.string().min(1, "When was it found?"),
    lat: optionalNumber("Latitude is a number between −90 and 90.", (n) => Math.abs(n) <= 90),
    lon: optionalNumber("Longitude is a number between −180 and 180.", (n) => Math.abs(n) <= 180),
  })
  .refine((v) => (v.lat.trim() === "") === (v.lon.trim() === ""), { message: "Give both latitude and longitude, or neither.", path: ["lat"] });


export const outingFormSchema = z.object({
  claimId: z.string(),
  method: methodSchema,
  startedAt: z.string().min(1, "When did it start?"),
  endedAt: z.string(),
  hours: z.string().refine((v) => {
    const n = parseNumber(v);
    return n === undefined || (!Number.isNaN(n) && n >= 0 && n <= 240);
  }, "Hours: a number from 0 to 240, or empty."),
  companions: z.string().max(300, "At most 300 characters."),
  conditions: z.string().max(300, "At most 300 characters."),
  notes: z.string().max(4000, "At most 4000 characters."),
});

export type FindFormValues = z.infer<typeof findFormSchema>;
export type OutingFormValues = z.infer<typeof outingFormSchema>;
