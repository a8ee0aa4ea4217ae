/**
 * The club's calendar: days, seasons and the day a price takes effect are days in the club's
 * time zone (an IANA name), whatever zone the server or a browser runs in. Worked out with the
 * platform's own time-zone tables (Intl), daylight-saving changes included.
 */

const formatters = new Map<string, Intl.DateTimeFormat>();
function wallClock(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", {
      timeZone,
      hourCycle: "h23",
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      second: "2-digit",
    });
    formatters.set(timeZone, f);
  }
  return f;
}

function parts(ms: number, timeZone: string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const p of wallClock(timeZone).formatToParts(ms)) if (p.type !== "literal") out[p.type] = Number(p.value);
  return out;
}

/** How far the zone's wall clock is ahead of UTC at an instant, in ms. */
function offsetAt(ms: number, timeZone: string): number {
  const p = parts(ms, timeZone);
  const wall = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second);
  return wall - Math.floor(ms / 1000) * 1000;
}

/** The instant a wall-clock time in the zone falls at (the earlier one when the clock goes back). */
function instantOf(year: number, month0: number, day: number, timeZone: string): number {
  const guess = Date.UTC(year, month0, day);
  const first = guess - offsetAt(guess, timeZone);
  const second = guess - offsetAt(first, timeZone);
  return Math.min(first, second);
}

/** When a club day ("YYYY-MM-DD") begins. */
export function dayStart(isoDate: string, timeZone: string): number {
  const [y, m, d] = isoDate.split("-").map(Number);
  return instantOf(y, m - 1, d, timeZone);
}

/** The club day an instant falls on, as "YYYY-MM-DD". */
export function clubDay(ms: number, timeZone: string): string {
  const p = parts(ms, timeZone);
  return `${p.year}-${String(p.month).padStart(2, "0")}-${String(p.day).padStart(2, "0")}`;
}

/** A season is a calendar year of the club's days: [its first day's start, the next's). */
export function seasonBounds(year: number, timeZone = "UTC"): { start: number; end: number } {
  return { start: instantOf(year, 0, 1, timeZone), end: instantOf(year + 1, 0, 1, timeZone) };
}

export function currentSeason(now: number, timeZone = "UTC"): number {
  return Number(clubDay(now, timeZone).slice(0, 4));
}

/** The months of a season as [label "YYYY-MM", start, end) in the club's days. */
export function seasonMonths(year: number, timeZone: string): { month: string; start: number; end: number }[] {
  return Array.from({ length: 12 }, (_, m) => ({
    month: `${year}-${String(m + 1).padStart(2, "0")}`,
    start: instantOf(year, m, 1, timeZone),
    end: instantOf(m === 11 ? year + 1 : year, (m + 1) % 12, 1, timeZone),
  }));
}

/** The day after a club day, as "YYYY-MM-DD". */
export function nextDay(isoDate: string): string {
  const [y, m, d] = isoDate.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d + 1)).toISOString().slice(0, 10);
}

/** The zone this device's clock shows (members see their own days). */
export function deviceTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || "UTC";
}

/** The season today is in, in the given zone. */
export function seasonNow(timeZone: string): number {
  return currentSeason(Date.now(), timeZone);
}
