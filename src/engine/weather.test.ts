import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { EngineInputError } from "./errors";
import { DEFAULT_ALBEDO, detectWeatherFormat, hourIndex, parseWeather } from "./weather";

const root = fileURLToPath(new URL("../../", import.meta.url));
const read = (p: string) => readFileSync(root + p, "utf8");

/** A synthetic generic CSV year: clear-ish days, 20 °C, 2 m/s. */
function syntheticCsv(opts: { withGhi?: boolean; leap?: boolean; columns?: string[] } = {}): string {
  const cols = opts.columns ?? ["hour", "day", "month", "dni", "dhi", ...(opts.withGhi ? ["ghi"] : []), "temp_air", "wind_speed"];
  const lines = [cols.join(",")];
  const days = [31, opts.leap ? 29 : 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
  for (let m = 1; m <= 12; m++)
    for (let d = 1; d <= days[m - 1]; d++)
      for (let h = 0; h < 24; h++) {
        const up = h >= 7 && h <= 16;
        const v: Record<string, number> = { month: m, day: d, hour: h, dni: up ? 600 : 0, dhi: up ? 100 : 0, ghi: up ? 500 : 0, temp_air: 20, wind_speed: 2 };
        lines.push(cols.map((c) => v[c]).join(","));
      }
  return lines.join("\n");
}
const denverSite = { latitude: 39.73, longitude: -105.18, elevationM: 1820, utcOffsetHours: -7 };

describe("TMY3 import", () => {
  it("reads the Greensboro TMY3 file: header fields, 8760 rows, units", () => {
    const text = read("src/engine/data/tmy3-723170-greensboro-nc.csv");
    expect(detectWeatherFormat(text)).toBe("tmy3");
    const w = parseWeather(text);
    // Header line of the file (NREL NSRDB TMY3, station 723170): UTC−5, 36.100, −79.950, 273 m.
    expect(w.site).toMatchObject({ latitude: 36.1, longitude: -79.95, elevationM: 273, utcOffsetHours: -5 });
    expect(w.site.name).toContain("GREENSBORO");
    expect(w.ghi.length).toBe(8760);
    // First data row "01/01/1988,01:00" → hour 0; its dry bulb is 10.0 °C and wind 6.2 m/s (file line 3).
    expect([w.month[0], w.day[0], w.hour[0]]).toEqual([1, 1, 0]);
    expect(w.tempAirC[0]).toBe(10);
    expect(w.windSpeedMs[0]).toBe(6.2);
    // Last row "12/31/1980,24:00" → hour 23 of 31 December.
    expect([w.month[8759], w.day[8759], w.hour[8759]]).toEqual([12, 31, 23]);
    let annualGhi = 0;
    for (const g of w.ghi) annualGhi += g;
    // A mid-latitude U.S. site receives roughly 1.5–1.8 MWh/m² a year on the horizontal.
    expect(annualGhi / 1000).toBeGreaterThan(1400);
    expect(annualGhi / 1000).toBeLessThan(1900);
    // This file's "Alb (unitless)" column is 0.00 throughout (not measured): the default applies.
    expect(w.albedoFromFileHours).toBe(0);
    expect(w.albedo[4000]).toBe(DEFAULT_ALBEDO);
    expect(w.ghiDerived).toBe(false);
  });
});

describe("EPW import", () => {
  it("reads the PVGIS EPW file: LOCATION header, hour-ending rows, albedo fallback", () => {
    const text = read("tests/fixtures/weather/epw-pvgis-tmy-lat45-lon8.epw");
    expect(detectWeatherFormat(text)).toBe("epw");
    const w = parseWeather(text);
    // LOCATION,unknown,-,unknown,ECMWF/ERA,unknown,45.000000,8.000000,1,250
    expect(w.site).toMatchObject({ latitude: 45, longitude: 8, utcOffsetHours: 1, elevationM: 250 });
    expect(w.format).toBe("epw");
    // First data row: 2018,1,1,1,… dry bulb 2.04 °C, wind 0.7 m/s, albedo 999 (missing) → default.
    expect(w.tempAirC[0]).toBeCloseTo(2.04, 10);
    expect(w.windSpeedMs[0]).toBeCloseTo(0.7, 10);
    expect(w.albedo[0]).toBe(DEFAULT_ALBEDO);
    expect(w.notes.join(" ")).toMatch(/albedo 0.2/);
    for (const arr of [w.ghi, w.dni, w.dhi, w.tempAirC, w.windSpeedMs]) expect(arr.every(Number.isFinite)).toBe(true);
  });

  it("reports missing-value codes with line numbers", () => {
    const lines = read("tests/fixtures/weather/epw-pvgis-tmy-lat45-lon8.epw").split("\n");
    const f = lines[20].split(",");
    f[13] = "9999";
    lines[20] = f.join(",");
    expect(() => parseWeather(lines.join("\n"))).toThrow(/line 21: ghi is missing \(code 9999\)/);
  });
});

describe("format checks", () => {
  it("says plainly when a forced format does not match the content", () => {
    const tmy3 = read("src/engine/data/tmy3-723170-greensboro-nc.csv");
    expect(() => parseWeather(tmy3, { format: "epw" })).toThrow(/line 1: not an EPW file/);
    expect(() => parseWeather(syntheticCsv(), { format: "tmy3", site: denverSite })).toThrow(/line 2: not a TMY3 file/);
  });
});

describe("generic hourly CSV", () => {
  it("accepts columns in any order, derives GHI = DNI·cos z + DHI when absent", () => {
    const w = parseWeather(syntheticCsv(), { site: denverSite });
    expect(w.format).toBe("csv");
    expect(w.ghiDerived).toBe(true);
    // Noon in June: GHI between DHI and DNI + DHI.
    const i = hourIndex(6, 21, 12);
    expect(w.ghi[i]).toBeGreaterThan(100 + 600 * 0.9);
    expect(w.ghi[i]).toBeLessThan(700);
    // Night hours keep GHI = DHI = 0.
    expect(w.ghi[hourIndex(6, 21, 0)]).toBe(0);
  });

  it("uses a given ghi column as is", () => {
    const w = parseWeather(syntheticCsv({ withGhi: true }), { site: denverSite });
    expect(w.ghiDerived).toBe(false);
    expect(w.ghi[hourIndex(6, 21, 12)]).toBe(500);
  });

  it("drops 29 February from leap years", () => {
    const w = parseWeather(syntheticCsv({ leap: true }), { site: denverSite });
    expect(w.notes).toContain("dropped 24 rows of 29 February");
    expect(w.ghi.length).toBe(8760);
  });

  it("requires the site for a generic CSV, naming each missing field", () => {
    try {
      parseWeather(syntheticCsv());
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const msg = (e as Error).message;
      for (const f of ["latitude", "longitude", "elevationM", "utcOffsetHours"]) expect(msg).toContain(f);
    }
  });

  it("names lines with out-of-range values, missing columns, duplicates and gaps", () => {
    const lines = syntheticCsv().split("\n");
    lines[13] = lines[13].replace(/,600,100,20,2$/, ",1600,100,20,2"); // dni too high (hour 12 of 1 Jan)
    lines[14] = lines[14].replace(/,20,2$/, ",20,-3"); // negative wind
    expect(() => parseWeather(lines.join("\n"), { site: denverSite })).toThrow(/line 14: dni 1600 W\/m² is outside 0–1400[\s\S]*line 15: wind_speed -3/);

    expect(() => parseWeather("month,day,hour,dni,temp_air\n1,1,0,0,0", { site: denverSite })).toThrow(/column "dhi" is missing[\s\S]*column "wind_speed" is missing/);

    const dup = syntheticCsv().split("\n");
    dup[3] = dup[2];
    expect(() => parseWeather(dup.join("\n"), { site: denverSite })).toThrow(/line 4: duplicate hour[\s\S]*hour missing: month 1, day 1, hour 2/);

    const short = syntheticCsv().split("\n").slice(0, 100);
    expect(() => parseWeather(short.join("\n"), { site: denverSite })).toThrow(/hours missing in all/);
  });

  it("catches irradiance in kW/m² and temperatures in °F", () => {
    const kw = syntheticCsv().replace(/,600,100,/g, ",0.6,0.1,");
    expect(() => parseWeather(kw, { site: denverSite })).toThrow(/expected W\/m²/);
    const f = syntheticCsv().split("\n").map((l, i) => (i === 0 ? l : l.replace(/,20,2$/, ",55,2"))).join("\n");
    expect(() => parseWeather(f, { site: denverSite })).toThrow(/expected °C, not °F/);
  });

  it("uses a valid albedo column and falls back to 0.2 elsewhere", () => {
    const lines = syntheticCsv({ columns: ["month", "day", "hour", "dni", "dhi", "temp_air", "wind_speed", "albedo"] }).split("\n");
    const withAlbedo = lines.map((l, i) => (i === 0 ? l : l.replace(/,$/, i % 2 ? ",0.6" : ",999"))).join("\n");
    const w = parseWeather(withAlbedo, { site: denverSite });
    expect(w.albedo[0]).toBe(0.6);
    expect(w.albedo[1]).toBe(DEFAULT_ALBEDO);
    expect(w.albedoFromFileHours).toBe(4380);
  });
});
