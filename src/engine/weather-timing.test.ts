import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { EngineInputError } from "./errors";
import { parseWeather } from "./weather";
import { offsetContradiction, sunTimingShiftHours } from "./weather-timing";

const greensboro = readFileSync(path.resolve(__dirname, "data/tmy3-723170-greensboro-nc.csv"), "utf8");
const pvgis = readFileSync(path.resolve(__dirname, "../../tests/fixtures/weather/epw-pvgis-tmy-lat45-lon8.epw"), "utf8");

describe("weather timing checked against the sun", () => {
  it("NREL TMY3 Greensboro (UTC−5, hour-ending stamps read as such) sits on solar noon", () => {
    const w = parseWeather(greensboro);
    expect(Math.abs(w.timingShiftHours ?? 99)).toBeLessThan(0.1);
    expect(w.notes.some((n) => n.startsWith("The sunshine in this file"))).toBe(false);
  });

  it("hour-ending data taken as hour-starting sit an hour late, and are reported", () => {
    const w = parseWeather(greensboro);
    // Every value one row later, as if stamps marking the hour's end had been read as its start.
    const late = new Float64Array(8760);
    for (let i = 1; i < 8760; i++) late[i] = w.ghi[i - 1];
    expect(sunTimingShiftHours(late, w.site.longitude, w.site.utcOffsetHours)).toBeCloseTo(1, 1);
  });

  it("the PVGIS TMY EPW sits about 0.6 h before its header's UTC+1 and says so", () => {
    const w = parseWeather(pvgis);
    expect(w.timingShiftHours).toBeLessThan(-0.5);
    expect(w.timingShiftHours).toBeGreaterThan(-0.8);
    expect(w.notes.find((n) => n.startsWith("The sunshine in this file sits 0.6 h earlier than the sun does at UTC offset +1 h"))).toBeDefined();
  });

  it("refuses an offset whose sign contradicts the longitude (Greensboro given +5 h)", () => {
    try {
      parseWeather(greensboro, { site: { utcOffsetHours: 5 } });
      throw new Error("expected a refusal");
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).issues[0]).toEqual({
        path: "site.utcOffsetHours",
        message: "a UTC offset of +5 h does not fit longitude -79.95° (west of Greenwich, where clocks are behind UTC; expected about −5 h)",
      });
    }
  });

  it("accepts real zones that stray from longitude ÷ 15, across the date line too", () => {
    expect(offsetContradiction(-171.77, 13)).toBeNull(); // Apia, Samoa
    expect(offsetContradiction(75.99, 8)).toBeNull(); // Kashgar, China
    expect(offsetContradiction(-8.54, 1)).toBeNull(); // Santiago de Compostela, Spain
    expect(offsetContradiction(174.76, 12)).toBeNull(); // Auckland
    expect(offsetContradiction(8, -5)).not.toBeNull();
  });
});
