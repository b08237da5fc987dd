import { describe, expect, it } from "vitest";
import { billYear, ratePlanSchema, touPeriodByHour, type RatePlanInput } from "./rates";
import { siteTimeZone } from "./site-time-zone";
import { MONTH_START_DAY, clockOfTypicalHours, standardOffsetMinutes } from "./year-calendar";

// Time-of-use windows are read on the wall clock (utilities publish "4–9 pm" in local clock
// time, daylight saving included). Expected values are our own hand-worked arithmetic from the
// IANA tz database's rules: U.S. daylight saving from the second Sunday of March to the first
// Sunday of November (Energy Policy Act of 2005), New Zealand from the last Sunday of September
// to the first Sunday of April.

const peakPlan: RatePlanInput = {
  name: "weekday 16–21 peak",
  fixedMonthlyCents: 0,
  energy: {
    kind: "tou",
    periods: [
      { id: "off", centsPerKwh: 10 },
      { id: "peak", centsPerKwh: 40 },
    ],
    seasons: [{ name: "all", months: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12], otherHoursPeriodId: "off", weekday: [{ startHour: 16, endHour: 21, periodId: "peak" }] }],
  },
  compensation: { kind: "no-export" },
};
const tou = () => {
  const parsed = ratePlanSchema.parse(peakPlan);
  if (parsed.energy.kind !== "tou") throw new Error("unreachable");
  return parsed.energy;
};
/** Rows (hour of the day in local standard time) that are peak on a typical-year day. */
const peakRows = (byHour: Uint8Array, month: number, day: number) => {
  const start = (MONTH_START_DAY[month] + day - 1) * 24;
  return Array.from(byHour.slice(start, start + 24)).flatMap((p, k) => (p === 1 ? [k] : []));
};

