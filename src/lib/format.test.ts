import { describe, expect, it } from "vitest";
import { formatCalendarDate, formatDate, formatDateTime, zoneName } from "@/lib/format";
import { missingStringPlanReason } from "@/lib/string-plan-rule";

// 05:30 UTC on December 6 is still the evening of December 5 in Honolulu (UTC−10) and already
// the afternoon of December 6 in Tokyo (UTC+9): a formatter on the wrong clock shows the wrong day.
const NEAR_MIDNIGHT_UTC = new Date("2026-12-06T05:30:00Z");

describe("dates on the company's clock", () => {
  it("formatDate gives the zone's day", () => {
    expect(formatDate(NEAR_MIDNIGHT_UTC, "Pacific/Honolulu")).toBe("Dec 5, 2026");
    expect(formatDate(NEAR_MIDNIGHT_UTC, "Asia/Tokyo")).toBe("Dec 6, 2026");
    expect(formatDate(new Date("2026-12-06T04:59:00Z"), "America/New_York")).toBe("Dec 5, 2026");
  });

  it("formatDateTime gives the zone's wall clock and names the zone, daylight saving included", () => {
    expect(formatDateTime(NEAR_MIDNIGHT_UTC, "Pacific/Honolulu")).toBe("Dec 5, 2026, 7:30 PM HST");
    expect(formatDateTime(NEAR_MIDNIGHT_UTC, "Asia/Tokyo")).toBe("Dec 6, 2026, 2:30 PM GMT+9");
    expect(formatDateTime(new Date("2026-07-04T03:15:09Z"), "America/Los_Angeles", "seconds")).toBe("Jul 3, 2026, 8:15:09 PM PDT");
    expect(formatDateTime(NEAR_MIDNIGHT_UTC, "UTC")).toBe("Dec 6, 2026, 5:30 AM UTC");
    expect(zoneName(new Date("2026-07-04T03:15:09Z"), "America/New_York")).toBe("EDT");
    expect(zoneName(NEAR_MIDNIGHT_UTC, "America/New_York")).toBe("EST");
  });

  it("formatCalendarDate shows a calendar date as it is, in any runtime zone", () => {
    expect(formatCalendarDate("2026-12-05")).toBe("Dec 5, 2026");
    expect(formatCalendarDate("2026-12-05", "full")).toBe("Saturday, December 5, 2026");
    expect(formatCalendarDate("2026-12-05", "weekday-day")).toBe("Sat, Dec 5");
    expect(formatCalendarDate("2026-12-05", "weekday-date")).toBe("Sat, December 5, 2026");
  });
});

describe("missingStringPlanReason", () => {
  const stringInverter = { kind: "string" as const, manufacturer: "Testline", model: "TI-7600" };
  it("asks a string inverter for at least one string; a microinverter needs none", () => {
    expect(missingStringPlanReason(stringInverter, null)).toMatch(/^The design uses a string inverter \(Testline TI-7600\) but has no string plan/);
    expect(missingStringPlanReason(stringInverter, { stringSizes: [] })).not.toBeNull();
    expect(missingStringPlanReason(stringInverter, { stringSizes: [10, 10] })).toBeNull();
    expect(missingStringPlanReason({ ...stringInverter, kind: "micro" }, null)).toBeNull();
  });
});
