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
import { readCsvRecords } from "../../src/engine/csv";

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
    name: "sun: 8760 h, SPA with 3-day geocentric nodes",
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

/**
 * The model against NREL's PVWatts hourly result for Denver (tests/fixtures/weather, with its
 * attribution): the file's own beam, diffuse, temperature and wind in; annual, monthly and hourly
 * errors out. The same check runs as a test in src/engine/production.test.ts.
 */
export function denverAccuracy(): string[] {
  const records = readCsvRecords(readFileSync(fileURLToPath(new URL("tests/fixtures/weather/pvwatts-8760-rackmount-denver.csv", root)), "utf8"));
  const start = records.findIndex((r) => r.cells.slice(0, 3).join(",") === "Month,Day,Hour") + 1;
  const ref = records.slice(start, start + 8760).map((r) => r.cells.map(Number));
  const csv = ["month,day,hour,dni,dhi,temp_air,wind_speed", ...ref.map((r) => r.slice(0, 7).join(","))].join("\n");
  const w = parseWeather(csv, { site: { latitude: 39.73, longitude: -105.18, elevationM: 1819.6, utcOffsetHours: -7 } });
  const r = estimateProduction(w, {
    faces: [{ tiltDeg: 20, azimuthDeg: 180, moduleCount: 10, moduleWatts: 400, moduleType: "standard", mount: "open-rack" }],
    inverter: { kind: "string", dcAcRatio: 1.2, efficiencyPct: 96 },
    losses: { totalPct: 14.08 },
  }, { faceHours: true });
  const refAnnual = ref.reduce((s, x) => s + x[10], 0) / 1000;
  const refMonthly = new Array<number>(12).fill(0);
  for (const x of ref) refMonthly[x[0] - 1] += x[10] / 1000;
  const monthErr = r.monthlyAcKwh.map((v, m) => (v / refMonthly[m] - 1) * 100);
  const stats = (model: ArrayLike<number>, col: number) => {
    let se = 0;
    let sb = 0;
    for (let i = 0; i < 8760; i++) {
      const d = model[i] - ref[i][col];
      se += d * d;
      sb += d;
    }
    return `RMSE ${Math.sqrt(se / 8760).toFixed(2)}, MBE ${(sb / 8760).toFixed(3)}`;
  };
  const f = r.faces[0].hours;
  if (!f) throw new Error("face hours missing");
  return [
    `Denver, PVWatts 4 kW open rack: annual AC ${r.annualAcKwh.toFixed(2)} kWh vs ${refAnnual.toFixed(2)} kWh (${((r.annualAcKwh / refAnnual - 1) * 100).toFixed(2)} %; goal ±2 %)`,
    `monthly AC error, Jan–Dec, %: ${monthErr.map((e) => e.toFixed(2)).join(", ")} (largest ${Math.max(...monthErr.map(Math.abs)).toFixed(2)} %; goal ±4 %)`,
    `hourly POA W/m²: ${stats(f.poa, 7)}; cell temperature °C: ${stats(f.cellTempC, 8)}; DC W: ${stats(f.dcW, 9)}; AC W: ${stats(r.hourlyAcW, 10)}`,
  ];
}
