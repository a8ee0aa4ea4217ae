import { z } from "zod";
import { idSchema, methodSchema, shortText, timestampSchema } from "./common";

import { FIND_KINDS, LOCATION_SOURCES } from "./constants";

export { FIND_KINDS, KIND_LABELS, LOCATION_SOURCES } from "./constants";

export const latSchema = z.number().min(-90, "Latitude is between −90 and 90.").max(90, "Latitude is between −90 and 90.");
export const lonSchema = z.number().min(-180, "Longitude is between −180 and 180.").max(180, "Longitude is between −180 and 180.");

/** Anything recovered: a nugget, a specimen, flakes, fines, crystalline gold. */
export const findSchema = z
  .object({
    id: idSchema,
    outingId: idSchema.nullable(),
    claimId: idSchema.nullable(),
    kind: z.enum(FIND_KINDS, { error: "Choose what you found." }),
    weightGrams: z.number().positive("The weight must be more than zero.").max(100_000, "At most 100 kg.").nullable(),
    /** The gold's fineness in ‰ when the member knows it (a buyer's test, an earlier assay). */
    purity: z.number().min(1, "Purity is in parts per thousand, more than 0.").max(1000, "Purity is at most 1000 ‰ (pure gold).").nullable().default(null),
    depthCm: z.number().min(0, "Depth cannot be negative.").max(10_000, "At most 100 m.").nullable(),
    method: methodSchema,
    notes: shortText(4000),
    lat: latSchema.nullable(),
    lon: lonSchema.nullable(),
    accuracyM: z.number().min(0).max(100_000).nullable(),
    locationSource: z.enum(LOCATION_SOURCES).nullable(),
    foundAt: timestampSchema,
  })
  .strict()
  .refine((f) => (f.lat === null) === (f.lon === null), { message: "Give both latitude and longitude, or neither.", path: ["lat"] });

export type Find = z.infer<typeof findSchema>;
export type FindKind = Find["kind"];
