import { describe, expect, it } from "vitest";
import { beyondClockSlack, CLOCK_SLACK_MS } from "./ahead";

describe("a date ahead of the phone's clock", () => {
  const now = Date.UTC(2026, 6, 1, 12);
  it("passes within a day's slack, and asks beyond it", () => {
    expect(beyondClockSlack(now, now)).toBe(false);
    expect(beyondClockSlack(now - 365 * CLOCK_SLACK_MS, now)).toBe(false);
    expect(beyondClockSlack(now + CLOCK_SLACK_MS, now)).toBe(false);
    expect(beyondClockSlack(now + CLOCK_SLACK_MS + 60_000, now)).toBe(true);
    expect(beyondClockSlack(Date.UTC(2027, 6, 1), now)).toBe(true);
  });
});
