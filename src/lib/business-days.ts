// Business days for the buyer's right to cancel a sale made in the home.
//
// The FTC's rule (16 CFR 429.1(a)) lets the buyer cancel "prior to midnight of the third business
// day after the date of the transaction". Its definition (16 CFR 429.0(c)) counts every calendar
// day except Sunday and nine named holidays — so Saturday IS a business day under the rule.
// Kilowright follows a stricter-for-the-seller reading (our choice): it skips
// Saturdays, Sundays and every U.S. federal holiday of 5 U.S.C. 6103(a) on its observed date
// (a Saturday holiday on the Friday before, a Sunday holiday on the Monday after; 5 U.S.C.
// 6103(b), Executive Order 11582). Each of these skips only moves the deadline later, so the
// buyer's window is never shorter than the rule's.
//
// Dates are calendar dates (YYYY-MM-DD) with no time zone; the caller decides which day "today"
// and "the day of signing" are (the customer's, the company's).
import { allForYear } from "@18f/us-federal-holidays";

/** Business days the buyer has to cancel (16 CFR 429.1(a)). */
export const CANCEL_BUSINESS_DAYS = 3;

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY_MS = 86_400_000;

function parseIsoDate(isoDate: string): number {
  const m = ISO_DATE.exec(isoDate);
  if (!m) throw new RangeError(`Expected a date as YYYY-MM-DD, got "${isoDate}"`);
  const t = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  if (new Date(t).toISOString().slice(0, 10) !== isoDate) throw new RangeError(`Not a calendar date: "${isoDate}"`);
  return t;
}

const toIso = (t: number) => new Date(t).toISOString().slice(0, 10);

const holidaysByYear = new Map<number, Set<string>>();

/**
 * Observed U.S. federal holidays that fall in `year` (YYYY-MM-DD). New Year's Day of the next
 * year is observed on December 31 when January 1 is a Saturday, so the next year's list is read
 * too.
 */
export function observedFederalHolidays(year: number): Set<string> {
  let set = holidaysByYear.get(year);
  if (!set) {
    set = new Set(
      [...allForYear(year), ...allForYear(year + 1)]
        .map((h) => h.dateString)
        .filter((d) => d.startsWith(`${year}-`)),
    );
    holidaysByYear.set(year, set);
  }
  return set;
}

/** Monday–Friday and not an observed federal holiday. */
export function isBusinessDay(isoDate: string): boolean {
  const t = parseIsoDate(isoDate);
  const weekday = new Date(t).getUTCDay();
  if (weekday === 0 || weekday === 6) return false;
  return !observedFederalHolidays(Number(isoDate.slice(0, 4))).has(isoDate);
}

/**
 * The `n`-th business day after `isoDate` (the day itself is never counted, business day or
 * not); `n = 0` gives `isoDate` back.
 */
export function addBusinessDays(isoDate: string, n: number): string {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`Business days must be a whole number ≥ 0, got ${n}`);
  let t = parseIsoDate(isoDate);
  let left = n;
  while (left > 0) {
    t += DAY_MS;
    if (isBusinessDay(toIso(t))) left--;
  }
  return toIso(t);
}

/**
 * The last day the buyer may cancel a sale signed in the home on `signedOnIsoDate`: the third
 * business day after the day of signing (16 CFR 429.1(a)); the notice runs to midnight of it.
 */
export function cancelDeadline(signedOnIsoDate: string): string {
  return addBusinessDays(signedOnIsoDate, CANCEL_BUSINESS_DAYS);
}
