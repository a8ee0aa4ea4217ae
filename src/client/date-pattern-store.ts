import { isDatePattern, matchesOwnIntl, type DatePattern } from "@/lib/date-pattern";
import { setDevicePattern } from "@/lib/format";

// What the device keeps of the date pattern the server sends (date-pattern.ts), in
// localStorage: read at every start, before the first date is drawn, with no signal.
//   pattern    the pattern last sent for this browser's language
//   checkedBy  the browser (its user agent) that found it writes as its own Intl does
//   refusedBy  the browser that found it does not: that locale's patterns are not used on it
const KEY = "lodebook-date-pattern";

type Kept = { pattern: DatePattern | null; checkedBy?: string; refusedBy?: string };

function read(): Kept {
  try {
    const kept = JSON.parse(localStorage.getItem(KEY) ?? "null") as Partial<Kept> | null;
    if (!kept || typeof kept !== "object") return { pattern: null };
    return {
      pattern: isDatePattern(kept.pattern) ? kept.pattern : null,
      checkedBy: typeof kept.checkedBy === "string" ? kept.checkedBy : undefined,
      refusedBy: typeof kept.refusedBy === "string" ? kept.refusedBy : undefined,
    };
  } catch {
    return { pattern: null };
  }
}

function write(kept: Kept): void {
  try {
    localStorage.setItem(KEY, JSON.stringify(kept));
  } catch {
    // Storage full or blocked: dates come from Intl, as they would without a pattern.
  }
}

const browser = () => navigator.userAgent;
const refusedHere = (kept: Kept) => kept.refusedBy === browser();

/**
 * Takes the pattern the server sent with who is signed in (null: none for this language), or,
 * with nothing sent, the one kept; and has dates written from it unless this browser refused it.
 */
export function keepDatePattern(sent?: unknown): void {
  let kept = read();
  if (sent !== undefined) {
    const pattern = isDatePattern(sent) ? sent : null;
    const same = pattern !== null && kept.pattern !== null && JSON.stringify(pattern) === JSON.stringify(kept.pattern);
    if (!same) kept = { pattern };
    write(kept);
  }
  setDevicePattern(kept.pattern && !refusedHere(kept) ? kept.pattern : null);
}

/**
 * Checks the kept pattern against this browser's own Intl, once per pattern and browser version.
 * That makes a formatter (the locale tables' load the pattern spares the start), so it waits
 * until the member has been on the app a while and the browser is idle.
 */
export function checkDatePatternLater(delayMs = 15_000): () => void {
  const kept = read();
  if (!kept.pattern || kept.checkedBy === browser() || refusedHere(kept)) return () => undefined;
  let idle: number | undefined;
  const timer = window.setTimeout(() => {
    const check = () => {
      const now = read();
      if (!now.pattern || JSON.stringify(now.pattern) !== JSON.stringify(kept.pattern)) return;
      if (matchesOwnIntl(now.pattern)) {
        write({ pattern: now.pattern, checkedBy: browser() });
      } else {
        write({ pattern: now.pattern, refusedBy: browser() });
        setDevicePattern(null);
      }
    };
    if (typeof window.requestIdleCallback === "function") idle = window.requestIdleCallback(check, { timeout: 10_000 });
    else check();
  }, delayMs);
  return () => {
    window.clearTimeout(timer);
    if (idle !== undefined) window.cancelIdleCallback(idle);
  };
}
