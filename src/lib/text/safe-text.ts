import Papa from "papaparse";

/**
 * Bidirectional controls (embeddings, overrides, isolates, marks) in text people chose: an
 * override can make "gpj.exe" read as "exe.jpg" or reorder a figure beside a name. Removed
 * wherever such text leaves the app as plain text (mail, CSV, the printed report).
 */
const BIDI_CONTROL_CLASS = "\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069";
const BIDI_CONTROLS = new RegExp(`[${BIDI_CONTROL_CLASS}]`, "g");
/** Bidirectional controls and C0/C1 control characters: what a message must not echo as it came. */
const CONTROLS = new RegExp(`[\\u0000-\\u001f\\u007f-\\u009f${BIDI_CONTROL_CLASS}]`, "g");

export function withoutBidiControls(text: string): string {
  return text.replace(BIDI_CONTROLS, "");
}

/** Text of a caller's, as a message may echo it: each control character (bidi ones too) shown as "?", so a reader sees something was there. */
export function controlsMarked(text: string): string {
  return text.replace(CONTROLS, "?");
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
