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
export function parseNumber(text: string, decimal?: DecimalMark | (() => DecimalMark | undefined)): number | undefined {
  let t = text
    .trim()
    .replace(/[\u00a0\u202f\u2009 ']/g, (m, offset: number, s: string) => (/\d/.test(s[offset - 1] ?? "") && /\d/.test(s[offset + 1] ?? "") ? "_" : m));
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
  // The locale's mark is looked up only here and below, where the text could be read two ways.
  const localMark = () => (typeof decimal === "function" ? decimal() : decimal);
  if (count > 1) return grouped(t, mark) && mark !== localMark() ? finish(t.split(mark).join(""), "") : Number.NaN;
  const tail = rest[0];
  if (!/^\d*$/.test(tail) || (head === "" && tail === "")) return Number.NaN;
  // One mark. Before exactly three digits it may be either; otherwise only a decimal.
  const couldGroup = tail.length === 3 && /^[1-9]\d{0,2}$/.test(head);
  if (!couldGroup) return finish(head, tail);
  const local = localMark();
  if (local === undefined) return Number.NaN;
  return mark === local ? finish(head, tail) : finish(head + tail, "");
}

// Asked once per locale. A page's first Intl formatter loads the browser's locale tables (35-60
// ms on the main thread, measured in Chromium), and the weigh-in forms read every field on every
// draw: each read made a formatter, so opening the barren-rock form held the main thread for
// its first one though no field held a number yet. Now the mark is asked only for text that
// needs it (parseNumber) and kept.
const marks = new Map<string, DecimalMark>();

/** The decimal mark of a locale ("en-US" → ".", "de-DE" → ","), from the browser's own tables. */
export function decimalMarkOf(locale?: string): DecimalMark {
  const key = locale ?? `device:${typeof navigator === "undefined" ? "" : navigator.language}`;
  let mark = marks.get(key);
  if (!mark) {
    const part = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === "decimal");
    mark = part?.value === "," ? "," : ".";
    marks.set(key, mark);
  }
  return mark;
}

/** The decimal mark where this code runs: the member's browser (or the server's default locale). */
export const localDecimalMark = (): DecimalMark => decimalMarkOf();

export type NumberRule = { label: string; min?: number; above?: number; max?: number; unit?: string };

/**
 * A number field read as people type it, with a message that names the real problem:
 * "could be 2400 or 2.4", "must be more than 0", "at most 100 000 g" — never just "type a
 * number" for a number that is out of bounds. Empty gives no value and no message.
 */
export function readNumber(
  text: string,
  rule: NumberRule,
  decimal: DecimalMark | null | (() => DecimalMark) = localDecimalMark,
): { value?: number; error?: string } {
  const n = parseNumber(text, decimal ?? undefined);
  if (n === undefined) return {};
  const unit = rule.unit ? ` ${rule.unit}` : "";
  if (Number.isNaN(n)) {
    const t = text.trim();
    if (/^[-+]?\d{1,3}[.,]\d{3}$/.test(t) && parseNumber(t, ".") !== parseNumber(t, ",")) {
      return { error: `“${t}” could be ${parseNumber(t, ".")} or ${parseNumber(t, ",")}: write it without a thousands mark.` };
    }
    return { error: `Type the ${rule.label} as a number, like 12.5.` };
  }
  if (rule.above !== undefined && !(n > rule.above)) return { error: `The ${rule.label} must be more than ${rule.above}${unit}.` };
  if (rule.min !== undefined && n < rule.min) return { error: `The ${rule.label} must be at least ${rule.min}${unit}.` };
  if (rule.max !== undefined && n > rule.max)
    return { error: `The ${rule.label} can be at most ${rule.max.toLocaleString("en-US").replace(/,/g, " ")}${unit}.` };
  return { value: n };
}

/** A number as the member typed it in a field, read by their browser's decimal mark. */
export const parseTyped = (text: string): number | undefined => parseNumber(text, localDecimalMark);
