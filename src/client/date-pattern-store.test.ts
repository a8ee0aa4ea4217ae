// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { learnDatePattern, type DatePattern } from "@/lib/date-pattern";
import { formatDay } from "@/lib/format";
import { checkDatePatternLater, keepDatePattern } from "./date-pattern-store";

// jsdom's navigator.language is "en-US"; this process's Intl default locale is what the device's
// own Intl writes in, so the pattern learned for it is the one that matches.
const ownLocale = new Intl.DateTimeFormat().resolvedOptions().locale;
const at = Date.UTC(2026, 11, 3, 15, 4);
const viaIntl = () => new Intl.DateTimeFormat(undefined, { dateStyle: "medium" }).format(at);

function pattern(): DatePattern {
  const p = learnDatePattern(ownLocale);
  if (!p) throw new Error(`no pattern for ${ownLocale}`);
  return { ...p, locale: navigator.language };
}
/** A pattern that writes a marker after every date: it shows which path wrote one, and it differs from Intl. */
function marked(): DatePattern {
  const p = pattern();
  return { ...p, day: { ...p.day, pieces: [...p.day.pieces, { text: " ✓" }] } };
}
const kept = () =>
  JSON.parse(localStorage.getItem("lodebook-date-pattern") ?? "null") as { checkedBy?: string; refused?: { by: string; patterns: string[] } } | null;
const refusals = () => kept()?.refused?.patterns.length ?? 0;

describe("the date pattern kept on the device", () => {
  beforeEach(() => {
    localStorage.clear();
    vi.useFakeTimers();
  });
  afterEach(() => {
    vi.useRealTimers();
    vi.restoreAllMocks();
    keepDatePattern(null);
  });

  it("a pattern sent is used at once, kept for a start with no signal, and a null sent drops it", () => {
    keepDatePattern(marked());
    expect(formatDay(at)).toBe(`${viaIntl()} ✓`);
    setDeviceFresh();
    keepDatePattern();
    expect(formatDay(at)).toBe(`${viaIntl()} ✓`);
    keepDatePattern(null);
    expect(formatDay(at)).toBe(viaIntl());
    keepDatePattern();
    expect(formatDay(at)).toBe(viaIntl());
  });

  it("a damaged pattern, sent or kept, is not used", () => {
    keepDatePattern({ locale: "en-US", day: { pieces: [{ field: "weekday" }] } });
    expect(formatDay(at)).toBe(viaIntl());
    localStorage.setItem("lodebook-date-pattern", "{not json");
    keepDatePattern();
    expect(formatDay(at)).toBe(viaIntl());
  });

  it("once idle, a pattern that writes as this browser's Intl is marked checked, and not checked again", () => {
    keepDatePattern(pattern());
    checkDatePatternLater(1000);
    vi.advanceTimersByTime(1000);
    expect(kept()?.checkedBy).toBe(navigator.userAgent);
    expect(formatDay(at)).toBe(viaIntl());
    // The same pattern sent again keeps its check.
    keepDatePattern(pattern());
    expect(kept()?.checkedBy).toBe(navigator.userAgent);
  });

  it("a pattern that does not is refused by this browser: dates come from Intl, even when the server sends it again", () => {
    keepDatePattern(marked());
    expect(formatDay(at)).toBe(`${viaIntl()} ✓`);
    checkDatePatternLater(1000);
    vi.advanceTimersByTime(999);
    expect(refusals()).toBe(0);
    vi.advanceTimersByTime(1);
    expect(kept()?.refused?.by).toBe(navigator.userAgent);
    expect(refusals()).toBe(1);
    expect(formatDay(at)).toBe(viaIntl());
    keepDatePattern(marked());
    expect(formatDay(at)).toBe(viaIntl());
    // Another language's pattern and back: the refusal stands.
    keepDatePattern(null);
    keepDatePattern(marked());
    expect(formatDay(at)).toBe(viaIntl());
    // A different pattern (the server's ICU updated) is a new one to use and check.
    keepDatePattern(pattern());
    expect(formatDay(at)).toBe(viaIntl());
    expect(kept()?.checkedBy).toBeUndefined();
    checkDatePatternLater(1000);
    vi.advanceTimersByTime(1000);
    expect(kept()?.checkedBy).toBe(navigator.userAgent);
  });

  it("no check, and nothing recorded, while the browser's language is not the pattern's", () => {
    const other = { ...marked(), locale: "de-DE" };
    keepDatePattern(other);
    expect(formatDay(at)).toBe(viaIntl());
    checkDatePatternLater(1000);
    vi.advanceTimersByTime(5000);
    expect(kept()?.checkedBy).toBeUndefined();
    expect(refusals()).toBe(0);
  });

  it("storage that refuses writes: the pattern sent is still used, and nothing throws", () => {
    vi.spyOn(Storage.prototype, "setItem").mockImplementation(() => {
      throw new DOMException("full", "QuotaExceededError");
    });
    expect(() => keepDatePattern(marked())).not.toThrow();
    expect(formatDay(at)).toBe(`${viaIntl()} ✓`);
  });

  it("leaving before the check cancels it", () => {
    keepDatePattern(marked());
    const stop = checkDatePatternLater(1000);
    stop();
    vi.advanceTimersByTime(5000);
    expect(refusals()).toBe(0);
  });
});

/** A new start of the app: the module state reset to no pattern, storage as it was. */
function setDeviceFresh() {
  const saved = localStorage.getItem("lodebook-date-pattern");
  keepDatePattern(null);
  if (saved) localStorage.setItem("lodebook-date-pattern", saved);
}
