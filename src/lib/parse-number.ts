/** Which mark separates decimals where the member types: "." (12.5) or "," (12,5). */
export type DecimalMark = "." | ",";

/**
 * A number as people type it. Empty is undefined; anything that is not a number, or that could
 * be read two ways, is NaN (callers say so, never guess):
 * - "12.5" and "12,5" are decimals where only one reading makes sense ("35,1" cannot be 351);
 * - a separator before exactly three digits is a thousands mark in a locale whose decimal mark
 *   is the other one ("2,495" is 2495 where "." is decimal), a decimal where it is the decimal
 *   mark, and ambiguous (NaN) when the locale is unknown;
 * - with both marks ("2,495.50", "2.495,50") the last is the decimal and the others must group
 *   by threes; spaces, no-break spaces and apostrophes may group thousands ("2 495", "2'495").
 */
export function parseNumber(text: string, decimal?: DecimalMark): number | undefined {
  let t = text.trim().replace(/[\u00a0\u202f\u2009 ']/g, (m, offset: number, s: string) => (/\d/.test(s[offset - 1] ?? "") && /\d/.test(s[offset + 1] ?? "") ? "_" : m));
  if (t === "") return undefined;
  if (/^[-+]?\d+(\.\d+)?e[-+]?\d+$/i.test(t)) return Number(t);
  const sign = /^[-+]/.test(t) ? t[0] : "";
  t = t.slice(sign.length);
  if (!/^[\d.,_]+$/.test(t) || !/\d/.test(t)) return Number.NaN;
  const grouped = (intPart: string, mark: string) => {
    const groups = intPart.split(mark);
    return /^\d{1,3}$/.test(groups[0]) && groups.slice(1).every((g) => /^\d{3}$/.test(g));
  };
  const finish = (intPart: string, frac: string) => Number(`${sign}${intPart || "0"}${frac ? `.${frac}` : ""}`);

  // Spaces (as "_") group thousands only.
  if (t.includes("_") && !grouped(t.split(/[.,]/)[0], "_")) return Number.NaN;
  t = t.replace(/_/g, "");
  const commas = (t.match(/,/g) ?? []).length;
  const points = (t.match(/\./g) ?? []).length;
  if (commas === 0 && points === 0) return finish(t, "");

  if (commas > 0 && points > 0) {
    const dec = t.lastIndexOf(",") > t.lastIndexOf(".") ? "," : ".";
    const group = dec === "," ? "." : ",";
    const at = t.lastIndexOf(dec);
    const intPart = t.slice(0, at);
    const frac = t.slice(at + 1);
    if (intPart.includes(dec) || !grouped(intPart, group) || !/^\d+$/.test(frac)) return Number.NaN;
    return finish(intPart.split(group).join(""), frac);
  }

  const mark = commas > 0 ? "," : ".";
  const count = commas + points;
  const [head, ...rest] = t.split(mark);
  if (count > 1) return grouped(t, mark) && mark !== decimal ? finish(t.split(mark).join(""), "") : Number.NaN;
  const tail = rest[0];
  if (!/^\d*$/.test(tail) || (head === "" && tail === "")) return Number.NaN;
  // One mark. Before exactly three digits it may be either; otherwise only a decimal.
  const couldGroup = tail.length === 3 && /^[1-9]\d{0,2}$/.test(head);
  if (!couldGroup) return finish(head, tail);
  if (decimal === undefined) return Number.NaN;
  return mark === decimal ? finish(head, tail) : finish(head + tail, "");
}

/** The decimal mark of a locale ("en-US" → ".", "de-DE" → ","), from the browser's own tables. */
export function decimalMarkOf(locale?: string): DecimalMark {
  const part = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === "decimal");
  return part?.value === "," ? "," : ".";
}
