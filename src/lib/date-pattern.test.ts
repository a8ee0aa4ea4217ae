import { afterEach, describe, expect, it, vi } from "vitest";
import { firstLanguage, isDatePattern, learnDatePattern, writeDate, type DatePattern } from "./date-pattern";
import { formatDay, formatWhen, setDevicePattern } from "./format";

// Locales of the clubs' members (common practice: the languages a club of this kind is likely
// to read), each of which must get a pattern.
const EXPECTED = [
  "en-US",
  "en-GB",
  "en-AU",
  "en-CA",
  "de-DE",
  "fr-FR",
  "fr-CA",
  "es-ES",
  "es-MX",
  "pt-BR",
  "it-IT",
  "nl-NL",
  "sv-SE",
  "fi-FI",
  "pl-PL",
  "ru-RU",
  "ja-JP",
  "zh-CN",
  "ko-KR",
];

// Instants spread over decades, every hour of the day and both sides of daylight-saving changes.
const INSTANTS: number[] = [];
for (let i = 0; i < 400; i++) INSTANTS.push(Date.UTC(1990, 0, 1) + i * 97_531_357_913);
for (let h = 0; h < 48; h++) INSTANTS.push(Date.UTC(2026, 2, 8, 0, 30) + h * 3_600_000, Date.UTC(2026, 10, 1, 0, 30) + h * 3_600_000);

const pattern = (tag: string): DatePattern => {
  const p = learnDatePattern(tag);
  if (!p) throw new Error(`no pattern for ${tag}`);
  return p;
};

describe("a locale's date pattern writes exactly what Intl writes", () => {
  it.each(EXPECTED)("%s: every instant, medium date and date with short time, in the device's zone", (tag) => {
    const p = pattern(tag);
    expect(p.locale).toBe(tag);
    // The device's zone here is the test process's; Intl is asked for that same zone.
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    const day = new Intl.DateTimeFormat(tag, { dateStyle: "medium", timeZone: zone });
    const when = new Intl.DateTimeFormat(tag, { dateStyle: "medium", timeStyle: "short", timeZone: zone });
    for (const ms of INSTANTS) {
      expect(writeDate(p, "day", ms)).toBe(day.format(ms));
      expect(writeDate(p, "when", ms)).toBe(when.format(ms));
    }
  });

  // Zones with daylight saving, half-hour and half-hour-saving offsets (IANA tz database).
  it.each([
    ["America/Denver", 360],
    ["Asia/Kolkata", -330],
    ["Australia/Lord_Howe", -630],
    ["America/St_Johns", 150],
  ])("on a device in %s, every locale, across its clock changes", (zone, julyOffset) => {
    vi.stubEnv("TZ", zone);
    try {
      expect(new Date(Date.UTC(2026, 6, 1)).getTimezoneOffset()).toBe(julyOffset);
      for (const tag of EXPECTED) {
        const p = pattern(tag);
        const day = new Intl.DateTimeFormat(tag, { dateStyle: "medium", timeZone: zone });
        const when = new Intl.DateTimeFormat(tag, { dateStyle: "medium", timeStyle: "short", timeZone: zone });
        for (const ms of INSTANTS) {
          expect(writeDate(p, "day", ms), tag).toBe(day.format(ms));
          expect(writeDate(p, "when", ms), tag).toBe(when.format(ms));
        }
      }
    } finally {
      vi.unstubAllEnvs();
    }
  });

  it("none where Intl writes what a pattern cannot: other digits, calendars or day periods, or a tag it does not know", () => {
    // ar-EG writes Arabic-Indic digits, th-TH the Buddhist calendar's years, zh-TW "early
    // morning" and "noon" as well as a.m./p.m. (CLDR data as shipped with Node's ICU).
    for (const tag of ["ar-EG", "th-TH", "zh-TW", "zz-ZZ", "i-klingon"]) {
      expect(learnDatePattern(tag)).toBeNull();
    }
  });

  it("none, and no error, for whatever a client sends as a language", () => {
    for (const tag of ["", "x".repeat(36), "x".repeat(100_000), "../../etc/passwd", "en US", "en-US-", "__proto__", "constructor", "\u00e9\u00e9"]) {
      expect(learnDatePattern(tag)).toBeNull();
    }
  });

  it("only a language with its script and region: extensions, variants and private use are refused before Intl sees them", () => {
    // Each new extension combination makes Intl keep tables of its own for good: a client
    // rotating them could grow the server's memory without bound.
    for (const tag of [
      "en-US-u-hc-h23",
      "en-US-u-nu-thai",
      "en-US-u-ca-japanese",
      "de-DE-u-ca-buddhist-hc-h11",
      "en-US-POSIX",
      "de-CH-1996",
      "en-x-lodebook",
      "x-private",
    ]) {
      expect(learnDatePattern(tag), tag).toBeNull();
    }
    for (const tag of ["de", "de-CH", "sr-Latn-RS", "es-419", "zh-Hans-CN"]) expect(learnDatePattern(tag), tag).not.toBeNull();
  });

  it("outside years 1000-9999 the pattern gives way to Intl", () => {
    const p = pattern("en-US");
    expect(writeDate(p, "day", Date.UTC(999, 5, 1))).toBeNull();
    expect(writeDate(p, "day", Date.UTC(10000, 5, 1))).toBeNull();
  });
});