describe("time-of-use hours on the wall clock", () => {
  it("Denver in July (MDT = standard + 1 h): the 16–21 clock window is standard-time rows 15–19", () => {
    const byHour = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: "America/Denver" });
    // 2025-07-15 is a Tuesday.
    expect(peakRows(byHour, 6, 15)).toEqual([15, 16, 17, 18, 19]);
    // 2025-01-14 is a Tuesday; January is standard time, so the rows are the clock hours.
    expect(peakRows(byHour, 0, 14)).toEqual([16, 17, 18, 19, 20]);
  });

  it("without a zone the window stays in standard time (the old reading)", () => {
    const byHour = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: null });
    expect(peakRows(byHour, 6, 15)).toEqual([16, 17, 18, 19, 20]);
  });

  it("the switch days: 2025-03-10 (Mon, the day after U.S. DST starts) is shifted, 2025-03-07 (Fri) is not", () => {
    const byHour = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: "America/New_York" });
    expect(peakRows(byHour, 2, 7)).toEqual([16, 17, 18, 19, 20]);
    expect(peakRows(byHour, 2, 10)).toEqual([15, 16, 17, 18, 19]);
    // 2025-11-03 (Mon, the day after DST ends): standard again.
    expect(peakRows(byHour, 10, 3)).toEqual([16, 17, 18, 19, 20]);
  });

  it("a site in one zone served by a utility on another's clock: the rows are the site's standard time, the hours the utility's", () => {
    // A site west of the Central/Eastern line (Kentucky, America/Chicago) whose utility bills on
    // Eastern time. Row k is k:30 CST = (k + 6):30 UTC. In July the utility's clock is EDT
    // (UTC − 4), so row k reads k + 2: the 16–21 window is rows 14–18. In January EST (UTC − 5):
    // row k reads k + 1, rows 15–19. With the site's own clock: rows 15–19 / 16–20.
    const clock = { calendarYear: 2025, timeZone: "America/New_York", rowsTimeZone: "America/Chicago" };
    expect(siteTimeZone(37.08, -86.2)).toBe("America/Chicago");
    const byHour = touPeriodByHour(tou(), clock);
    expect(peakRows(byHour, 6, 15)).toEqual([14, 15, 16, 17, 18]);
    expect(peakRows(byHour, 0, 14)).toEqual([15, 16, 17, 18, 19]);
    const own = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: "America/Chicago" });
    expect(peakRows(own, 6, 15)).toEqual([15, 16, 17, 18, 19]);
    expect(peakRows(own, 0, 14)).toEqual([16, 17, 18, 19, 20]);
  });

  it("a zone without daylight saving (Phoenix) reads the same as standard time", () => {
    const az = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: "America/Phoenix" });
    const lst = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: null });
    expect(Array.from(az)).toEqual(Array.from(lst));
  });

  it("southern hemisphere (Auckland): daylight time in January, standard in July", () => {
    expect(standardOffsetMinutes("Pacific/Auckland", 2025)).toBe(12 * 60);
    const byHour = touPeriodByHour(tou(), { calendarYear: 2025, timeZone: "Pacific/Auckland" });
    expect(peakRows(byHour, 0, 14)).toEqual([15, 16, 17, 18, 19]); // 2025-01-14, Tuesday, NZDT
    expect(peakRows(byHour, 6, 15)).toEqual([16, 17, 18, 19, 20]); // 2025-07-15, Tuesday, NZST
  });

  it("a leap year's weekdays after 28 February follow that year's calendar", () => {
    // 2024-03-01 is a Friday and 2024-03-02 a Saturday; with the old day count (1 January 2024
    // a Monday, + 59 days) 1 March came out a Thursday.
    const byHour = touPeriodByHour(tou(), { calendarYear: 2024, timeZone: null });
    expect(peakRows(byHour, 2, 1)).toEqual([16, 17, 18, 19, 20]);
    expect(peakRows(byHour, 2, 2)).toEqual([]);
    const clock = clockOfTypicalHours({ calendarYear: 2024, timeZone: null });
    for (let m = 0; m < 12; m++) {
      for (const day of [1, 15, 28]) {
        expect(clock.weekday[(MONTH_START_DAY[m] + day - 1) * 24]).toBe(new Date(Date.UTC(2024, m, day)).getUTCDay());
      }
    }
  });

  it("bills on clock hours: evening use billed as peak in summer (hand-worked)", () => {
    // 1 kWh in every standard-time row 20 (20:00–21:00 LST = 21:00–22:00 MDT in summer).
    const usage = Array.from({ length: 8760 }, (_, h) => (h % 24 === 20 ? 1 : 0));
    const lst = billYear({ plan: peakPlan, usageHourlyKwh: usage, calendarYear: 2025 });
    const clock = billYear({ plan: peakPlan, usageHourlyKwh: usage, calendarYear: 2025, timeZone: "America/Denver" });
    // July 2025 has 23 weekdays: in standard time row 20 is peak on each (23 × 40 ¢ + 8 × 10 ¢ = 10.00);
    // on the clock it is 21:00–22:00, off-peak every day (31 × 10 ¢ = 3.10).
    expect(lst.months[6].totalCents).toBe(1000);
    expect(clock.months[6].totalCents).toBe(310);
    // January is standard time either way.
    expect(clock.months[0].totalCents).toBe(lst.months[0].totalCents);
  });

  it("refuses an unknown zone", () => {
    expect(() => billYear({ plan: peakPlan, usageHourlyKwh: new Array(8760).fill(0), timeZone: "Mars/Olympus" })).toThrow(/not a known time zone/);
  });
});

describe("siteTimeZone (offline look-up from coordinates)", () => {
  it("names the zones of places on both sides of the equator and the date line", () => {
    expect(siteTimeZone(36.0726, -79.792)).toBe("America/New_York"); // Greensboro, NC
    expect(siteTimeZone(39.7392, -104.9903)).toBe("America/Denver");
    expect(siteTimeZone(-0.1807, -78.4678)).toBe("America/Guayaquil"); // Quito, latitude ≈ 0
    expect(siteTimeZone(-36.8485, 174.7633)).toBe("Pacific/Auckland");
    expect(siteTimeZone(33.4484, -112.074)).toBe("America/Phoenix");
  });
  it("refuses coordinates off the globe", () => {
    expect(() => siteTimeZone(91, 0)).toThrow(/not a place on Earth/);
  });
});
