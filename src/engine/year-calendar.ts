/**
 * The typical year the money side of the engine works on: 365 days, 8760 hours, hour 0 =
 * 1 January 00:00–01:00 local standard time (no daylight saving), 29 February never present.
 * Bills, interval data and rate plans are all mapped onto this grid so they line up with an
 * hourly production estimate for a typical weather year.
 */

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
