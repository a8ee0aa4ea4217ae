import { z } from "zod";
import { idSchema } from "./common";

/**
 * A member's answer to an officer's query of one of their finds: the member's own record,
 * written on the device and synced like any other. It names the query it answers, so a later
 * query is open again until it has an answer of its own.
 */
export const answerSchema = z
  .object({
    id: idSchema,
    findId: idSchema,
    reviewId: idSchema,
    note: z.string().trim().min(1, "Write your answer to the officer.").max(2000, "At most 2000 characters."),
  })
  .strict();

export type Answer = z.infer<typeof answerSchema>;
