import { describe, expect, it } from "vitest";
import { formatCentsCompact, formatSignedCents } from "@/lib/format";
import { formatAprPct, plainAssumption, plainWeatherSource } from "@/lib/plain-words";

describe("plainAssumption", () => {
  it("says where the weather was measured in words, without the station's id or file format", () => {
    expect(plainAssumption("Weather: TMY3 723170 GREENSBORO PIEDMONT TRIAD INT, NC.")).toBe(
      "Weather: a typical year of hourly sun and temperature measured at Greensboro Piedmont Triad Int, NC.",
    );
    expect(plainAssumption("Weather: NREL TMY3 station 723170 GREENSBORO PIEDMONT TRIAD INT, NC.")).not.toMatch(/TMY3|723170|NREL/);
  });

  it("drops method citations and keeps the sentence", () => {
    const s = plainAssumption("System losses: 14.1 % combined (wiring, soiling, mismatch, connections, availability and others; PVWatts method, Dobos 2014).");
    expect(s).toBe("System losses: 14.1 % combined (wiring, soiling, mismatch, connections, availability and others).");
    expect(plainAssumption("3 of the 12 months had no bill and were estimated from a degree-day regression against the site's weather (PRISM method, Fels 1986).")).toBe(
      "3 of the 12 months had no bill and were estimated from how your usage follows the weather at your home.",
    );
  });

  it("writes US English", () => {
    expect(plainAssumption("Incentives depend on the programme's rules.")).toBe("Incentives depend on the program's rules.");
  });

  it("leaves a plain sentence as it is", () => {
    expect(plainAssumption("Utility prices rise 3 % a year.")).toBe("Utility prices rise 3 % a year.");
  });
});

describe("formatAprPct", () => {
  it("gives an APR to the hundredth, the way the lender quotes it, and never rounds 6.99 to 7.0", () => {
    expect(formatAprPct(6.99)).toBe("6.99 %");
    expect(formatAprPct(7)).toBe("7 %");
    expect(formatAprPct(4.25)).toBe("4.25 %");
    expect(formatAprPct(4.5)).toBe("4.5 %");
  });
});

describe("formatSignedCents", () => {
  it("puts the minus sign before the dollar sign", () => {
    expect(formatSignedCents(-1_250_000)).toBe("−$12,500");
    expect(formatSignedCents(1_250_000)).toBe("$12,500");
    expect(formatSignedCents(-20)).toBe("$0");
    expect(formatSignedCents(null)).toBe("—");
  });
});

describe("formatCentsCompact", () => {
  it("writes negative amounts with a minus sign before the dollar sign", () => {
    expect(formatCentsCompact(-1_500_000)).toBe("−$15k");
    expect(formatCentsCompact(1_500_000)).toBe("$15k");
    expect(formatCentsCompact(0)).toBe("$0k");
    expect(formatCentsCompact(-40_000)).toBe("−$0.4k");
  });
});

describe("plainWeatherSource", () => {
  it("keeps a mixed-case station name and drops its id in brackets", () => {
    expect(plainWeatherSource("Greensboro Piedmont Triad Int'l (TMY3 723170)")).toBe("a typical year of hourly sun and temperature measured at Greensboro Piedmont Triad Int'l");
    expect(plainWeatherSource("EPW Denver West (NREL)")).toBe("a typical year of hourly sun and temperature measured at Denver West");
  });
});
