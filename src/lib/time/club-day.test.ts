import { describe, expect, it } from "vitest";
import { clubDay, currentSeason, dayStart, seasonBounds, seasonMonths } from "./club-day";

// Offsets from the IANA time-zone database as the platform carries it (Intl): Los Angeles is
// UTC−8 in winter and UTC−7 in summer (US daylight saving from the second Sunday of March).
describe("the club's calendar", () => {
  it("an evening find in Nevada is that day, not the next (UTC) one", () => {
    const evening = Date.UTC(2026, 6, 15, 3, 30); // 20:30 on 14 July, Pacific daylight time
    expect(clubDay(evening, "America/Los_Angeles")).toBe("2026-07-14");
    expect(clubDay(evening, "UTC")).toBe("2026-07-15");
  });

  it("a New Year's Eve find belongs to the old season", () => {
    const nye = Date.UTC(2027, 0, 1, 6, 0); // 22:00 on 31 December, Pacific standard time
    expect(currentSeason(nye, "America/Los_Angeles")).toBe(2026);
    const { start, end } = seasonBounds(2026, "America/Los_Angeles");
    expect(nye >= start && nye < end).toBe(true);
    expect(start).toBe(Date.UTC(2026, 0, 1, 8));
    expect(end).toBe(Date.UTC(2027, 0, 1, 8));
  });

  it("days start at the club's midnight, across daylight-saving changes", () => {
    expect(dayStart("2026-03-08", "America/Los_Angeles")).toBe(Date.UTC(2026, 2, 8, 8)); // before the change that night
    expect(dayStart("2026-03-09", "America/Los_Angeles")).toBe(Date.UTC(2026, 2, 9, 7));
    expect(dayStart("2026-11-01", "America/Los_Angeles")).toBe(Date.UTC(2026, 10, 1, 7));
    expect(dayStart("2026-11-02", "America/Los_Angeles")).toBe(Date.UTC(2026, 10, 2, 8));
    expect(dayStart("2026-06-30", "Australia/Perth")).toBe(Date.UTC(2026, 5, 29, 16));
    expect(dayStart("2026-06-30", "UTC")).toBe(Date.UTC(2026, 5, 30));
  });

  it("months tile the season with no gap or overlap", () => {
    const months = seasonMonths(2026, "America/Los_Angeles");
    const season = seasonBounds(2026, "America/Los_Angeles");
    expect(months[0].start).toBe(season.start);
    expect(months[11].end).toBe(season.end);
    for (let i = 1; i < 12; i++) expect(months[i].start).toBe(months[i - 1].end);
  });
});
