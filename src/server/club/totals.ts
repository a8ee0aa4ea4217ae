import "server-only";
import { sql, type SQL } from "drizzle-orm";
import type { Totals } from "@/lib/club/totals";
import { FINE_BASES } from "@/lib/figures/fine-basis";
import { getDb } from "../db";

/**
 * The one home of production totals: every total over finds (ledger, report, chart, console,
 * digest) is these columns over `finds f`, reading the figures kept on the find.
 */
export const TOTAL_COLUMN_TEXT = [
  "count(*) as finds",
  "coalesce(sum(f.weight_grams), 0) as weightGrams",
  "coalesce(sum(f.latest_fine_grams), 0) as fineGrams",
  "coalesce(sum(f.latest_fine_low), 0) as fineLow",
  "coalesce(sum(f.latest_fine_high), 0) as fineHigh",
  "count(f.latest_fine_grams) as figured",
  "coalesce(sum(f.weigh_mismatch), 0) as mismatched",
  ...FINE_BASES.map((b) => `sum(f.fine_basis = '${b}') as "basis_${b}"`),
].join(", ");
export const TOTAL_COLUMNS = sql.raw(TOTAL_COLUMN_TEXT);

type TotalsRow = Omit<Totals, "byBasis"> & Record<`basis_${string}`, number | null>;

/** A row of TOTAL_COLUMNS as Totals. */
export function toTotals(row: TotalsRow): Totals {
  const byBasis: Totals["byBasis"] = {};
  for (const b of FINE_BASES) {
    const n = row[`basis_${b}`];
    if (n) byBasis[b] = n;
  }
  return {
    finds: row.finds,
    weightGrams: row.weightGrams,
    fineGrams: row.fineGrams,
    fineLow: row.fineLow,
    fineHigh: row.fineHigh,
    figured: row.figured,
    mismatched: row.mismatched,
    byBasis,
  };
}

/** Totals grouped by the given key expressions, with the key values as `k0`, `k1`… */
export function totalsBy<K extends Record<string, unknown>>(from: SQL, keys: SQL[]): (K & { totals: Totals })[] {
  const select = keys.length ? sql.join([...keys.map((k, i) => sql`${k} as ${sql.raw(`k${i}`)}`), TOTAL_COLUMNS], sql`, `) : TOTAL_COLUMNS;
  const group = keys.length
    ? sql` group by ${sql.join(
        keys.map((_, i) => sql.raw(`k${i}`)),
        sql`, `,
      )}`
    : sql``;
  return getDb()
    .all<TotalsRow & Record<string, unknown>>(sql`select ${select} ${from}${group}`)
    .map((r) => {
      const key: Record<string, unknown> = {};
      keys.forEach((_, i) => (key[`k${i}`] = r[`k${i}`]));
      return { ...(key as K), totals: toTotals(r) };
    });
}
