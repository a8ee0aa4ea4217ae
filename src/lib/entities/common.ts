import { z } from "zod";
import { OUTING_METHODS } from "./constants";

/** Client-made ids: UUID v7 (time-ordered), so nothing needs the server to exist first. */
export const idSchema = z.uuid({ error: "Not a valid id." });
export const timestampSchema = z
  .number()
  .int("Must be a whole number of milliseconds.")
  .min(946684800000, "Before the year 2000.")
  .max(4102444800000, "After the year 2100.");
export const shortText = (max: number) => z.string().max(max, `At most ${max} characters.`);

export { METHOD_LABELS, OUTING_METHODS } from "./constants";
export const methodSchema = z.enum(OUTING_METHODS, { error: "Choose a method." });
