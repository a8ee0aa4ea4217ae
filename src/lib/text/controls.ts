// Control characters in text people chose, in a module of its own (no CSV library with it), so
// client code that echoes a caller's text can use it too.

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

/** A caller's key as a message may show it: 40 characters at most, controls marked. */
export function shownKey(key: string | number): string {
  return Array.from(controlsMarked(String(key)))
    .slice(0, 40)
    .join("");
}

/** Unknown fields a caller sent, as a message names them: the first five, shown as keys, and how many more. */
export function unknownFieldsText(keys: readonly string[]): string {
  const names = keys.slice(0, 5).map((k) => `"${shownKey(k)}"`);
  const more = keys.length - names.length;
  return `${keys.length > 1 ? "Fields" : "Field"} ${names.join(", ")}${more > 0 ? ` and ${more} more` : ""} not known here`;
}
