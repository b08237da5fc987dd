// Demo price book, utilities and rate plans of Tallgrass Bright Energy. The utilities, their
// plans and the incentives are invented; the figures are of a realistic U.S. size. Validated by the same
// schemas the app uses, so a bad edit here fails the seed instead of the page.
import { priceBook, ratePlan, utility } from "../../../src/db/schema";
import { priceBookSchema, type PriceBookInput } from "../../../src/lib/schemas/price-book";
import { ratePlanRecordSchema, type RatePlanRecordInput } from "../../../src/lib/schemas/rate-plan";
import type { SeedContext } from "../seed-demo";

export const order = 20;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;
export const DEMO_PRICE_BOOK_ID = uid(2001);
export const DEMO_RATE_PLAN_IDS = { residential: uid(2011), timeOfUse: uid(2012), cedarFork: uid(2013) } as const;
/** The demo deals' utility, and a second one whose plan and rebate they must not get. */
export const DEMO_UTILITY_IDS = { piedmont: uid(2021), cedarFork: uid(2022) } as const;

/** Written by seed-demo.ts before the deals, which name the utility. */
export const DEMO_UTILITIES = [
  { id: DEMO_UTILITY_IDS.piedmont, name: "Piedmont Electric Cooperative", timeZone: "America/New_York", territoryNotes: "Guilford, Forsyth and Rockingham counties outside the city limits." },
  { id: DEMO_UTILITY_IDS.cedarFork, name: "Cedar Fork Municipal Power", timeZone: "America/New_York", territoryNotes: "Inside the town limits of Cedar Fork only." },
];

const PRICE_BOOK: PriceBookInput = {
  version: 1,
  bands: [
    { minWatts: 0, maxWatts: 6_000, centsPerWattDc: 310 },
    { minWatts: 6_000, maxWatts: 10_000, centsPerWattDc: 285 },
    { minWatts: 10_000, maxWatts: null, centsPerWattDc: 265 },
  ],
  adders: [
    { id: "tile-roof", name: "Tile roof", kind: "per_watt", centsPerWattDc: 30 },
    { id: "steep-roof", name: "Steep roof (over 8/12 pitch)", kind: "per_watt", centsPerWattDc: 12 },
    { id: "optimizers", name: "Module-level optimizers", kind: "per_module", centsPerModule: 5_500 },
    { id: "main-panel-upgrade", name: "Main panel upgrade (200 A)", kind: "fixed", amountCents: 240_000 },
    { id: "trenching", name: "Trenching, ground run up to 50 ft", kind: "fixed", amountCents: 180_000 },
  ],
  lineItems: [
    { id: "critter-guard", name: "Critter guard", amountCents: 65_000 },
    { id: "surge-protection", name: "Whole-home surge protection", amountCents: 18_000 },
  ],
  discountLimits: {
    sales_rep: { maxCents: 100_000, maxPct: 3 },
    office_manager: { maxCents: 300_000, maxPct: 8 },
  },
  incentives: [
    {
      id: "piedmont-coop-rebate",
      name: "Piedmont Cooperative solar rebate",
      source: "utility",
      utilityId: DEMO_UTILITY_IDS.piedmont,
      amount: { kind: "per-watt", centsPerWattDc: 20, capCents: 150_000 },
      startDate: "2026-01-01",
      endDate: "2027-12-31",
      timing: "upfront",
      eligibility: {},
    },
    {
      // Dated data, not a rule in code: 30 % for systems installed by the end of 2025 (the
      // residential credit of 26 U.S.C. §25D ended for expenditures after 2025, from memory).
      // It counts at installation, so an offer made in 2025 for a 2026 install gets none.
      id: "federal-25d",
      name: "Federal residential clean energy credit (§25D)",
      source: "federal",
      amount: { kind: "percent", pct: 30, basis: "gross-price" },
      startDate: "2022-01-01",
      endDate: "2025-12-31",
      timing: { year: 1 },
      countsOn: "installation",
      eligibility: {},
    },
    {
      // Already ended: it shows in the price book but never in an offer.
      id: "piedmont-coop-early-bonus",
      name: "Piedmont Cooperative early-adopter bonus",
      source: "utility",
      utilityId: DEMO_UTILITY_IDS.piedmont,
      amount: { kind: "fixed", amountCents: 25_000 },
      startDate: "2025-01-01",
      endDate: "2025-12-31",
      timing: "upfront",
      eligibility: {},
    },
  ],
  deposit: { kind: "percent", pct: 10, minCents: 50_000, maxCents: 250_000 },
  // The demo catalog's batteries (scripts/lib/seed/battery-catalog.ts) at invented installed prices.
  batteries: [
    { id: "stillwater-13-5", name: "Stillwater SW-13.5AC, installed", batteryModelId: "7a11a55e-0000-4000-8000-000000001021", amountCents: 1_150_000 },
    { id: "kettle-creek-10", name: "Kettle Creek KC-10DC, installed", batteryModelId: "7a11a55e-0000-4000-8000-000000001022", amountCents: 1_020_000 },
  ],
  // Invented partners' rate sheets (terms and prices are examples, not any real partner's).
  rateSheets: [
    {
      id: "example-lease-nc-2026",
      effectiveDate: "2026-01-01",
      states: ["NC"],
      terms: { kind: "lease", partner: "Example Solar Partner", payment: { basis: "per-watt", monthlyCentsPerWatt: 0.99 }, escalatorPctPerYear: 1.9, termYears: 25, productionGuaranteePct: 90, endOfTerm: "Renew for 5 years, buy at fair market value, or removal at no cost." },
    },
    {
      id: "example-ppa-nc-2026",
      effectiveDate: "2026-01-01",
      states: ["NC"],
      terms: { kind: "ppa", partner: "Example Solar Partner", centsPerKwh: 10.4, escalatorPctPerYear: 2.9, termYears: 25, productionGuaranteePct: 90, endOfTerm: "Buyout at fair market value from year 6; renewal or removal at the end." },
    },
  ],
};

