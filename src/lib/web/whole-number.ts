import { z } from "zod";

type Words = { type?: string; min?: string; max?: string };

/**
 * A whole number as a query string carries it (or as code passes it): decimal digits only.
 * JavaScript's Number, which z.coerce uses, also reads "0x7d9", "1e3", " 12", "+1" and "" (as 0),
 * so each of those named a season, page or byte offset that nobody wrote.
 */
export function wholeNumber(what: string, min: number, max: number, words: Words = {}) {
  const type = words.type ?? `Give ${what} as a whole number in decimal digits.`;
  return z
    .union(
      [
        z.number(),
        z
          .string()
          .regex(/^-?\d{1,16}$/)
          .transform(Number),
      ],
      { error: type },
    )
    .pipe(
      z
        .number()
        .int(type)
        .min(min, words.min ?? `${what} must be at least ${min}.`)
        .max(max, words.max ?? `${what} must be at most ${max}.`),
    );
}
