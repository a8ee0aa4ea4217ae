import type { SpecimenEstimate } from "./estimate/types";
import { isPatternFor, writeDate, type DatePattern } from "./date-pattern";
import { convertMass, type MassUnit } from "./estimate/units";

const DIGITS: Record<MassUnit, number> = { g: 2, ozt: 3, dwt: 2, gr: 1 };
/** The finest a figure is ever shown: a milligram scale's step, in each unit. */
const FINEST: Record<MassUnit, number> = { g: 3, ozt: 5, dwt: 3, gr: 2 };

/**
 * Decimals that show a standard uncertainty with two significant digits when it starts with
 * 1 or 2, else with one (JCGM 100:2008, 7.2.6: at most two), no finer than FINEST.
 */
export function decimalsForUncertainty(uncertaintyGrams: number, unit: MassUnit): number {
  let u = convertMass(Math.abs(uncertaintyGrams), unit);
  if (!(u > 0) || !Number.isFinite(u)) return FINEST[unit];
  let decimals = 0;
  while (u < 1 && decimals < FINEST[unit]) {
    u *= 10;
    decimals++;
  }
  while (u >= 10 && decimals > 0) {
    u /= 10;
    decimals--;
  }
  // u now lies in [1, 10) at `decimals` places: a leading 1 or 2 earns a second digit.
  const sig = u < 3 ? decimals + 1 : decimals;
  return Math.min(Math.max(sig, 0), FINEST[unit]);
}

/**
 * A mass in the member's unit. Given its standard uncertainty, to the precision that allows
 * (no three decimals on a ± 0.3 g figure); otherwise to the unit's usual decimals.
 */
export function formatGrams(grams: number, unit: MassUnit = "g", uncertaintyGrams?: number): string {
  const digits = uncertaintyGrams === undefined ? DIGITS[unit] : decimalsForUncertainty(uncertaintyGrams, unit);
  return `${convertMass(grams, unit).toFixed(digits)} ${unit}`;
}

/**
 * Whether the estimate's figure is held at an end of what a specimen can hold (no gold, or
 * all of it): the ± (the formula's, before that hold) then reaches past the end it is held at.
 */
export function heldAtAnEnd(e: Pick<SpecimenEstimate, "goldAlloyGrams" | "goldMassPercent">): boolean {
  return e.goldAlloyGrams <= 0 || e.goldMassPercent >= 100;
}

/**
 * An estimate's ± and worst case in words, as far as they mean anything: with no gold even at
 * the worst, that alone; around a figure held at no gold or at the whole specimen, the worst
 * case alone (a ± there would reach below nothing, or past the specimen).
 */
export function spreadText(uncertainty: number, [low, high]: readonly [number, number], show: (grams: number) => string, held: boolean): string {
  if (high <= 0) return "none, even with every reading and assumption at its worst";
  const worst = `at worst ${show(low)} – ${show(high)}`;
  return held ? worst : `± ${show(uncertainty)} · ${worst}`;
}

// Making an Intl formatter costs about as much as a thousand uses of one (a list of finds
// formatted a date per row in a fresh one, 80 ms of a first load on a slowed phone CPU): one
// per locale, zone and style, made on first use. One made for the device's own zone or language
// keeps the ones it was made with, so those are in its key: a phone carried into another zone
// with the app open gets a new one (the offsets of January, July and now tell zones apart).
const formatters = new Map<string, Intl.DateTimeFormat>();
function deviceZoneKey(): string {
  const year = new Date().getFullYear();
  return `${new Date(year, 0, 1).getTimezoneOffset()}/${new Date(year, 6, 1).getTimezoneOffset()}/${new Date().getTimezoneOffset()}`;
}
/** The browser's language (navigator.language); none on the server. */
const browserLanguage = (): string | undefined => (typeof window === "undefined" ? undefined : navigator.language);

function formatter(style: string, locale: string | undefined, timeZone: string | undefined, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  // A date in the device's own zone and language is in the browser's language, the one its
  // date pattern is for, whatever the runtime's default (Firefox, for one, can differ).
  const language = locale ?? (timeZone === undefined ? browserLanguage() : undefined);
  const key = `${style}|${language ?? "runtime"}|${timeZone ?? `device:${deviceZoneKey()}`}`;
  let f = formatters.get(key);
  if (!f) {
    try {
      f = new Intl.DateTimeFormat(language, { ...options, timeZone });
    } catch (e) {
      if (locale !== undefined || language === undefined) throw e;
      f = new Intl.DateTimeFormat(undefined, { ...options, timeZone });
    }
    formatters.set(key, f);
  }
  return f;
}

// The member's locale's date pattern (date-pattern.ts), once the device has it: dates in the
// device's own zone and language are then written from it, with no Intl formatter made.
let devicePattern: DatePattern | null = null;

/** Use this pattern for dates in the device's zone while the device's language is its locale. */
export function setDevicePattern(pattern: DatePattern | null): void {
  devicePattern = pattern;
}

function fromPattern(style: "day" | "when", ms: number, timeZone: string | undefined, locale: string | undefined): string | null {
  if (!devicePattern || timeZone !== undefined || locale !== undefined) return null;
  return isPatternFor(devicePattern, browserLanguage()) ? writeDate(devicePattern, style, ms) : null;
}

/** What a date that is not one (a corrupt record) shows: Intl would throw, taking the screen with it. */
const NO_DATE = "date unknown";
/** Dates run from 271821 BC to AD 275760 (ECMA-262, 21.4.1.1); Intl throws on any instant outside. */
const isInstant = (ms: number) => Number.isFinite(ms) && Math.abs(ms) <= 8.64e15;

/**
 * Every date and time shown goes through these two, in Intl's medium date ("3 Dec 2026",
 * "Dec 3, 2026", "03.12.2026") of the given locale, else the browser's language on the phone
 * (navigator.language) and the runtime's elsewhere: the server's on console pages it writes (in the club's zone, so the text the
 * server renders is the text that hydrates). Machine-readable dates (CSV, file names,
 * `<time dateTime>`) stay ISO 8601. On the phone, once it has its language's pattern
 * (date-pattern.ts), the text is written from that: the same text, with no formatter made.
 */
export function formatDay(ms: number, timeZone?: string, locale?: string): string {
  if (!isInstant(ms)) return NO_DATE;
  return fromPattern("day", ms, timeZone, locale) ?? formatter("day", locale, timeZone, { dateStyle: "medium" }).format(ms);
}

/** Date and time in the viewer's locale: on the device's clock, or in a given zone (the club's). */
export function formatWhen(ms: number, timeZone?: string, locale?: string): string {
  if (!isInstant(ms)) return NO_DATE;
  return fromPattern("when", ms, timeZone, locale) ?? formatter("when", locale, timeZone, { dateStyle: "medium", timeStyle: "short" }).format(ms);
}

/** A month ("2026-06") as the viewer's locale names it: "Jun 2026". */
export function formatMonth(month: string, locale?: string): string {
  const [year, m] = month.split("-").map(Number);
  const at = Date.UTC(year, m - 1, 1);
  if (!Number.isFinite(at)) return month;
  return formatter("month", locale, "UTC", { month: "short", year: "numeric" }).format(at);
}

/** For <input type="datetime-local">, in local time. */
export function toLocalInput(ms: number): string {
  const d = new Date(ms);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

let englishPlural: Intl.PluralRules | undefined;

/** "1 find", "0 finds", "12 finds": English plural of a counted noun (Intl.PluralRules). */
export function countOf(n: number, one: string, many: string): string {
  return `${n} ${(englishPlural ??= new Intl.PluralRules("en")).select(n) === "one" ? one : many}`;
}
