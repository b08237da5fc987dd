import { describe, expect, it } from "vitest";
import { addDaysToDate, dateInZone, dayRangeInZone, instantInZone, startOfDayInZone, todayInZone } from "./zoned-time";

const NY = "America/New_York";

describe("zoned time across daylight saving (America/New_York)", () => {
  it("spring forward, 2026-03-08: the day has 23 hours and each instant lands on its own date", () => {
    const start = startOfDayInZone("2026-03-08", NY);
    const next = startOfDayInZone("2026-03-09", NY);
    expect(start.toISOString()).toBe("2026-03-08T05:00:00.000Z"); // EST, UTC−5
    expect(next.toISOString()).toBe("2026-03-09T04:00:00.000Z"); // EDT, UTC−4
    expect((next.getTime() - start.getTime()) / 3_600_000).toBe(23);
    expect(dateInZone(new Date("2026-03-09T03:59:59Z"), NY)).toBe("2026-03-08");
    expect(dateInZone(new Date("2026-03-09T04:00:00Z"), NY)).toBe("2026-03-09");
    // 06:59 UTC is 01:59 EST; a minute later the clock reads 03:00 EDT.
    expect(instantInZone(new Date("2026-03-08T06:59:00Z"), NY).getHours()).toBe(1);
    expect(instantInZone(new Date("2026-03-08T07:00:00Z"), NY).getHours()).toBe(3);
  });

  it("fall back, 2026-11-01: the day has 25 hours", () => {
    const start = startOfDayInZone("2026-11-01", NY);
    const next = startOfDayInZone("2026-11-02", NY);
    expect(start.toISOString()).toBe("2026-11-01T04:00:00.000Z");
    expect(next.toISOString()).toBe("2026-11-02T05:00:00.000Z");
    expect((next.getTime() - start.getTime()) / 3_600_000).toBe(25);
    expect(dateInZone(new Date("2026-11-02T04:30:00Z"), NY)).toBe("2026-11-01"); // 23:30 EST
    expect(todayInZone(NY, new Date("2026-11-02T05:00:00Z"))).toBe("2026-11-02");
  });

  it("adds calendar days over both changes, never 24-hour steps", () => {
    expect(addDaysToDate("2026-03-07", 1)).toBe("2026-03-08");
    expect(addDaysToDate("2026-03-07", 2)).toBe("2026-03-09");
    expect(addDaysToDate("2026-10-31", 2)).toBe("2026-11-02");
    expect(addDaysToDate("2026-11-02", -2)).toBe("2026-10-31");
    expect(addDaysToDate("2026-12-30", 3)).toBe("2027-01-02");
    expect(addDaysToDate("2028-02-28", 1)).toBe("2028-02-29");
  });
});

describe("zones without daylight saving", () => {
  it("America/Phoenix stays at UTC−7 when New York changes", () => {
    for (const day of ["2026-03-08", "2026-03-09", "2026-11-01", "2026-11-02", "2026-07-04"]) {
      expect(startOfDayInZone(day, "America/Phoenix").toISOString()).toBe(`${day}T07:00:00.000Z`);
    }
    expect(dateInZone(new Date("2026-03-08T06:59:00Z"), "America/Phoenix")).toBe("2026-03-07");
    expect(dateInZone(new Date("2026-03-08T07:00:00Z"), "America/Phoenix")).toBe("2026-03-08");
  });

  it("Pacific/Honolulu stays at UTC−10", () => {
    for (const day of ["2026-03-08", "2026-11-01", "2026-12-04"]) {
      expect(startOfDayInZone(day, "Pacific/Honolulu").toISOString()).toBe(`${day}T10:00:00.000Z`);
    }
    expect(todayInZone("Pacific/Honolulu", new Date("2026-12-05T09:59:00Z"))).toBe("2026-12-04");
  });
});

describe("input checks", () => {
  it("names a date that is not YYYY-MM-DD or not on the calendar", () => {
    expect(() => addDaysToDate("2026-3-8", 1)).toThrow(/YYYY-MM-DD.*2026-3-8/);
    expect(() => startOfDayInZone("2026-02-30", NY)).toThrow(/Not a calendar date: "2026-02-30"/);
    expect(() => addDaysToDate("2026-13-01", 1)).toThrow(/Not a calendar date/);
    expect(() => addDaysToDate("2026-00-10", 1)).toThrow(/Not a calendar date/);
  });
});

describe("dayRangeInZone", () => {
  it("turns calendar days into the zone's instants, far from UTC near midnight", () => {
    expect(dayRangeInZone({ from: "2026-03-01", to: "2026-03-31" }, "Pacific/Honolulu")).toEqual({
      start: new Date("2026-03-01T10:00:00Z"),
      end: new Date("2026-04-01T10:00:00Z"),
    });
    // Auckland is UTC+13 in March (daylight time) and UTC+12 from April 5.
    expect(dayRangeInZone({ from: "2026-04-01", to: "2026-04-30" }, "Pacific/Auckland")).toEqual({
      start: new Date("2026-03-31T11:00:00Z"),
      end: new Date("2026-04-30T12:00:00Z"),
    });
  });

  it("leaves an open side open", () => {
    expect(dayRangeInZone({ to: "2026-12-31" }, "UTC")).toEqual({ start: undefined, end: new Date("2027-01-01T00:00:00Z") });
    expect(dayRangeInZone({}, "UTC")).toEqual({ start: undefined, end: undefined });
  });
});
