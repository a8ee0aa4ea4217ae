import { z } from "zod";
import { idSchema } from "../entities/common";
import { LOCATION_SHARING } from "../entities/constants";
import { answerSchema } from "../entities/answer";
import { barrenRockSchema } from "../entities/barren-rock";
import { findSchema } from "../entities/find";
import { outingSchema } from "../entities/outing";
import { photoSchema } from "../entities/photo";
import { scaleSchema } from "../entities/scale";
import { weighInSchema } from "../entities/weigh-in";

/** Member settings the club's server needs to know (the rest stay on the device). */
export const memberSettingsSchema = z
  .object({
    locationSharing: z.enum(LOCATION_SHARING).optional(),
    /** Tell the member by e-mail when an officer queries one of their finds. */
    mailOnQuery: z.boolean().optional(),
  })
  .strict()
  .refine((s) => s.locationSharing !== undefined || s.mailOnQuery !== undefined, "Send at least one setting.");

/**
 * Every change a device can send, by name, with the schema of its arguments. Puts carry the
 * whole record (the server's order of arrival decides between two devices); deletes an id.
 */
export const MUTATION_ARGS = {
  "outing.put": outingSchema,
  "outing.delete": z.object({ id: idSchema }).strict(),
  "find.put": findSchema,
  "find.delete": z.object({ id: idSchema }).strict(),
  "photo.put": photoSchema,
  "photo.delete": z.object({ id: idSchema }).strict(),
  "weighIn.put": weighInSchema,
  "weighIn.delete": z.object({ id: idSchema }).strict(),
  "scale.put": scaleSchema,
  "scale.delete": z.object({ id: idSchema }).strict(),
  "barrenRock.put": barrenRockSchema,
  "barrenRock.delete": z.object({ id: idSchema }).strict(),
  "answer.put": answerSchema,
  "settings.put": memberSettingsSchema,
} as const;

export type MutationName = keyof typeof MUTATION_ARGS;
export const MUTATION_NAMES = Object.keys(MUTATION_ARGS) as MutationName[];
export type MutationArgs<N extends MutationName> = z.infer<(typeof MUTATION_ARGS)[N]>;