describe("the first language of an Accept-Language header", () => {
  it.each([
    ["de-CH,de;q=0.9,en;q=0.8", "de-CH"],
    ["en-US", "en-US"],
    [" fr-FR ;q=1", "fr-FR"],
    ["de;q=0,en-GB;q=0.5", "en-GB"],
    ["*,fr;q=0.8", "fr"],
    ["de;q=0.0", null],
    ["*", null],
    ["", null],
    [null, null],
  ])("%j is %j", (header, first) => {
    expect(firstLanguage(header)).toBe(first);
  });
});

describe("a pattern kept on the device is checked before use", () => {
  it("a learned pattern, through JSON, passes", () => {
    expect(isDatePattern(JSON.parse(JSON.stringify(pattern("de-DE"))))).toBe(true);
  });

  it.each([
    ["no months", (p: DatePattern) => ({ ...p, day: { ...p.day, months: p.day.months.slice(1) } })],
    ["an unknown field", (p: DatePattern) => ({ ...p, when: { ...p.when, pieces: [{ field: "weekday" }] } })],
    ["an hour with no cycle", (p: DatePattern) => ({ ...p, when: { ...p.when, pieces: [{ field: "hour" }] } })],
    ["a huge text", (p: DatePattern) => ({ ...p, day: { ...p.day, pieces: [{ text: "x".repeat(10_000) }] } })],
    ["too many pieces", (p: DatePattern) => ({ ...p, day: { ...p.day, pieces: Array.from({ length: 41 }, () => ({ field: "day" })) } })],
    ["a huge month name", (p: DatePattern) => ({ ...p, day: { ...p.day, months: [...p.day.months.slice(1), "m".repeat(65)] } })],
    ["three day periods", (p: DatePattern) => ({ ...p, when: { ...p.when, periods: ["am", "pm", "noon"] } })],
    ["no locale", (p: DatePattern) => ({ ...p, locale: 7 })],
    ["not an object", () => "en-US"],
    ["null", () => null],
  ])("damaged (%s): refused", (_, damage) => {
    expect(isDatePattern(damage(JSON.parse(JSON.stringify(pattern("en-GB")))))).toBe(false);
  });
});

describe("the device's dates use its pattern only for its own language", () => {
  afterEach(() => {
    setDevicePattern(null);
    vi.unstubAllGlobals();
  });

  it("with the pattern of the device's language, formatDay and formatWhen write from it, as Intl would", () => {
    vi.stubGlobal("window", {});
    vi.stubGlobal("navigator", { language: "de-DE" });
    const ms = Date.UTC(2026, 11, 3, 15, 4);
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    const p = pattern("de-DE");
    // A pattern with a marker in its text shows which path wrote the date.
    setDevicePattern({ ...p, day: { ...p.day, pieces: [...p.day.pieces, { text: "·" }] } });
    expect(formatDay(ms)).toBe(`${new Intl.DateTimeFormat("de-DE", { dateStyle: "medium", timeZone: zone }).format(ms)}·`);
    setDevicePattern(p);
    expect(formatWhen(ms)).toBe(new Intl.DateTimeFormat("de-DE", { dateStyle: "medium", timeStyle: "short", timeZone: zone }).format(ms));
  });

  it("another language's pattern, a given zone or a given locale: Intl, as before", () => {
    vi.stubGlobal("window", {});
    vi.stubGlobal("navigator", { language: "en-US" });
    const p = pattern("de-DE");
    setDevicePattern(p);
    const ms = Date.UTC(2026, 11, 3, 15, 4);
    expect(formatDay(ms)).toBe(new Intl.DateTimeFormat(undefined, { dateStyle: "medium" }).format(ms));
    vi.stubGlobal("navigator", { language: "de-DE" });
    expect(formatDay(ms, "Pacific/Auckland")).toBe(new Intl.DateTimeFormat(undefined, { dateStyle: "medium", timeZone: "Pacific/Auckland" }).format(ms));
    expect(formatDay(ms, undefined, "fr-FR")).toBe(new Intl.DateTimeFormat("fr-FR", { dateStyle: "medium" }).format(ms));
  });

  it("with no pattern, the device's dates are in the browser's language too, whatever the runtime's default", () => {
    // Firefox's navigator.language follows the content-language preference, its Intl default the
    // interface's: the pattern is for the first, so Intl is asked for it as well.
    vi.stubGlobal("window", {});
    vi.stubGlobal("navigator", { language: "de-DE" });
    const ms = Date.UTC(2026, 11, 3, 15, 4);
    const zone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    expect(new Intl.DateTimeFormat().resolvedOptions().locale).not.toBe("de-DE");
    expect(formatDay(ms)).toBe(new Intl.DateTimeFormat("de-DE", { dateStyle: "medium", timeZone: zone }).format(ms));
  });

  it("an instant Intl cannot write shows as unknown on both paths", () => {
    vi.stubGlobal("window", {});
    vi.stubGlobal("navigator", { language: "en-US" });
    setDevicePattern(pattern("en-US"));
    expect(formatDay(9e15)).toBe("date unknown");
    setDevicePattern(null);
    expect(formatWhen(-9e15)).toBe("date unknown");
  });
});
