import { z } from "zod";

/** Client-made ids: UUID v7 (time-ordered), so nothing needs the server to exist first. */
export const idSchema = z.uuid({ error: "Not a valid id." });
export const timestampSchema = z.number().int("Must be a whole number of milliseconds.").min(946684800000, "Before the year 2000.").max(4102444800000, "After the year 2100.");
export const shortText = (max: number) => z.string().max(max, `At most ${max} characters.`);

export const OUTING_METHODS = ["detecting", "panning", "sluicing", "drywashing", "other"] as const;
export const METHOD_LABELS: Record<(typeof OUTING_METHODS)[number], string> = {
  detecting: "Detecting",
  panning: "Panning",
  sluicing: "Sluicing",
  drywashing: "Drywashing",
  other: "Other",
};
export const methodSchema = z.enum(OUTING_METHODS, { error: "Choose a method." });
