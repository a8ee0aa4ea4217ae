// A season is a calendar year of the club's days (see ./time/club-day).
export { currentSeason, seasonBounds, seasonMonths, seasonNow } from "./time/club-day";
