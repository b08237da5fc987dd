/**
 * Benchmarks for the money half of the engine: the sizing search, the 25-year cash-flow table
 * with IRR, a 25-year re-billing under a time-of-use plan, and the whole example quote.
 * Run through scripts/bench.ts, which times each case's `run()`.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { BenchCase } from "./types";
import { sizeSystem } from "../../src/engine/sizing";
import { buildCashflow } from "../../src/engine/cashflow";
import { makeBillCalculator, type RatePlanInput } from "../../src/engine/rates";
import { spreadMonthlyToHourly } from "../../src/engine/load-shape";
import { buildQuote, type ProduceFn, type QuoteCaseInput } from "../../src/engine/quote";
import { parseWeather, type WeatherYear } from "../../src/engine/weather";
import { estimateProduction } from "../../src/engine/production";
import { importIntervalData } from "../../src/engine/green-button";

const root = new URL("../../", import.meta.url);

// Invented inputs.
const faces = Array.from({ length: 12 }, (_, i) => ({ id: `face-${i + 1}`, usableSlots: 8 + (i % 5) * 4, specificYieldKwhPerKw: 800 + ((i * 97) % 600) }));

const usage = spreadMonthlyToHourly([900, 820, 760, 700, 850, 1100, 1300, 1250, 1000, 780, 760, 880]).hourlyKwh;
const production = Array.from({ length: 8760 }, (_, h) => {
  const hour = h % 24;
  const day = Math.floor(h / 24);
  const season = 0.75 + 0.25 * Math.cos((2 * Math.PI * (day - 172)) / 365);
  return hour >= 6 && hour < 19 ? 6 * season * Math.sin((Math.PI * (hour - 6 + 0.5)) / 13) : 0;
});
const touPlan: RatePlanInput = {
  name: "invented TOU with net billing",
  fixedMonthlyCents: 1200,
  energy: {
    kind: "tou",
    periods: [
      { id: "peak", centsPerKwh: 38 },
      { id: "mid", centsPerKwh: 24 },
      { id: "off", centsPerKwh: 14 },
    ],
    seasons: [
      { name: "summer", months: [6, 7, 8, 9], otherHoursPeriodId: "off", weekday: [{ startHour: 15, endHour: 21, periodId: "peak" }, { startHour: 7, endHour: 15, periodId: "mid" }] },
      { name: "winter", months: [1, 2, 3, 4, 5, 10, 11, 12], otherHoursPeriodId: "off", weekday: [{ startHour: 16, endHour: 21, periodId: "mid" }] },
    ],
  },
  compensation: { kind: "net-billing", exportCentsPerKwh: 6 },
};
const rebill = makeBillCalculator(touPlan, { calendarYear: 2025, timeZone: "America/Los_Angeles" });

let exampleCase: QuoteCaseInput | null = null;
let weather: WeatherYear | null = null;
const produce: ProduceFn<WeatherYear> = (design, w) => {
  const r = estimateProduction(w, design);
  return { hourlyAcKwh: Array.from(r.hourlyAcW, (x) => x / 1000), dcKw: r.dcKw, acKw: r.acKw };
};

/** One invented year of 15-minute Green Button readings (35,040), as ESPI XML. */
function inventedEspiYear(): string {
  const start = Date.UTC(2024, 0, 1, 5) / 1000; // 1 Jan 2024 00:00 at UTC−5
  const readings: string[] = [];
  for (let i = 0; i < 365 * 96; i++) {
    const hour = Math.floor(i / 4) % 24;
    const wh = 80 + 40 * Math.sin((Math.PI * hour) / 24) + (i % 7);
    readings.push(`<espi:IntervalReading><espi:timePeriod><espi:duration>900</espi:duration><espi:start>${start + i * 900}</espi:start></espi:timePeriod><espi:value>${Math.round(wh)}</espi:value></espi:IntervalReading>`);
  }
  return `<?xml version="1.0"?><feed xmlns="http://www.w3.org/2005/Atom" xmlns:espi="http://naesb.org/espi">
<entry><content><espi:LocalTimeParameters><espi:tzOffset>-18000</espi:tzOffset></espi:LocalTimeParameters></content></entry>
<entry><content><espi:ReadingType><espi:accumulationBehaviour>4</espi:accumulationBehaviour><espi:flowDirection>1</espi:flowDirection><espi:powerOfTenMultiplier>0</espi:powerOfTenMultiplier><espi:uom>72</espi:uom></espi:ReadingType></content></entry>
<entry><content><espi:IntervalBlock>${readings.join("\n")}</espi:IntervalBlock></content></entry></feed>`;
}
let espiYear = "";

export const cases: BenchCase[] = [
  {
    name: "money: sizing search, 12 faces, target 95 %",
    goal: "≤ 0.1 ms median",
    goalMedianMs: 0.1,
    run: () => sizeSystem({ annualUsageKwh: 14_000, targetOffsetPct: 95, moduleWatts: 420, faces, inverterAcKw: 10, dcAcMode: "limit" }),
  },
  {
    name: "money: 25-year table with loan, NPV, IRR, LCOE",
    goal: "≤ 2 ms median",
    goalMedianMs: 2,
    run: () =>
      buildCashflow({
        grossPriceCents: 3_150_000,
        incentivesByYear: [0, 945_000],
        payment: { kind: "loan", aprPct: 6.99, termMonths: 240, dealerFeePct: 15, downPaymentCents: 0 },
        year1ProductionKwh: 11_800,
        billWithoutSolarCents: 240_000,
        billWithSolarCents: 38_000,
      }),
  },
  {
    name: "money: 25 years re-billed hourly (TOU, net billing)",
    goal: "≤ 20 ms median",
    goalMedianMs: 20,
    run: () => {
      const degraded = new Float64Array(8760);
      let total = 0;
      for (let n = 0; n < 25; n++) {
        const f = Math.pow(0.995, n);
        for (let h = 0; h < 8760; h++) degraded[h] = production[h] * f;
        total += rebill(usage, degraded).totalCents;
      }
      return total;
    },
  },
  {
    name: "usage: Green Button XML, one year of 15-minute readings (35,040) → 8760 h",
    goal: "≤ 400 ms median",
    goalMedianMs: 400,
    setup: () => {
      espiYear = inventedEspiYear();
    },
    run: () => importIntervalData(espiYear),
  },
  {
    name: "money: whole example quote (sizing probes + production + 25 bills + table)",
    goal: "≤ 150 ms median",
    goalMedianMs: 150,
    setup: () => {
      exampleCase = JSON.parse(readFileSync(fileURLToPath(new URL("docs/examples/quote-case.json", root)), "utf8")) as QuoteCaseInput;
      weather = parseWeather(readFileSync(fileURLToPath(new URL("src/engine/data/tmy3-723170-greensboro-nc.csv", root)), "utf8"));
    },
    run: () => {
      if (!exampleCase || !weather) throw new Error("setup did not run");
      return buildQuote(exampleCase, { weather, produce, hourlyTempC: weather.tempAirC });
    },
  },
];
