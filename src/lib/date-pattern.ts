/**
 * A locale's medium date and its date with short time, written down once from Intl's own output
 * so a phone can draw dates without making an Intl formatter. A page's first Intl date or number
 * formatter loads the browser's locale tables: 40-90 ms of the main thread here, a few hundred on
 * a mid-range phone, at every start of the app. The server (which has those tables loaded
 * anyway) learns the member's locale's pattern and sends it with who is signed in; the device
 * keeps it and draws dates from it in its own zone. A pattern is only ever given when it writes
 * exactly what Intl writes for that locale over a spread of dates and times; otherwise none, and
 * the device asks Intl as before.
 */

/** A part of a written date: text as it stands, or a field. */
export type DatePiece =
  | { text: string }
  | { field: "year" | "year2" | "month" | "month2" | "monthName" | "day" | "day2" | "minute2" | "dayPeriod" }
  | { field: "hour" | "hour2"; cycle: HourCycle };

type HourCycle = "h11" | "h12" | "h23" | "h24";

export type DateStylePattern = { pieces: DatePiece[]; months: string[]; periods: [string, string] };

export type DatePattern = { locale: string; day: DateStylePattern; when: DateStylePattern };

/** The calendar fields of an instant, as the device's clock or UTC reads them. */
type Fields = { year: number; month: number; day: number; hour: number; minute: number };

const localFields = (ms: number): Fields => {
  const d = new Date(ms);
  return { year: d.getFullYear(), month: d.getMonth(), day: d.getDate(), hour: d.getHours(), minute: d.getMinutes() };
};
const utcFields = (ms: number): Fields => {
  const d = new Date(ms);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth(), day: d.getUTCDate(), hour: d.getUTCHours(), minute: d.getUTCMinutes() };
};

const two = (n: number) => String(n).padStart(2, "0");

function hourIn(cycle: HourCycle, hour: number): number {
  if (cycle === "h23") return hour;
  if (cycle === "h24") return hour === 0 ? 24 : hour;
  if (cycle === "h11") return hour % 12;
  return hour % 12 === 0 ? 12 : hour % 12;
}

function write(style: DateStylePattern, f: Fields): string {
  let out = "";
  for (const piece of style.pieces) {
    if ("text" in piece) {
      out += piece.text;
      continue;
    }
    switch (piece.field) {
      case "year":
        out += String(f.year);
        break;
      case "year2":
        out += two(f.year % 100);
        break;
      case "month":
        out += String(f.month + 1);
        break;
      case "month2":
        out += two(f.month + 1);
        break;
      case "monthName":
        out += style.months[f.month];
        break;
      case "day":
        out += String(f.day);
        break;
      case "day2":
        out += two(f.day);
        break;
      case "minute2":
        out += two(f.minute);
        break;
      case "dayPeriod":
        out += style.periods[f.hour < 12 ? 0 : 1];
        break;
      case "hour":
        out += String(hourIn(piece.cycle, f.hour));
        break;
      case "hour2":
        out += two(hourIn(piece.cycle, f.hour));
        break;
    }
  }
  return out;
}

/** Whether the pattern is for this language (a browser's navigator.language): tags match case-blind. */
export const isPatternFor = (pattern: DatePattern, language: string | undefined): boolean => language?.toLowerCase() === pattern.locale.toLowerCase();

/**
 * An instant written in the pattern, on this device's clock; null outside years 1000-9999, where
 * Intl writes eras and signs the pattern was never checked against.
 */
export function writeDate(pattern: DatePattern, style: "day" | "when", ms: number): string | null {
  const fields = localFields(ms);
  return fields.year >= 1000 && fields.year <= 9999 ? write(pattern[style], fields) : null;
}

const OPTIONS = { day: { dateStyle: "medium" }, when: { dateStyle: "medium", timeStyle: "short" } } as const;

