/**
 * Quote one JSON case end to end: usage, production, bills before and after solar, the
 * 25-year table and summary figures.
 *
 *   npm run quote -- --case docs/examples/quote-case.json [--json]
 *
 * File paths inside the case (weather, interval data) are relative to the case file. The case
 * format is described in docs/quote-case.md.
 */
import { readFileSync } from "node:fs";
import { dirname, resolve } from "node:path";
import { EngineInputError } from "../src/engine/errors";
import { parseWeather, type WeatherYear } from "../src/engine/weather";
import { haversineKm } from "../src/engine/geo";

/** Past this, the report says how far the station is (our choice; the app refuses stations past 200 km). */
const STATION_DISTANCE_NOTE_KM = 50;
import { estimateProduction } from "../src/engine/production";
import { buildQuote, type ProduceFn, type QuoteCaseInput, type QuoteResult } from "../src/engine/quote";

/** The production model (src/engine/production.ts) behind the quote's injected `produce`. */
const produce: ProduceFn<WeatherYear> = (design, weather) => {
  const result = estimateProduction(weather, design);
  // hourlyAcW holds each hour's mean power, W; over one hour that is Wh.
  return { hourlyAcKwh: Array.from(result.hourlyAcW, (w) => w / 1000), dcKw: result.dcKw, acKw: result.acKw };
};

function usage(message: string): never {
  console.error(`${message}\nusage: npm run quote -- --case FILE.json [--json]`);
  process.exit(2);
}

function readText(path: string, what: string): string {
  try {
    return readFileSync(path, "utf8");
  } catch (e) {
    console.error(`Cannot read the ${what} ${path}: ${(e as Error).message}`);
    process.exit(1);
  }
}

const dollars = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

const pct = (x: number) => `${x.toFixed(1)} %`;
const hours = (h: number | null, span: number) => (h === null ? `${span} h or more` : `${h.toFixed(1)} h`);

function thirdPartyLines(t: NonNullable<QuoteResult["thirdParty"]>): string[] {
  return [
    `${t.kind === "lease" ? "Lease" : "Power purchase agreement"} with ${t.partner}, ${t.termYears} years: ${dollars(t.firstYearMonthlyCents)}/month in year 1, ${dollars(t.lastYearMonthlyCents)}/month in year ${t.termYears}, ${dollars(t.averageMonthlyCents)}/month on average`,
    `  upfront ${dollars(t.upfrontCents)}; total paid over the term ${dollars(t.totalPaidCents)}, of which the escalator adds ${dollars(t.escalatorEffectCents)}; bill savings ${dollars(t.lifetimeBillSavingsCents)}; net ${dollars(t.netSavingsCents)}`,
    `  ${t.ownership}`,
    ...t.ownerIncentives.applied.map((i) => `  owner's incentive (not the homeowner's; lowers ${t.partner}'s price): ${i.name} ${dollars(i.amountCents)}`),
    ...(t.productionGuaranteePct !== null ? [`  production guarantee: ${t.productionGuaranteePct} % of expected`] : []),
    ...(t.endOfTerm ? [`  end of term: ${t.endOfTerm}`] : []),
  ];
}

function batteryLines(b: NonNullable<QuoteResult["battery"]>): string[] {
  const y = b.year1;
  return [
    `Battery: ${b.spec.usableKwh} kWh usable, ${b.spec.continuousKw} kW (${b.spec.coupling.toUpperCase()}-coupled), ${b.mode}; price ${dollars(b.priceCents)}${b.partnerMonthlyCents > 0 ? `, ${dollars(b.partnerMonthlyCents)}/month from the partner` : ""}`,
    `  bills, year 1: ${dollars(y.withoutSolarCents)} without solar, ${dollars(y.solarOnlyCents)} with solar alone, ${dollars(y.solarAndBatteryCents)} with the battery; solar saves ${dollars(y.solarSavingsCents)}, the battery ${dollars(y.batterySavingsCents)} more (${dollars(b.lifetimeBatterySavingsCents)} over the table)`,
    `  self-consumption ${pct(b.solarOnly.selfConsumptionPct)} → ${pct(b.withBattery.selfConsumptionPct)}; self-sufficiency ${pct(b.solarOnly.selfSufficiencyPct)} → ${pct(b.withBattery.selfSufficiencyPct)}; ${b.withBattery.equivalentFullCycles.toFixed(0)} full cycles a year`,
    ...(b.backup?.days ?? []).map((d) =>
      d.problem ? `  backup (${d.season}): cannot carry the loads: ${d.problem}` : `  backup (${d.season}, ${d.loadWatts} W): ${hours(d.withoutSunHours, b.backup?.spanHours ?? 0)} without sun, ${hours(d.withSunHours, b.backup?.spanHours ?? 0)} with a typical day's sun (month ${d.month})`,
    ),
    ...b.notes.map((n) => `  ${n}`),
    ...(b.backup?.notes ?? []).map((n) => `  ${n}`),
  ];
}

