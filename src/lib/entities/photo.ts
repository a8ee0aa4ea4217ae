import { z } from "zod";
import { idSchema, timestampSchema } from "./common";
import { latSchema, lonSchema } from "./find";
import { MAX_PHOTO_BYTES, MAX_PHOTO_EDGE, PHOTO_TYPES } from "./constants";

export { MAX_PHOTO_BYTES, MAX_PHOTO_EDGE, PHOTO_TYPES } from "./constants";

/** A photo's record; its bytes travel separately, checked by their SHA-256. */
export const photoSchema = z
  .object({
    id: idSchema,
    findId: idSchema,
    sha256: z.string().regex(/^[0-9a-f]{64}$/, "Not a SHA-256 in hex."),
    contentType: z.enum(PHOTO_TYPES, { error: "Photos are stored as JPEG." }),
    bytes: z.number().int().positive().max(MAX_PHOTO_BYTES, "At most 4 MB after shrinking."),
    width: z.number().int().positive().max(MAX_PHOTO_EDGE),
    height: z.number().int().positive().max(MAX_PHOTO_EDGE),
    takenAt: timestampSchema.nullable(),
    lat: latSchema.nullable(),
    lon: lonSchema.nullable(),
  })
  .strict();

export type Photo = z.infer<typeof photoSchema>;
