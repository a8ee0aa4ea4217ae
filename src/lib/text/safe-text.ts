import Papa from "papaparse";

/**
 * Bidirectional controls (embeddings, overrides, isolates, marks) in text people chose: an
 * override can make "gpj.exe" read as "exe.jpg" or reorder a figure beside a name. Removed
 * wherever such text leaves the app as plain text (mail, CSV, the printed report).
 */
const BIDI_CONTROLS = /[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

export function withoutBidiControls(text: string): string {
  return text.replace(BIDI_CONTROLS, "");
}

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
