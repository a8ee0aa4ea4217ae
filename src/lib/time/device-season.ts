/**
 * The member's own season on their phone: the calendar year of the phone's clock. Kept apart
 * from the club's calendar (./club-day) so the member's home screen loads no time-zone tables.
 */
export function deviceSeasonBounds(now = Date.now()): { season: number; start: number; end: number } {
  const season = new Date(now).getFullYear();
  return { season, start: new Date(season, 0, 1).getTime(), end: new Date(season + 1, 0, 1).getTime() };
}