function printText(q: QuoteResult): void {
  const s = q.summary;
  const lines = [
    `${q.name} — offer of ${q.asOf}`,
    `Usage: ${q.usage.annualKwh} kWh/yr (${q.usage.source})`,
    `Design: ${q.design.modules} modules, ${q.design.kwDc.toFixed(2)} kW DC / ${q.design.kwAc.toFixed(2)} kW AC` +
      (q.design.dcAcRatio !== null ? `, DC/AC ${q.design.dcAcRatio}` : ""),
    ...q.design.faces.map((f) => `  ${f.name}: ${f.modules} modules${f.specificYieldKwhPerKw !== null ? `, ${f.specificYieldKwhPerKw} kWh/kW` : ""}`),
    `Production: ${s.annualProductionKwh} kWh/yr, offset ${s.offsetPct} %  (weather: ${q.production.weather ?? "n/a"})`,
    `Bills, year 1: ${dollars(q.bills.year1WithoutSolarCents)} without solar, ${dollars(q.bills.year1WithSolarCents)} with; savings ${dollars(s.year1SavingsCents)}`,
    q.thirdParty
      ? `System price: ${dollars(s.grossPriceCents)}, paid by its owner; the homeowner's incentives ${dollars(s.incentivesCents)}`
      : `Price: ${dollars(s.grossPriceCents)} gross, incentives ${dollars(s.incentivesCents)}, net ${dollars(s.netPriceCents)}`,
    ...q.incentives.applied.map((i) => `  + ${i.name}: ${dollars(i.amountCents)} (${i.year === 0 ? "upfront" : `year ${i.year}`}; ${i.detail})`),
    ...q.incentives.skipped.map((i) => `  – ${i.name}: not applied (${i.reason})`),
    ...(q.thirdParty ? thirdPartyLines(q.thirdParty) : [s.monthlyLoanPaymentCents !== null ? `Loan payment: ${dollars(s.monthlyLoanPaymentCents)}/month` : "Payment: cash"]),
    `Payback ${s.paybackYears ?? "none"} yr · ROI ${s.simpleRoi === null ? "n/a" : `${(s.simpleRoi * 100).toFixed(1)} %`} · NPV ${dollars(s.npvCents)} · IRR ${s.irr === null ? "n/a" : `${(s.irr * 100).toFixed(2)} %`} · LCOE ${s.lcoeCentsPerKwh ?? "n/a"} ¢/kWh`,
    ...(q.battery ? batteryLines(q.battery) : []),
    "",
    "year  production kWh  bill w/o solar  bill w/ solar   savings   payments   cash flow  cumulative",
    ...q.cashflow.rows.map(
      (r) =>
        `${String(r.year).padStart(4)}  ${r.productionKwh.toFixed(0).padStart(14)}  ${dollars(r.billWithoutSolarCents).padStart(14)}  ${dollars(r.billWithSolarCents).padStart(13)}  ${dollars(r.savingsCents).padStart(8)}  ${dollars(r.systemPaymentCents).padStart(9)}  ${dollars(r.cashFlowCents).padStart(10)}  ${dollars(r.cumulativeCents).padStart(10)}`,
    ),
  ];
  if (q.stringCheck) {
    lines.push("", `String check: ${q.stringCheck.status}`, ...q.stringCheck.checks.map((c) => `  [${c.status}] ${c.rule}: ${c.detail}`));
  }
  if (q.notes.length + q.usage.notes.length > 0) lines.push("", "Notes:", ...[...q.usage.notes, ...q.notes].map((n) => `  - ${n}`));
  lines.push("", q.caution);
  console.log(lines.join("\n"));
}

function main(): void {
  const args = process.argv.slice(2);
  const at = args.indexOf("--case");
  if (at === -1 || !args[at + 1]) usage("Missing --case FILE.json");
  const casePath = resolve(args[at + 1]);
  const json = args.includes("--json");
  let caseInput: QuoteCaseInput;
  try {
    caseInput = JSON.parse(readText(casePath, "case file")) as QuoteCaseInput;
  } catch (e) {
    console.error(`The case file is not valid JSON: ${(e as Error).message}`);
    process.exit(1);
  }
  const base = dirname(casePath);
  const weatherRef = (caseInput as { weather?: { file?: unknown } }).weather?.file;
  if (typeof weatherRef !== "string") usage("The case has no weather.file");
  const weatherPath = resolve(base, weatherRef);
  const usageRef = (caseInput as { usage?: { kind?: unknown; file?: unknown } }).usage;
  try {
    // The sun is placed at the case's own site; the file's station supplies the weather (and
    // its clock: its UTC offset stays). A station far from the site is said in the notes.
    const weatherText = readText(weatherPath, "weather file");
    const caseSite = (caseInput as { site?: { latitude?: unknown; longitude?: unknown } }).site;
    const siteOverride = typeof caseSite?.latitude === "number" && typeof caseSite.longitude === "number" ? { latitude: caseSite.latitude, longitude: caseSite.longitude } : undefined;
    const weather = parseWeather(weatherText, { site: siteOverride });
    const distanceKm = siteOverride && weather.station ? haversineKm(weather.station, siteOverride) : 0;
    const intervalText = usageRef?.kind === "interval" && typeof usageRef.file === "string" ? readText(resolve(base, usageRef.file), "interval file") : undefined;
    const quote = buildQuote(caseInput, {
      weather,
      produce,
      hourlyTempC: weather.tempAirC,
      intervalText,
      weatherLabel: `${weather.sourceLabel} (${weatherRef})`,
      weatherUtcOffsetHours: weather.site.utcOffsetHours,
      weatherNotes: [
        ...weather.notes.filter((n) => n.startsWith("The sunshine in this file")),
        ...(distanceKm > STATION_DISTANCE_NOTE_KM
          ? [`The weather station is ${Math.round(distanceKm)} km from the site (more than ${STATION_DISTANCE_NOTE_KM} km): its climate may differ from the site's.`]
          : []),
      ],
    });
    if (json) console.log(JSON.stringify(quote, null, 2));
    else printText(quote);
  } catch (e) {
    if (e instanceof EngineInputError) {
      console.error(e.message.split(" — ")[0]);
      for (const issue of e.issues) console.error(`  ${issue.path || "(case)"}: ${issue.message}`);
      process.exit(1);
    }
    throw e;
  }
}

main();
