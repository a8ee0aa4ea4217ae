import { z } from "zod";
import { wholeNumber } from "../web/whole-number";
import { FIND_KINDS } from "../entities/find";
import type { FineBasis } from "../figures/fine-basis";
import { calendarDate } from "../time/calendar-date";
import type { Totals } from "./totals";

export const REVIEW_STATES = ["new", "verified", "queried", "answered"] as const;
/** The review filter: a state, or "changed": queried or answered, and changed by the member since the latest query. */
export const REVIEW_FILTERS = [...REVIEW_STATES, "changed"] as const;
export const LEDGER_SORTS = ["foundAt", "weight", "fine", "value", "member", "claim", "kind", "method", "state"] as const;

const isoDate = calendarDate("Use a real calendar date as YYYY-MM-DD.");
const optionalId = z
  .string()
  .uuid("Not a valid id.")
  .optional()
  .or(z.literal("").transform(() => undefined));

/** The club ledger's filters, sort and page, as a query string carries them. */
export const ledgerQuerySchema = z
  .object({
    claimId: optionalId,
    memberId: optionalId,
    season: wholeNumber("season", 2000, 2100).optional(),
    from: isoDate.optional(),
    to: isoDate.optional(),
    kind: z
      .enum(FIND_KINDS)
      .optional()
      .or(z.literal("").transform(() => undefined)),
    state: z
      .enum(REVIEW_FILTERS)
      .optional()
      .or(z.literal("").transform(() => undefined)),
    sort: z.enum(LEDGER_SORTS).default("foundAt"),
    dir: z.enum(["asc", "desc"]).default("desc"),
    page: wholeNumber("page", 1, 100_000).default(1),
    pageSize: wholeNumber("pageSize", 1, 200).default(50),
    price: z.enum(["find-date", "today"]).default("find-date"),
  })
  .strict()
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: "The start date must not be after the end date.", path: ["from"] });

export type LedgerQuery = z.infer<typeof ledgerQuerySchema>;

export type LedgerRow = {
  id: string;
  memberId: string;
  memberName: string | null;
  claimId: string | null;
  claimName: string | null;
  foundAt: number;
  /** The club day it was found on (the club's time zone). */
  foundOn: string;
  kind: string;
  method: string;
  weightGrams: number | null;
  alloyGrams: number | null;
  fineGrams: number | null;
  fineLow: number | null;
  fineHigh: number | null;
  fineBasis: FineBasis | null;
  weighMismatch: boolean;
  /** Its latest weigh-in was made on a scale whose latest setup check passed; null when it has none. */
  scaleChecked: boolean | null;
  /** Its position lies outside the boundary of its claim. */
  outsideClaim: boolean;
  price: number | null;
  currency: string | null;
  value: number | null;
  state: (typeof REVIEW_STATES)[number];
  /** Queried or answered, and the find or its weigh-ins changed after the latest query. */
  changedSinceQuery: boolean;
};

/** The totals (one module: ./totals) and their value at the reference price, low to high. */
export type LedgerSummary = Totals & { value: number; valueLow: number; valueHigh: number; currency: string | null };
export type LedgerPage = { rows: LedgerRow[]; total: number; summary: LedgerSummary; page: number; pageSize: number };

/** What the export adds to a ledger row: where and how it was found, as the member shares it. */
export type ExportRow = LedgerRow & {
  outingId: string | null;
  outingOn: string | null;
  depthCm: number | null;
  notes: string;
  /** Only where the member shares exact positions with officers. */
  lat: number | null;
  lon: number | null;
};

/** Columns of the CSV export, in order. */
export const LEDGER_CSV_COLUMNS = [
  "id",
  "foundOn",
  "foundAt",
  "outingId",
  "outingOn",
  "lat",
  "lon",
  "depthCm",
  "notes",
  "memberName",
  "claimName",
  "kind",
  "method",
  "weightGrams",
  "alloyGrams",
  "fineGrams",
  "fineLow",
  "fineHigh",
  "fineBasis",
  "weighMismatch",
  "scaleChecked",
  "outsideClaim",
  "price",
  "currency",
  "value",
  "state",
  "changedSinceQuery",
] as const;
