import * as Astronomy from "astronomy-engine";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { EngineInputError } from "./errors";
import { createSunEvaluator, newSunAngles, solarPosition, sunPositionsForYear, typicalHourStartMs, type SunAngles } from "./solar-position";

const D2R = Math.PI / 180;

/** Great-circle angle between two (zenith, azimuth) directions, degrees. */
function separationDeg(z1: number, a1: number, z2: number, a2: number): number {
  const c =
    Math.cos(z1 * D2R) * Math.cos(z2 * D2R) + Math.sin(z1 * D2R) * Math.sin(z2 * D2R) * Math.cos((a1 - a2) * D2R);
  return Math.acos(Math.min(1, Math.max(-1, c))) / D2R;
}

describe("solarPosition (NREL SPA)", () => {
  it("reproduces the worked example of Reda & Andreas 2004 (Table A5.2)", () => {
    // Reda & Andreas 2004, NREL/TP-560-34302, Appendix A.5: 2003-10-17 12:30:30 local (UTC−7),
    // lat 39.742476, lon −105.1786, elevation 1830.14 m, 820 mbar, 11 °C, ΔT 67 s →
    // topocentric zenith 50.11162°, topocentric azimuth 194.34024°.
    const p = solarPosition(new Date("2003-10-17T12:30:30-07:00"), {
      latitude: 39.742476,
      longitude: -105.1786,
      elevationM: 1830.14,
      pressureMbar: 820,
      temperatureC: 11,
      deltaTSeconds: 67,
    });
    expect(Math.abs(p.zenithDeg - 50.11162)).toBeLessThan(0.001);
    expect(Math.abs(p.azimuthDeg - 194.34024)).toBeLessThan(0.001);
    // Same paper, Table A5.2: Earth radius vector R = 0.9965422974 AU.
    expect(Math.abs(p.earthSunDistanceAu - 0.9965422974)).toBeLessThan(1e-8);
  });

  it("names every bad field", () => {
    try {
      solarPosition(new Date(0), { latitude: 95, longitude: Number.NaN, pressureMbar: 5 });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      const paths = (e as EngineInputError).issues.map((i) => i.path).sort();
      expect(paths).toEqual(["latitude", "longitude", "pressureMbar"]);
    }
    expect(() => solarPosition(new Date(Number.NaN), { latitude: 0, longitude: 0 })).toThrow(EngineInputError);
  });

  it("never yields NaN or Infinity for valid input", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: -180, max: 180, noNaN: true }),
        fc.double({ min: -500, max: 9000, noNaN: true }),
        fc.integer({ min: Date.UTC(1950, 0, 1), max: Date.UTC(2100, 0, 1) }),
        (latitude, longitude, elevationM, ms) => {
          const p = solarPosition(new Date(ms), { latitude, longitude, elevationM });
          return [p.zenithDeg, p.azimuthDeg, p.airlessZenithDeg, p.earthSunDistanceAu].every(Number.isFinite);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe("agreement with astronomy-engine (independent reference library)", () => {
  // astronomy-engine 2.1 (Don Cross, MIT): VSOP87-based apparent topocentric sun. Both sides
  // compared airless (no refraction), every hour of 2019, at several latitudes.
  const sites = [
    { latitude: -33.9, longitude: 18.4, elevationM: 10 },
    { latitude: 0.5, longitude: -78.5, elevationM: 2800 },
    { latitude: 21.3, longitude: -157.8, elevationM: 5 },
    { latitude: 39.74, longitude: -105.18, elevationM: 1830 },
    { latitude: 64.8, longitude: -147.7, elevationM: 130 },
  ];
  for (const site of sites) {
    it(`within 0.01° at latitude ${site.latitude}`, () => {
      const observer = new Astronomy.Observer(site.latitude, site.longitude, site.elevationM);
      const start = Date.UTC(2019, 0, 1);
      const evaluate = createSunEvaluator({ ...site, refraction: false }, start, start + 8760 * 3_600_000);
      const a: SunAngles = newSunAngles();
      let maxSep = 0;
      let maxFullVsFast = 0;
      for (let h = 0; h < 8760; h++) {
        const ms = start + h * 3_600_000 + 1_800_000;
        evaluate(ms, a);
        const date = new Date(ms);
        const eq = Astronomy.Equator(Astronomy.Body.Sun, date, observer, true, true);
        const hor = Astronomy.Horizon(date, observer, eq.ra, eq.dec);
        maxSep = Math.max(maxSep, separationDeg(a.airlessZenithDeg, a.azimuthDeg, 90 - hor.altitude, hor.azimuth));
        if (h % 7 === 0) {
          // the day-node interpolation against the full algorithm at the same instant
          const full = solarPosition(date, { ...site, refraction: false });
          maxFullVsFast = Math.max(maxFullVsFast, separationDeg(a.airlessZenithDeg, a.azimuthDeg, full.airlessZenithDeg, full.azimuthDeg));
        }
      }
      console.log(`lat ${site.latitude}: max separation vs astronomy-engine ${maxSep.toFixed(5)}°, interpolated vs full SPA ${maxFullVsFast.toExponential(2)}°`);
      expect(maxSep).toBeLessThan(0.01);
      expect(maxFullVsFast).toBeLessThan(1e-4);
    });
  }
});

describe("sunPositionsForYear", () => {
  const denver = { latitude: 39.74, longitude: -105.18, elevationM: 1830, utcOffsetHours: -7 };

  it("the year's hour-by-hour path (hour angle carried by rotation within each day) equals the one-instant evaluator", () => {
    for (const refraction of [true, false]) {
      const y = sunPositionsForYear(denver, { refraction, sunUpMidpoint: false, temperatureC: 10 });
      const start = typicalHourStartMs(0, -7);
      const ev = createSunEvaluator({ ...denver, refraction, temperatureC: 10 }, start - 3_600_000, start + 8761 * 3_600_000);
      const a = newSunAngles();
      let max = 0;
      for (let i = 0; i < 8760; i++) {
        ev(start + i * 3_600_000 + 1_800_000, a);
        max = Math.max(max, Math.abs(a.zenithDeg - y.zenithDeg[i]), Math.abs(a.airlessZenithDeg - y.airlessZenithDeg[i]));
        max = Math.max(max, Math.abs(((a.azimuthDeg - y.azimuthDeg[i] + 540) % 360) - 180));
      }
      expect(max).toBeLessThan(1e-8);
    }
  });

  it("evaluates each hour at its middle, sunrise/sunset hours at the middle of the sunlit part", () => {
    const y = sunPositionsForYear(denver);
    expect(y.zenithDeg.length).toBe(8760);
    // 21 June, 12:00–13:00 MST (hour index (171*24)+12): evaluated at 12:30.
    const noon = 171 * 24 + 12;
    expect(y.evaluatedAtLocalHour[noon]).toBeCloseTo(12.5, 9);
    const full = solarPosition(new Date(typicalHourStartMs(noon, -7) + 1_800_000), { latitude: 39.74, longitude: -105.18, elevationM: 1830 });
    expect(Math.abs(full.zenithDeg - y.zenithDeg[noon])).toBeLessThan(1e-4);
    // Every evaluated instant with the sun up lies in its hour, and a sunrise hour's instant is after the hour's middle.
    let sunriseHours = 0;
    for (let i = 0; i < 8760; i++) {
      const frac = y.evaluatedAtLocalHour[i] - (i % 24);
      expect(frac).toBeGreaterThanOrEqual(0);
      expect(frac).toBeLessThanOrEqual(1);
      if (i % 24 < 10 && frac > 0.5 + 1e-9) sunriseHours++;
    }
    expect(sunriseHours).toBeGreaterThan(300);
    for (const arr of [y.zenithDeg, y.azimuthDeg, y.airlessZenithDeg, y.earthSunDistanceAu, y.cosZenith, y.sinZenithCosAz, y.sinZenithSinAz]) {
      expect(arr.every(Number.isFinite)).toBe(true);
    }
    // the unit vector agrees with the angles
    for (let i = 0; i < 8760; i += 13) {
      const z = (y.zenithDeg[i] * Math.PI) / 180;
      const az = (y.azimuthDeg[i] * Math.PI) / 180;
      expect(y.cosZenith[i]).toBeCloseTo(Math.cos(z), 12);
      expect(y.sinZenithCosAz[i]).toBeCloseTo(Math.sin(z) * Math.cos(az), 12);
      expect(y.sinZenithSinAz[i]).toBeCloseTo(Math.sin(z) * Math.sin(az), 12);
    }
  });

  it("finds every sunrise and sunset hour (brute force at every hour boundary), at several latitudes", () => {
    for (const latitude of [0.5, 39.74, 64.8, -50]) {
      const site = { latitude, longitude: 20, elevationM: 100, utcOffsetHours: 1 };
      const y = sunPositionsForYear(site);
      const start = typicalHourStartMs(0, 1);
      const ev = createSunEvaluator({ ...site, temperatureC: 12 }, start - 3_600_000, start + 8761 * 3_600_000);
      const a = newSunAngles();
      const up = new Uint8Array(8761);
      for (let k = 0; k <= 8760; k++) {
        ev(start + k * 3_600_000, a);
        up[k] = a.elevationDeg > 0 ? 1 : 0;
      }
      for (let i = 0; i < 8760; i++) {
        const frac = y.evaluatedAtLocalHour[i] - (i % 24);
        if (up[i] !== up[i + 1]) expect(Math.abs(frac - 0.5)).toBeGreaterThan(1e-6);
        else expect(frac).toBeCloseTo(0.5, 9);
      }
    }
  });

  it("rejects bad sites and leap years with named fields", () => {
    expect(() => sunPositionsForYear({ ...denver, utcOffsetHours: 20 })).toThrow(/utcOffsetHours/);
    expect(() => sunPositionsForYear(denver, { year: 2020 })).toThrow(/year/);
  });
});
