// Dates and instants in the company's time zone (Settings → Company), built on @date-fns/tz
// (IANA zones from the runtime's ICU, daylight saving included). Calendar dates travel as
// "YYYY-MM-DD" strings with no zone; instants as Date. Pure: used by the server and pages.
import { TZDate } from "@date-fns/tz";

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

function parts(isoDate: string): [number, number, number] {
  const m = ISO_DATE.exec(isoDate);
  if (!m) throw new RangeError(`Expected a date as YYYY-MM-DD, got "${isoDate}"`);
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  if (mo < 1 || mo > 12 || new Date(Date.UTC(y, mo - 1, d)).getUTCDate() !== d) throw new RangeError(`Not a calendar date: "${isoDate}"`);
  return [y, mo, d];
}

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

/** This instant as the zone's wall clock reads it (getHours(), getDate()… answer in the zone). */
export function instantInZone(at: Date, timeZone: string): TZDate {
  return new TZDate(at.getTime(), timeZone);
}

/** The calendar date (YYYY-MM-DD) an instant falls on in the zone. */
export function dateInZone(at: Date, timeZone: string): string {
  const z = instantInZone(at, timeZone);
  return `${pad(z.getFullYear(), 4)}-${pad(z.getMonth() + 1)}-${pad(z.getDate())}`;
}

/** Today (YYYY-MM-DD) in the zone. */
export function todayInZone(timeZone: string, now = new Date()): string {
  return dateInZone(now, timeZone);
}

/** The instant a calendar day starts (00:00 on the zone's wall clock). */
export function startOfDayInZone(isoDate: string, timeZone: string): Date {
  const [y, mo, d] = parts(isoDate);
  return new Date(new TZDate(y, mo - 1, d, timeZone).getTime());
}

/**
 * A calendar date plus `days` (negative for earlier). Calendar arithmetic, not 24-hour steps,
 * so a daylight-saving change in between never moves the result to another day.
 */
export function addDaysToDate(isoDate: string, days: number): string {
  const [y, mo, d] = parts(isoDate);
  const t = new TZDate(y, mo - 1, d + days, "UTC");
  return `${pad(t.getFullYear(), 4)}-${pad(t.getMonth() + 1)}-${pad(t.getDate())}`;
}

/**
 * The instants [start, end) that the calendar days `from` to `to` (both included) cover in the
 * zone, e.g. a "created from 1 to 31 March" filter; either side may be left open.
 */
export function dayRangeInZone(range: { from?: string; to?: string }, timeZone: string): { start?: Date; end?: Date } {
  return {
    start: range.from ? startOfDayInZone(range.from, timeZone) : undefined,
    end: range.to ? startOfDayInZone(addDaysToDate(range.to, 1), timeZone) : undefined,
  };
}
