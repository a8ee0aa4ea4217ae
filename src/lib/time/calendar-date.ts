import { z } from "zod";

/** The years a club's dates can fall in: its records, prices and filters. */
export const FIRST_YEAR = 1900;
export const LAST_YEAR = 2999;

/**
 * A real calendar day as YYYY-MM-DD, in the years a club's records can have. An impossible day
 * ("2024-13-45") would otherwise roll over into another, and the last day a date type holds
 * has no next day to end a range on ("9999-12-31").
 */
export const calendarDate = (message = "Give a real calendar date as YYYY-MM-DD.") =>
  z.iso.date(message).refine((d) => d >= `${FIRST_YEAR}-01-01` && d <= `${LAST_YEAR}-12-31`, `Give a date from ${FIRST_YEAR} to ${LAST_YEAR}.`);