// Instants the pattern is checked against: every month, one- and two-digit days, every hour
// (both halves of the day, both sides of noon and midnight), minutes 0 and 59, and years whose
// two last digits start with 0.
const SAMPLES: number[] = [];
for (const year of [2026, 2009]) {
  for (let month = 0; month < 12; month++) {
    for (const day of [1, 9, 10, 28]) {
      const hour = (month * 4 + day) % 24;
      SAMPLES.push(Date.UTC(year, month, day, hour, (month * 7) % 60));
    }
  }
}
for (let hour = 0; hour < 24; hour++) SAMPLES.push(Date.UTC(2026, 11, 3, hour, hour % 2 ? 59 : 0));

function learnStyle(locale: string, style: "day" | "when"): DateStylePattern | null {
  const intl = new Intl.DateTimeFormat(locale, { ...OPTIONS[style], timeZone: "UTC" });
  const resolved = intl.resolvedOptions();
  if (resolved.numberingSystem !== "latn" || resolved.calendar !== "gregory") return null;
  const cycle = (resolved.hourCycle ?? "h23") as HourCycle;
  const months = Array.from({ length: 12 }, (_, m) => intl.formatToParts(Date.UTC(2026, m, 15, 12)).find((p) => p.type === "month")?.value ?? "");
  const periods: [string, string] = ["", ""];
  for (const [i, hour] of [
    [0, 9],
    [1, 15],
  ] as const) {
    periods[i] = intl.formatToParts(Date.UTC(2026, 11, 3, hour)).find((p) => p.type === "dayPeriod")?.value ?? "";
  }
  // The fields' widths are read from an instant whose day, month, hour and year all have one
  // digit or a short form: 3 March 2009, 04:05.
  const probe = Date.UTC(2009, 2, 3, 4, 5);
  const pieces: DatePiece[] = [];
  for (const part of intl.formatToParts(probe)) {
    const v = part.value;
    switch (part.type) {
      case "literal":
        pieces.push({ text: v });
        break;
      case "year":
        if (v !== "2009" && v !== "09") return null;
        pieces.push({ field: v === "2009" ? "year" : "year2" });
        break;
      case "month":
        pieces.push({ field: v === "3" ? "month" : v === "03" ? "month2" : "monthName" });
        break;
      case "day":
        if (v !== "3" && v !== "03") return null;
        pieces.push({ field: v === "3" ? "day" : "day2" });
        break;
      case "hour":
        pieces.push({ field: v.length === 2 ? "hour2" : "hour", cycle });
        break;
      case "minute":
        if (v !== "05") return null;
        pieces.push({ field: "minute2" });
        break;
      case "dayPeriod":
        pieces.push({ field: "dayPeriod" });
        break;
      default:
        // Weekdays, eras, time-zone names, other calendars' years: not written down here.
        return null;
    }
  }
  const learned: DateStylePattern = { pieces, months, periods };
  const writesAsIntl = (pattern: DateStylePattern) => SAMPLES.every((ms) => write(pattern, utcFields(ms)) === intl.format(ms));
  if (writesAsIntl(learned)) return learned;
  // format() and formatToParts() can disagree on a space: V8 gives U+202F (narrow no-break
  // space) before AM/PM or "г." in parts, and a plain one in text, for pages that broke on the
  // narrow one. The text is what is shown, so its space is the one kept.
  const plain = { ...learned, pieces: pieces.map((p) => ("text" in p ? { text: p.text.replace(/\u202f/g, " ") } : p)) };
  return writesAsIntl(plain) ? plain : null;
}

/**
 * Whether the pattern writes what this runtime's own Intl writes for the pattern's locale, in
 * its own zone, over the same spread of instants. The server learns a pattern from its ICU; a
 * browser ships its own, and the two can differ (Korean's a.m./p.m., for one, differs between
 * Node 20's and Chromium's), so the device checks once, when it is idle, what it was sent.
 */
