import Papa from "papaparse";
import { withoutBidiControls } from "./controls";

export { withoutBidiControls } from "./controls";

/**
 * A cell a spreadsheet would run as a formula: it starts with = + - @, a tab or a carriage
 * return, and is not a plain number (OWASP "CSV Injection"). Such cells get a leading
 * apostrophe, which spreadsheets show as text.
 */
export const FORMULA_START = /^(?![-+]?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?$)[=+\-@\t\r]/;

type Cell = string | number | boolean | null | undefined;

/** CSV (RFC 4180, through papaparse) that is safe to open in a spreadsheet. */
export function toSafeCsv(fields: readonly string[], rows: readonly (readonly Cell[])[]): string {
  const data = rows.map((row) => row.map((cell) => (typeof cell === "string" ? withoutBidiControls(cell) : cell)));
  return Papa.unparse({ fields: [...fields], data }, { escapeFormulae: FORMULA_START });
}
