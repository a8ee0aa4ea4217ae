// A season is a calendar year (our default; a club setting can move its start later).
export function seasonBounds(year: number): { start: number; end: number } {
  return { start: Date.UTC(year, 0, 1), end: Date.UTC(year + 1, 0, 1) };
}

export function currentSeason(now = Date.now()): number {
  return new Date(now).getUTCFullYear();
}
