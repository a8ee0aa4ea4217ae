import { isDatePattern, isPatternFor, matchesOwnIntl, type DatePattern } from "@/lib/date-pattern";
import { setDevicePattern } from "@/lib/format";
import { whenIdle } from "./when-idle";

// What the device keeps of the date pattern the server sends (date-pattern.ts), in
// localStorage: read at every start, before the first date is drawn, with no signal.
//   pattern    the pattern last sent for this browser's language
//   checkedBy  the browser (its user agent) that found it writes as its own Intl does
//   refused    the patterns a browser found it does not (a few, newest last): not used on it,
//              even when the server sends one again after another language's
const KEY = "lodebook-date-pattern";
const MAX_REFUSED = 8;

type Refused = { by: string; patterns: string[] };
type Kept = { pattern: DatePattern | null; checkedBy?: string; refused?: Refused };

function read(): Kept {
  try {
    const kept = JSON.parse(localStorage.getItem(KEY) ?? "null") as Partial<Kept> | null;
    if (!kept || typeof kept !== "object") return { pattern: null };
    const refused = kept.refused;
    const validRefused =
      refused && typeof refused.by === "string" && Array.isArray(refused.patterns) && refused.patterns.every((p) => typeof p === "string")
        ? { by: refused.by, patterns: refused.patterns.slice(-MAX_REFUSED) }
        : undefined;
    return {
      pattern: isDatePattern(kept.pattern) ? kept.pattern : null,
      checkedBy: typeof kept.checkedBy === "string" ? kept.checkedBy : undefined,
      refused: validRefused,
    };
  } catch {
    return { pattern: null };
  }
}

function write(kept: Kept): void {
  try {
    localStorage.setItem(KEY, JSON.stringify(kept));
  } catch {
    // Storage full or blocked: what is in use stays in use until the app is closed.
  }
}

const browser = () => navigator.userAgent;
/** A pattern as kept and compared: its JSON text. */
const textOf = (pattern: DatePattern | null) => JSON.stringify(pattern);
const refusedHere = (kept: Kept, pattern: DatePattern) => kept.refused?.by === browser() && kept.refused.patterns.includes(textOf(pattern));
const isForThisBrowser = (pattern: DatePattern) => isPatternFor(pattern, navigator.language);

/**
 * Takes the pattern the server sent with who is signed in (null: none for this language), or,
 * with nothing sent, the one kept; and has dates written from it unless this browser refused it.
 */
export function keepDatePattern(sent?: unknown): void {
  let kept = read();
  if (sent !== undefined) {
    const pattern = isDatePattern(sent) ? sent : null;
    // The same pattern again (every start, online) keeps its check and is not written again.
    if (textOf(pattern) !== textOf(kept.pattern)) {
      kept = { pattern, refused: kept.refused };
      write(kept);
    }
  }
  setDevicePattern(kept.pattern && !refusedHere(kept, kept.pattern) ? kept.pattern : null);
}

/**
 * Checks the kept pattern against this browser's own Intl, once per pattern and browser version,
 * and only while the browser's language is the pattern's (the only time it is used). That makes
 * a formatter (the locale tables' load the pattern spares the start), so it waits until the
 * member has been on the app a while and the browser is idle.
 */
export function checkDatePatternLater(delayMs = 15_000): () => void {
  const kept = read();
  const pattern = kept.pattern;
  if (!pattern || !isForThisBrowser(pattern) || kept.checkedBy === browser() || refusedHere(kept, pattern)) return () => undefined;
  const check = () => {
    const now = read();
    if (textOf(now.pattern) !== textOf(pattern) || !isForThisBrowser(pattern)) return;
    if (matchesOwnIntl(pattern)) {
      write({ ...now, checkedBy: browser() });
      return;
    }
    const earlier = now.refused?.by === browser() ? now.refused.patterns : [];
    write({ pattern, refused: { by: browser(), patterns: [...earlier, textOf(pattern)].slice(-MAX_REFUSED) } });
    // Dates drawn from now on come from Intl; those on screen change at the screen's next draw.
    setDevicePattern(null);
  };
  // Where there is no idle callback (Safari), the check runs in a task of its own: two formatters
  // and a few hundred dates, once.
  return whenIdle(check, { afterMs: delayMs, timeoutMs: 10_000 });
}
