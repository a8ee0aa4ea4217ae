/**
 * How far a date may lie ahead of the phone's clock before the member is asked to confirm it:
 * a day, for a clock set a little wrong or a zone crossed on the way to camp (common practice
 * for "no future dates" checks on hand-entered logs).
 */
export const CLOCK_SLACK_MS = 24 * 60 * 60 * 1000;

/** True when `when` is further ahead of `now` than the clock slack allows. */
export function beyondClockSlack(when: number, now = Date.now()): boolean {
  return when - now > CLOCK_SLACK_MS;
}
