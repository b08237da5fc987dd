/**
 * The typical year the money side of the engine works on: 365 days, 8760 hours, hour 0 =
 * 1 January 00:00–01:00 local standard time (no daylight saving), 29 February never present.
 * Bills, interval data and rate plans are all mapped onto this grid so they line up with an
 * hourly production estimate for a typical weather year.
 */

import { tzOffset } from "@date-fns/tz";

export const HOURS_PER_YEAR = 8760;
export const DAYS_PER_YEAR = 365;

/** Days in each month of the typical (non-leap) year, January first. */
export const MONTH_DAYS: readonly number[] = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Day of year (0-based) on which each month starts. */
export const MONTH_START_DAY: readonly number[] = MONTH_DAYS.reduce<number[]>(
  (starts, days, m) => (m === 0 ? [0] : [...starts, starts[m - 1] + MONTH_DAYS[m - 1]]),
  [],
);

/** Month index (0–11) of each of the 8760 hours. */
export const HOUR_MONTH: Uint8Array = (() => {
  const out = new Uint8Array(HOURS_PER_YEAR);
  for (let m = 0; m < 12; m++) {
    out.fill(m, MONTH_START_DAY[m] * 24, (MONTH_START_DAY[m] + MONTH_DAYS[m]) * 24);
  }
  return out;
})();

/** Sum an 8760-hour series into 12 monthly totals. */
export function monthlySums(hourly: ArrayLike<number>): number[] {
  const out = new Array<number>(12).fill(0);
  for (let h = 0; h < HOURS_PER_YEAR; h++) out[HOUR_MONTH[h]] += hourly[h];
  return out;
}

/** Day of week (0 = Sunday … 6 = Saturday) of 1 January of a Gregorian year. */
export function weekdayOfJanuaryFirst(year: number): number {
  return new Date(Date.UTC(year, 0, 1)).getUTCDay();
}

/**
 * Where each typical-year hour falls on a wall clock: the clock hour (0–23), weekday
 * (0 = Sunday) and month (0–11) at the middle of the row's hour.
 *
 * Rows are in local standard time; the typical year's month and day are placed in
 * `calendarYear` (29 February skipped, so weekdays after it follow that year's real
 * calendar). With an IANA `timeZone` the clock is that zone's, daylight saving included:
 * the standard offset is the smaller of the zone's offsets on 1 January and 1 July (daylight
 * saving only ever adds), and a summer row at 15:00–16:00 standard time reads 16:xx.
 * Without one, the clock is local standard time.
 *
 * The rows are in the standard time of `rowsTimeZone` when given (the site's: weather and usage
 * rows are the site's local standard time) and the clock is `timeZone`'s (the utility's, whose
 * wall clock its time-of-use hours are stated in). A site in Central time served by a utility
 * on Eastern time: a row at 15:00 CST is 16:00 EST, 17:00 EDT in summer.
 */
export type YearClock = { calendarYear: number; timeZone: string | null; rowsTimeZone?: string | null };
export type ClockOfHours = { hour: Uint8Array; weekday: Uint8Array; month: Uint8Array };

export function clockOfTypicalHours({ calendarYear, timeZone, rowsTimeZone }: YearClock): ClockOfHours {
  const hour = new Uint8Array(HOURS_PER_YEAR);
  const weekday = new Uint8Array(HOURS_PER_YEAR);
  const month = new Uint8Array(HOURS_PER_YEAR);
  const standardMinutes = timeZone === null ? 0 : standardOffsetMinutes(rowsTimeZone ?? timeZone, calendarYear);
  let h = 0;
  for (let m = 0; m < 12; m++) {
    for (let day = 1; day <= MONTH_DAYS[m]; day++) {
      for (let k = 0; k < 24; k++, h++) {
        // The row's middle as if local standard time were UTC, then to the clock zone's wall clock.
        const standardMs = Date.UTC(calendarYear, m, day, k, 30);
        const wall = timeZone === null ? new Date(standardMs) : new Date(standardMs + (tzOffset(timeZone, new Date(standardMs - standardMinutes * 60_000)) - standardMinutes) * 60_000);
        hour[h] = wall.getUTCHours();
        weekday[h] = wall.getUTCDay();
        month[h] = wall.getUTCMonth();
      }
    }
  }
  return { hour, weekday, month };
}

/** The zone's standard (non-daylight) offset from UTC in minutes for a year. */
export function standardOffsetMinutes(timeZone: string, year: number): number {
  return Math.min(tzOffset(timeZone, new Date(Date.UTC(year, 0, 1, 12))), tzOffset(timeZone, new Date(Date.UTC(year, 6, 1, 12))));
}

/** True when the name is an IANA time zone this runtime knows. */
export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: name });
    return true;
  } catch {
    return false;
  }
}
