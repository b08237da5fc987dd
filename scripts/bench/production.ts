/**
 * Benchmarks for the production half of the engine: a year of hourly production for a 3-face
 * roof (sun positions included, and with them cached), and 8,760 sun positions by our SPA beside
 * astronomy-engine and beside the full SPA evaluated for every hour.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import * as Astronomy from "astronomy-engine";
import { clearProductionCache, estimateProduction, type SystemDesign } from "../../src/engine/production";
import { solarPosition, sunPositionsForYear, typicalHourStartMs } from "../../src/engine/solar-position";
import { parseWeather, type WeatherYear } from "../../src/engine/weather";
import type { BenchCase } from "./types";

const root = new URL("../../", import.meta.url);
let weather: WeatherYear | null = null;
function loadWeather(): WeatherYear {
  weather ??= parseWeather(readFileSync(fileURLToPath(new URL("src/engine/data/tmy3-723170-greensboro-nc.csv", root)), "utf8"));
  return weather;
}

// An invented 3-face roof: south, east and west, roof mount, one string inverter.
const design: SystemDesign = {
  faces: [
    { name: "south", tiltDeg: 26, azimuthDeg: 180, moduleCount: 12, moduleWatts: 420 },
    { name: "east", tiltDeg: 26, azimuthDeg: 90, moduleCount: 8, moduleWatts: 420, solarAccessPct: 92 },
    { name: "west", tiltDeg: 18, azimuthDeg: 270, moduleCount: 6, moduleWatts: 420, solarAccessPct: [80, 85, 90, 95, 97, 97, 97, 97, 95, 90, 85, 80] },
  ],
  inverter: { kind: "string", acKw: 9 },
};

const site = { latitude: 36.1, longitude: -79.95, elevationM: 273, utcOffsetHours: -5 };
const MS_HALF_HOUR = 1_800_000;

/** The 8,760 hour-middle instants of the typical year at the benchmark site. */
const instants = Array.from({ length: 8760 }, (_, i) => new Date(typicalHourStartMs(i, site.utcOffsetHours) + MS_HALF_HOUR));

function astronomyEngineYear(): Float64Array {
  const observer = new Astronomy.Observer(site.latitude, site.longitude, site.elevationM);
  const zen = new Float64Array(8760);
  for (let i = 0; i < 8760; i++) {
    const eq = Astronomy.Equator(Astronomy.Body.Sun, instants[i], observer, true, true);
    zen[i] = 90 - Astronomy.Horizon(instants[i], observer, eq.ra, eq.dec).altitude;
  }
  return zen;
}

function fullSpaYear(): Float64Array {
  const zen = new Float64Array(8760);
  for (let i = 0; i < 8760; i++) zen[i] = solarPosition(instants[i], { ...site, refraction: false }).airlessZenithDeg;
  return zen;
}

/** Largest zenith difference between our year positions (hour middles, airless) and astronomy-engine, degrees. */
export function sunAccuracyVsAstronomyEngine(): number {
  const ours = sunPositionsForYear(site, { refraction: false, sunUpMidpoint: false });
  const ref = astronomyEngineYear();
  let max = 0;
  for (let i = 0; i < 8760; i++) max = Math.max(max, Math.abs(ours.airlessZenithDeg[i] - ref[i]));
  return max;
}

export const cases: BenchCase[] = [
  {
    name: "production: 3 faces × 8760 h, sun positions included",
    goal: "≤ 10 ms median",
    goalMedianMs: 10,
    setup: () => void loadWeather(),
    run: () => {
      const w = loadWeather();
      clearProductionCache(w);
      return estimateProduction(w, design).annualAcKwh;
    },
  },
  {
    name: "production: 3 faces × 8760 h, sun positions cached",
    goal: "(for reference)",
    setup: () => void estimateProduction(loadWeather(), design),
    run: () => estimateProduction(loadWeather(), design).annualAcKwh,
  },
  {
    name: "sun: 8760 h, SPA with 2-day geocentric nodes",
    goal: "≥ 10× faster than astronomy-engine",
    run: () => sunPositionsForYear(site, { refraction: false, sunUpMidpoint: false }),
  },
  {
    name: "sun: 8760 h, full SPA every hour",
    goal: "(for reference)",
    run: fullSpaYear,
  },
  {
    name: "sun: 8760 h, astronomy-engine 2.1",
    goal: "(reference library)",
    run: astronomyEngineYear,
  },
];