export function matchesOwnIntl(pattern: DatePattern): boolean {
  const day = new Intl.DateTimeFormat(pattern.locale, OPTIONS.day);
  const when = new Intl.DateTimeFormat(pattern.locale, OPTIONS.when);
  return SAMPLES.every((ms) => writeDate(pattern, "day", ms) === day.format(ms) && writeDate(pattern, "when", ms) === when.format(ms));
}

/** The longest language tag kept (a pattern's locale is a plain tag: "zh-Hant-TW" is 10). */
const MAX_TAG = 35;

// Only a language, with a script and a region if given ("de", "de-CH", "sr-Latn-RS", "es-419"):
// what browsers send. Extensions ("-u-ca-…-nu-…"), variants and private use are refused before
// Intl sees them: each new combination makes Intl keep tables of its own for good (about 40 kB
// outside the JS heap), and a client can invent combinations by the hundred thousand.
const PLAIN_TAG = /^[a-z]{2,3}(-[a-z]{4})?(-([a-z]{2}|[0-9]{3}))?$/i;

/**
 * The locale's patterns, or null when Intl does not know the tag or writes something the
 * pattern cannot (other digits, other calendars, weekdays): then the device uses Intl itself.
 */
export function learnDatePattern(tag: string): DatePattern | null {
  if (!PLAIN_TAG.test(tag)) return null;
  try {
    const [locale] = Intl.getCanonicalLocales(tag);
    // A tag Intl cannot serve falls back to another locale: a pattern must be the tag's own.
    if (!locale || Intl.DateTimeFormat.supportedLocalesOf([locale]).length === 0) return null;
    const day = learnStyle(locale, "day");
    const when = day && learnStyle(locale, "when");
    return day && when ? { locale, day, when } : null;
  } catch {
    return null;
  }
}

/**
 * The first language of an Accept-Language header ("de-CH,de;q=0.9,en;q=0.8" is "de-CH"), if
 * any: browsers list theirs first, and one weighted q=0 is one the reader does not want.
 */
export function firstLanguage(header: string | null): string | null {
  for (const entry of (header ?? "").slice(0, 200).split(",")) {
    const [tag, ...params] = entry.split(";").map((p) => p.trim());
    if (!tag || tag === "*" || params.some((p) => /^q=0(\.0*)?$/i.test(p))) continue;
    return tag;
  }
  return null;
}

const PIECE_FIELDS = new Set(["year", "year2", "month", "month2", "monthName", "day", "day2", "minute2", "dayPeriod", "hour", "hour2"]);
const CYCLES = new Set(["h11", "h12", "h23", "h24"]);
const isText = (v: unknown, max = 64): v is string => typeof v === "string" && v.length <= max;

function isStyle(v: unknown): v is DateStylePattern {
  if (typeof v !== "object" || v === null) return false;
  const s = v as Record<string, unknown>;
  return (
    Array.isArray(s.months) &&
    s.months.length === 12 &&
    s.months.every((m) => isText(m)) &&
    Array.isArray(s.periods) &&
    s.periods.length === 2 &&
    s.periods.every((p) => isText(p)) &&
    Array.isArray(s.pieces) &&
    s.pieces.length <= 40 &&
    s.pieces.every((p: unknown) => {
      if (typeof p !== "object" || p === null) return false;
      const piece = p as Record<string, unknown>;
      if ("text" in piece) return isText(piece.text);
      if (!PIECE_FIELDS.has(String(piece.field))) return false;
      return piece.field === "hour" || piece.field === "hour2" ? CYCLES.has(String(piece.cycle)) : true;
    })
  );
}

/**
 * A pattern kept on the device or sent by the server, checked by hand: the device reads it at
 * start, before the validator's chunk (zod) is loaded, and a damaged one is simply not used.
 */
export function isDatePattern(v: unknown): v is DatePattern {
  if (typeof v !== "object" || v === null) return false;
  const p = v as Record<string, unknown>;
  return isText(p.locale, MAX_TAG) && isStyle(p.day) && isStyle(p.when);
}
