import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { addBusinessDays, cancelDeadline, isBusinessDay, observedFederalHolidays } from "./business-days";

// Check values worked by hand from a calendar. Sources:
// - 16 CFR 429.1(a): the buyer may cancel "prior to midnight of the third business day after the
//   date of the transaction"; Kilowright skips Saturdays, Sundays and federal holidays (see
//   business-days.ts for why this only lengthens the rule's window).
// - 5 U.S.C. 6103(a) lists the federal holidays; 6103(b) and Executive Order 11582 move a
//   Saturday holiday to the Friday before and a Sunday holiday to the Monday after.

describe("cancelDeadline (16 CFR 429.1(a): third business day after signing)", () => {
  it("runs across a weekend: signed Thursday 2026-03-12 → Fri 13, Mon 16, Tue 17", () => {
    expect(cancelDeadline("2026-03-12")).toBe("2026-03-17");
  });

  it("plain week: signed Monday 2026-03-09 → Tue 10, Wed 11, Thu 12", () => {
    expect(cancelDeadline("2026-03-09")).toBe("2026-03-12");
  });

  it("runs across a weekend and a federal holiday: Independence Day 2026 is a Saturday, observed Friday 2026-07-03 (5 U.S.C. 6103(b))", () => {
    // Signed Wed 07-01 → Thu 07-02 (1), Fri 07-03 observed holiday, Sat, Sun, Mon 07-06 (2), Tue 07-07 (3)
    expect(observedFederalHolidays(2026).has("2026-07-03")).toBe(true);
    expect(cancelDeadline("2026-07-01")).toBe("2026-07-07");
  });

  it("signed on the Friday that is the observed holiday: 2026-07-03 → Mon 6, Tue 7, Wed 8", () => {
    expect(cancelDeadline("2026-07-03")).toBe("2026-07-08");
  });

  it("skips Thanksgiving (fourth Thursday of November, 5 U.S.C. 6103(a)): signed Tue 2026-11-24 → Wed 25, Fri 27, Mon 30", () => {
    expect(observedFederalHolidays(2026).has("2026-11-26")).toBe(true);
    expect(cancelDeadline("2026-11-24")).toBe("2026-11-30");
  });

  it("signed on a Saturday: 2026-03-14 → Mon 16, Tue 17, Wed 18", () => {
    expect(cancelDeadline("2026-03-14")).toBe("2026-03-18");
  });

  it("signed on a Sunday: 2026-03-15 → Mon 16, Tue 17, Wed 18", () => {
    expect(cancelDeadline("2026-03-15")).toBe("2026-03-18");
  });

  it("signed on a holiday (Labor Day, Mon 2026-09-07) → Tue 8, Wed 9, Thu 10", () => {
    expect(cancelDeadline("2026-09-07")).toBe("2026-09-10");
  });

  it("a weekend followed by Memorial Day: signed Fri 2026-05-22 → Tue 26, Wed 27, Thu 28", () => {
    expect(cancelDeadline("2026-05-22")).toBe("2026-05-28");
  });

  it("a Sunday holiday is observed on Monday: Independence Day 2027 (Sun) → Mon 2027-07-05; signed Fri 07-02 → Tue 6, Wed 7, Thu 8", () => {
    expect(observedFederalHolidays(2027).has("2027-07-05")).toBe(true);
    expect(cancelDeadline("2027-07-02")).toBe("2027-07-08");
  });

  it("across the year end: New Year's Day 2028 is a Saturday, observed Friday 2027-12-31; signed Wed 2027-12-29 → Thu 30, Mon 2028-01-03, Tue 2028-01-04", () => {
    expect(observedFederalHolidays(2027).has("2027-12-31")).toBe(true);
    expect(cancelDeadline("2027-12-29")).toBe("2028-01-04");
  });

  it("skips Juneteenth (5 U.S.C. 6103(a) since 2021): signed Thu 2026-06-18 → Mon 22, Tue 23, Wed 24", () => {
    expect(cancelDeadline("2026-06-18")).toBe("2026-06-24");
  });
});