const RATE_PLANS: { id: string; record: RatePlanRecordInput }[] = [
  {
    id: DEMO_RATE_PLAN_IDS.residential,
    record: {
      utilityId: DEMO_UTILITY_IDS.piedmont,
      active: true,
      plan: {
        name: "Residential Service RS-1",
        fixedMonthlyCents: 1_400,
        minimumBillCents: 2_000,
        energy: {
          kind: "tiered",
          tiers: [
            { upToKwh: 800, centsPerKwh: 12.6 },
            { upToKwh: null, centsPerKwh: 14.4 },
          ],
        },
        compensation: { kind: "net-metering", trueUpMonth: 5, surplusCentsPerKwh: 3.2 },
      },
    },
  },
  {
    id: DEMO_RATE_PLAN_IDS.timeOfUse,
    record: {
      utilityId: DEMO_UTILITY_IDS.piedmont,
      active: true,
      plan: {
        name: "Residential Time-of-Use RT-2",
        fixedMonthlyCents: 1_450,
        minimumBillCents: 0,
        energy: {
          kind: "tou",
          periods: [
            { id: "on-peak", label: "On-peak", centsPerKwh: 17.8 },
            { id: "off-peak", label: "Off-peak", centsPerKwh: 11.3 },
          ],
          seasons: [
            { name: "Summer", months: [6, 7, 8, 9], otherHoursPeriodId: "off-peak", weekday: [{ startHour: 14, endHour: 19, periodId: "on-peak" }], weekend: [] },
            {
              name: "Winter",
              months: [1, 2, 3, 4, 5, 10, 11, 12],
              otherHoursPeriodId: "off-peak",
              weekday: [
                { startHour: 6, endHour: 9, periodId: "on-peak" },
                { startHour: 17, endHour: 20, periodId: "on-peak" },
              ],
              weekend: [],
            },
          ],
        },
        compensation: { kind: "net-billing", exportCentsPerKwh: 6.1, trueUpMonth: 12 },
      },
    },
  },
  {
    id: DEMO_RATE_PLAN_IDS.cedarFork,
    record: {
      utilityId: DEMO_UTILITY_IDS.cedarFork,
      active: true,
      plan: {
        name: "Town Residential R",
        fixedMonthlyCents: 1_000,
        minimumBillCents: 0,
        energy: { kind: "flat", centsPerKwh: 11.9 },
        compensation: { kind: "net-billing", exportCentsPerKwh: 4.5, trueUpMonth: 12 },
      },
    },
  },
];

export async function seed(ctx: SeedContext): Promise<void> {
  const owner = ctx.people.find((p) => p.role === "owner");
  await ctx.tx.insert(priceBook).values({
    id: DEMO_PRICE_BOOK_ID,
    companyId: ctx.companyId,
    document: priceBookSchema.parse(PRICE_BOOK),
    updatedByUserId: owner?.id ?? null,
  });
  for (const { id, record } of RATE_PLANS) {
    const r = ratePlanRecordSchema.parse(record);
    await ctx.tx.insert(ratePlan).values({ id, companyId: ctx.companyId, name: r.plan.name, utilityId: r.utilityId, plan: r.plan, active: r.active });
  }
}
