/**
 * Names (claims, scales) in an order blind to case and accents: "apple", "Álamo" and "Bench"
 * sort as a reader expects. Not the browser's collator: its first use on a page loads the
 * language's collation tables, 25–30 ms of a phone's start (measured on these machines), for
 * lists of a few names. Names equal but for case or accents keep a fixed order between them.
 */
export function compareNames(a: string, b: string): number {
  const [x, y] = [fold(a), fold(b)];
  if (x !== y) return x < y ? -1 : 1;
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Lower case, accents dropped (the marks Unicode's canonical decomposition separates). */
const fold = (s: string) => s.normalize("NFD").replace(/\p{M}/gu, "").toLowerCase();