describe("addBusinessDays and isBusinessDay", () => {
  it("0 days gives the same date; the start day is never counted", () => {
    expect(addBusinessDays("2026-03-14", 0)).toBe("2026-03-14");
    expect(addBusinessDays("2026-03-13", 1)).toBe("2026-03-16");
  });

  it("weekdays, weekends and observed holidays", () => {
    expect(isBusinessDay("2026-03-16")).toBe(true);
    expect(isBusinessDay("2026-03-14")).toBe(false);
    expect(isBusinessDay("2026-03-15")).toBe(false);
    expect(isBusinessDay("2026-12-25")).toBe(false);
    expect(isBusinessDay("2027-12-24")).toBe(false); // Christmas 2027 is a Saturday, observed Friday
  });

  it("refuses malformed dates and negative counts", () => {
    expect(() => addBusinessDays("2026-02-30", 1)).toThrow(/calendar date/);
    expect(() => addBusinessDays("2026/03/01", 1)).toThrow(/YYYY-MM-DD/);
    expect(() => addBusinessDays("2026-03-01", -1)).toThrow(/≥ 0/);
    expect(() => addBusinessDays("2026-03-01", 1.5)).toThrow(/whole number/);
  });
});

// The rule's own definition (16 CFR 429.0(c)): "any calendar day except Sunday, or the following
// business holidays: New Year's Day, Washington's Birthday, Memorial Day, Independence Day, Labor
// Day, Columbus Day, Veterans' Day, Thanksgiving Day, and Christmas Day" — taken on their dates
// with no weekend shift. Kilowright's deadline is never earlier than this one.
function ruleHolidays(year: number): Set<string> {
  const d = (m: number, day: number) => `${year}-${String(m).padStart(2, "0")}-${String(day).padStart(2, "0")}`;
  const nthMonday = (m: number, n: number) => {
    const first = new Date(Date.UTC(year, m - 1, 1)).getUTCDay();
    return d(m, 1 + ((8 - first) % 7) + 7 * (n - 1));
  };
  const lastMonday = (m: number) => {
    const last = new Date(Date.UTC(year, m, 0));
    return d(m, last.getUTCDate() - ((last.getUTCDay() + 6) % 7));
  };
  const firstNov = new Date(Date.UTC(year, 10, 1)).getUTCDay();
  const thanksgiving = d(11, 1 + ((11 - firstNov) % 7) + 21);
  return new Set([d(1, 1), nthMonday(2, 3), lastMonday(5), d(7, 4), nthMonday(9, 1), nthMonday(10, 2), d(11, 11), thanksgiving, d(12, 25)]);
}

function ruleDeadline(signed: string): string {
  let t = Date.parse(`${signed}T00:00:00Z`);
  let left = 3;
  while (left > 0) {
    t += 86_400_000;
    const iso = new Date(t).toISOString().slice(0, 10);
    if (new Date(t).getUTCDay() !== 0 && !ruleHolidays(Number(iso.slice(0, 4))).has(iso)) left--;
  }
  return new Date(t).toISOString().slice(0, 10);
}

describe("never shorter than the rule's own count (16 CFR 429.0(c), Saturdays counted)", () => {
  it("the reference count agrees with hand-worked cases", () => {
    expect(ruleDeadline("2026-07-01")).toBe("2026-07-06"); // Thu 2, Fri 3, (Sat 4 holiday), (Sun 5), Mon 6
    expect(ruleDeadline("2026-03-12")).toBe("2026-03-16"); // Fri 13, Sat 14, Mon 16
    expect(ruleHolidays(2026).has("2026-11-26")).toBe(true);
  });

  it("for every signing day 2021–2035, Kilowright's deadline is on or after the rule's, and within 9 calendar days", () => {
    const start = Date.UTC(2021, 0, 1);
    const days = (Date.UTC(2035, 11, 31) - start) / 86_400_000;
    fc.assert(
      fc.property(fc.integer({ min: 0, max: days }), (k) => {
        const signed = new Date(start + k * 86_400_000).toISOString().slice(0, 10);
        const ours = cancelDeadline(signed);
        expect(ours >= ruleDeadline(signed)).toBe(true);
        expect((Date.parse(ours) - Date.parse(signed)) / 86_400_000).toBeLessThanOrEqual(9);
        expect(isBusinessDay(ours)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });
});
