import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { importIntervalData, MAX_XML_DEPTH, parseEspiXml, parseIntervalCsv, parseXml, readingsToProfile } from "./green-button";
import { EngineInputError } from "./errors";

const fixture = (name: string) => readFileSync(fileURLToPath(new URL(`../../tests/fixtures/green-button/${name}`, import.meta.url)), "utf8");
const xml = fixture("espi-two-days-invented.xml");
const csv = fixture("interval-timestamp-kwh-invented.csv");

function issuesOf(fn: () => unknown): { path: string; message: string }[] {
  try {
    fn();
  } catch (e) {
    if (e instanceof EngineInputError) return e.issues;
    throw e;
  }
  throw new Error("expected an EngineInputError");
}

// Grid hours (typical year, local standard time): 10 January = day index 9 → hours 216–239;
// 11 January → hours 240–263.
const JAN10 = 216;
const JAN11 = 240;

describe("ESPI (Green Button) XML — invented fixture, hand-worked values", () => {
  it("reads delivered Wh with powerOfTenMultiplier and uom, in local standard time (tzOffset −18000 s)", () => {
    const parsed = parseEspiXml(xml);
    expect(parsed.tzOffsetHours).toBe(-5);
    // 24 readings on day 1 + 22 on day 2 (hours 20–21 missing); the received channel is kept apart.
    expect(parsed.readings).toHaveLength(46);
    expect(parsed.readings[0].kwh).toBeCloseTo(0.3, 12); // 300 Wh × 10^0 / 1000
    expect(parsed.receivedKwh).toBeCloseTo(1, 12); // 1,000 Wh received at noon
  });

  it("puts each hour on the grid, reports gaps and coverage, fills from the same month and hour", () => {
    const p = importIntervalData(xml);
    expect(p.hourlyKwh[JAN10]).toBeCloseTo(0.3, 12); // day 1 hour 0: 300 Wh
    expect(p.hourlyKwh[JAN10 + 23]).toBeCloseTo(0.53, 12); // 300 + 10 × 23 Wh
    expect(p.hourlyKwh[JAN11 + 5]).toBeCloseTo(0.55, 12); // 500 + 10 × 5 Wh
    expect(p.measuredHours).toBe(46);
    expect(p.coverage).toBeCloseTo(46 / 8760, 12);
    expect(p.measured[JAN11 + 20]).toBe(0);
    // Hours 20–21 of 11 Jan: filled with the mean of the January hours 20 and 21 that were measured (day 1 only).
    expect(p.hourlyKwh[JAN11 + 20]).toBeCloseTo(0.5, 12);
    expect(p.hourlyKwh[JAN11 + 21]).toBeCloseTo(0.51, 12);
    expect(p.gaps[0]).toEqual({ from: "01-01 00:00", to: "01-09 23:00", hours: 216 });
    expect(p.gaps[1]).toEqual({ from: "01-11 20:00", to: "01-11 21:00", hours: 2 });
    // January, hand-worked: day 1 = 24 × 0.3 + 0.01 × 276 = 9.96; day 2 measured = 12 + 2.76 − 1.41 = 13.35,
    // filled 0.5 + 0.51 = 1.01; each of the other 29 days = 22 × 0.4 + (2.76 − 0.41) + 1.01 = 12.16.
    // 9.96 + 13.35 + 1.01 + 29 × 12.16 = 376.96 kWh.
    expect(p.monthlyKwh[0]).toBeCloseTo(376.96, 9);
    expect(p.months[0].status).toBe("partly estimated");
    expect(p.months[5].status).toBe("estimated");
    expect(p.notes.some((n) => n.includes("received from the customer"))).toBe(true);
    expect(p.hourlyKwh.every((v) => Number.isFinite(v) && v >= 0)).toBe(true);
  });

  it("names the line of malformed XML and refuses a DOCTYPE", () => {
    expect(issuesOf(() => parseXml("<a>\n<b></a>"))[0]).toMatchObject({ path: "line 2" });
    expect(issuesOf(() => parseXml('<!DOCTYPE x [<!ENTITY e "boom">]><a/>'))[0].message).toContain("DOCTYPE");
  });

  it("refuses characters XML does not allow, naming the line and the character", () => {
    const withBell = xml.replace("<espi:value>300</espi:value>", "<espi:value>300\u0007</espi:value>");
    const issue = issuesOf(() => importIntervalData(withBell))[0];
    expect(issue.message).toMatch(/invalid character U\+0007/);
    expect(issue.path).toBe(`line ${xml.slice(0, xml.indexOf("<espi:value>300</espi:value>")).split("\n").length}`);
    expect(issuesOf(() => parseXml("<a>\uD800</a>"))[0].message).toMatch(/invalid character U\+D800/);
    expect(issuesOf(() => parseXml("<a>&#1;</a>"))[0].message).toMatch(/&#1; is not an XML character/);
    expect(issuesOf(() => parseXml("<a>&#x110000;</a>"))[0].message).toMatch(/not an XML character/);
  });

  it(`refuses 60,000 nested elements quickly (deeper than ${MAX_XML_DEPTH} levels)`, () => {
    const deep = "<a>".repeat(60_000) + "</a>".repeat(60_000);
    const started = performance.now();
    expect(issuesOf(() => importIntervalData(deep))[0].message).toMatch(/nest deeper than 64 levels/);
    expect(performance.now() - started).toBeLessThan(5_000);
  });

  it("decodes the predefined entities and character references, and expands no other", () => {
    const root = parseXml('<a href="x&amp;y">&lt;b&gt; &#x41;&#66;</a>');
    expect(root.attributes.href).toBe("x&y");
    expect(root.text).toBe("<b> AB");
    expect(issuesOf(() => parseXml("<a>&custom;</a>"))[0].message).toContain("unknown XML entity");
  });

  it("rejects non-energy units and running totals, and needs a time zone", () => {
    const watts = xml.replace("<espi:uom>72</espi:uom>", "<espi:uom>38</espi:uom>");
    expect(issuesOf(() => importIntervalData(watts)).some((i) => i.message.includes("uom 38"))).toBe(true);
    const bulk = xml.replace("<espi:accumulationBehaviour>4</espi:accumulationBehaviour>", "<espi:accumulationBehaviour>1</espi:accumulationBehaviour>");
    expect(issuesOf(() => importIntervalData(bulk)).some((i) => i.message.includes("running register"))).toBe(true);
    const noTz = xml.replace(/<espi:tzOffset>-18000<\/espi:tzOffset>/, "");
    expect(issuesOf(() => importIntervalData(noTz))[0].path).toBe("utcOffsetHours");
    expect(importIntervalData(noTz, { utcOffsetHours: -5 }).hourlyKwh[JAN10]).toBeCloseTo(0.3, 12);
  });

  it("applies powerOfTenMultiplier (value × 10^m Wh)", () => {
    const scaled = xml.replace("<espi:powerOfTenMultiplier>0</espi:powerOfTenMultiplier>", "<espi:powerOfTenMultiplier>-1</espi:powerOfTenMultiplier>");
    expect(importIntervalData(scaled).hourlyKwh[JAN10]).toBeCloseTo(0.03, 12); // 300 × 10^−1 Wh
  });
});

describe("interval CSV", () => {
  it("reads timestamp,kWh and sums 15-minute rows into the hour (invented fixture)", () => {
    const p = importIntervalData(csv);
    expect(p.hourlyKwh[JAN10]).toBeCloseTo(0.3, 12); // 4 × 0.075
    expect(p.hourlyKwh[JAN10 + 1]).toBeCloseTo(0.31, 12);
    expect(p.measuredHours).toBe(24);
    expect(p.notes.some((n) => n.includes("local standard time"))).toBe(true);
  });

  it("reads quoted cells (a kWh with a thousands comma) and names the line of a broken quote", () => {
    const text = 'timestamp,kWh\n2023-07-01T12:00,"1,250.5"\n2023-07-01T13:00,"2.5\n';
    const issues = issuesOf(() => parseIntervalCsv(text));
    expect(issues).toHaveLength(1);
    expect(issues[0].path).toBe("line 3");
    expect(issues[0].message).toMatch(/cannot be read.*quote/i);
    const ok = parseIntervalCsv('timestamp,kWh\n2023-07-01T12:00,"1,250.5"\n2023-07-01T13:00,"2.5"\n');
    expect(ok.readings.map((r) => r.kwh)).toEqual([1250.5, 2.5]);
  });

  it("converts offset timestamps to local standard time with the site's offset", () => {
    const text = "timestamp,kWh\n2023-07-01T12:00:00-04:00,1.5\n2023-07-01T13:00:00-04:00,1.0\n";
    expect(issuesOf(() => parseIntervalCsv(text))[0].path).toBe("utcOffsetHours");
    // 12:00 EDT (UTC−4) = 16:00 UTC = 11:00 EST (UTC−5). 1 July = day 181 → hour 181 × 24 + 11.
    const p = importIntervalData(text, { utcOffsetHours: -5 });
    expect(p.hourlyKwh[181 * 24 + 11]).toBeCloseTo(1.5, 12);
  });

  it("reads stamps without an offset as the site's clock time, daylight saving included", () => {
    // A summer export in New York clock time: 15:00 EDT is 14:00 EST. 1 July = day 181.
    const summer = "timestamp,kWh\n2023-07-01T15:00,2.0\n2023-07-01T16:00,3.0\n";
    const p = importIntervalData(summer, { utcOffsetHours: -5, timeZone: "America/New_York" });
    expect(p.hourlyKwh[181 * 24 + 14]).toBeCloseTo(2, 12);
    expect(p.hourlyKwh[181 * 24 + 15]).toBeCloseTo(3, 12);
    expect(p.notes.some((n) => n.includes("clock time in America/New_York"))).toBe(true);
    // Winter stamps are standard time already: 15:00 EST on 10 January (day 9).
    const winter = importIntervalData("timestamp,kWh\n2023-01-10T15:00,1.0\n", { timeZone: "America/New_York" });
    expect(winter.hourlyKwh[9 * 24 + 15]).toBeCloseTo(1, 12);
  });

  it("the hour repeated when daylight saving ends lands twice, an hour apart", () => {
    // 5 November 2023, New York: 01:00–02:00 happens twice (EDT, then EST). Day 308.
    const text = "timestamp,kWh\n2023-11-05T00:00,1\n2023-11-05T01:00,2\n2023-11-05T01:00,3\n2023-11-05T02:00,4\n";
    const p = importIntervalData(text, { timeZone: "America/New_York" });
    // In standard time: 00:00 EDT = 23:00 EST the day before; 01:00 EDT = 00:00 EST; 01:00 EST; 02:00 EST.
    expect(Array.from(p.hourlyKwh.slice(307 * 24 + 23, 307 * 24 + 27))).toEqual([1, 2, 3, 4]);
  });

  it("reads date + start time + end time + usage + units columns after preamble lines", () => {
    const text = [
      "Name,Invented Household",
      "Address,1 Nowhere Lane",
      "",
      "TYPE,DATE,START TIME,END TIME,USAGE,UNITS,COST",
      "Electric usage,1/10/2023,00:00,00:59,0.42,kWh,$0.06",
      "Electric usage,1/10/2023,01:00,01:59,380,Wh,$0.05",
    ].join("\n");
    const p = importIntervalData(text);
    expect(p.hourlyKwh[JAN10]).toBeCloseTo(0.42, 12);
    expect(p.hourlyKwh[JAN10 + 1]).toBeCloseTo(0.38, 12);
    expect(p.measuredHours).toBe(2);
  });

  it("names every bad line", () => {
    const issues = issuesOf(() => importIntervalData("timestamp,kWh\n2023-01-01T00:00,abc\n2023-02-30T00:00,1\n2023-01-01T02:00,-1\n"));
    expect(issues.map((i) => i.path)).toEqual(["line 2", "line 3", "line 4"]);
  });
});

describe("readingsToProfile", () => {
  it("spreads a daily reading over its hours and averages overlapping readings", () => {
    const day = Date.UTC(2023, 2, 1) / 1000; // 1 March 2023, local standard seconds
    const p = readingsToProfile([
      { startSec: day, durationSec: 86_400, kwh: 24 },
      { startSec: day, durationSec: 3600, kwh: 3 },
    ]);
    // Hour 0: (1 + 3) kWh over 7,200 covered seconds → scaled to 3,600 s = 2 kWh. Others 1 kWh.
    const h0 = 59 * 24;
    expect(p.hourlyKwh[h0]).toBeCloseTo(2, 12);
    expect(p.hourlyKwh[h0 + 1]).toBeCloseTo(1, 12);
    expect(p.notes.some((n) => n.includes("overlapping"))).toBe(true);
  });
});
