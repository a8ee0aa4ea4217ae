import { z } from "zod";
import { idSchema, methodSchema, shortText, timestampSchema } from "./common";

/** One day or trip on a claim. */
export const outingSchema = z
  .object({
    id: idSchema,
    claimId: idSchema.nullable(),
    startedAt: timestampSchema,
    endedAt: timestampSchema.nullable(),
    companions: shortText(300),
    method: methodSchema,
    hours: z.number().min(0, "Hours cannot be negative.").max(240, "At most 240 hours.").nullable(),
    conditions: shortText(300),
    notes: shortText(4000),
  })
  .strict()
  .refine((o) => o.endedAt === null || o.endedAt >= o.startedAt, { message: "The end must come after the start.", path: ["endedAt"] });

export type Outing = z.infer<typeof outingSchema>;
