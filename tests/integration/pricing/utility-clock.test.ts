// A rate plan's time-of-use hours are its utility's wall clock; the hourly rows are the site's
// standard time. A new utility starts on the company's zone. A utility's new zone makes the
// offers priced with its plans stale.
import { beforeAll, describe, expect, it } from "vitest";
import { makeBillCalculator, type RatePlanInput } from "@/engine/rates";
import { getCompanySettings, updateCompanySettings } from "@/server/company-settings";
import { openDeal } from "@/server/deal-scope";
import { updateDealUtility } from "@/server/deals";
import { getDealUsage } from "@/server/energy";
import { listOffers, updateOffer } from "@/server/offers";
import { createRatePlan } from "@/server/rate-plans";
import { createUtility, updateUtility, utilityClockNote } from "@/server/utilities";
import { newDeal, newWorld, type TestDeal, type World } from "../proposals/support";

const evening: RatePlanInput = {
  name: "Weekday evening peak",
  fixedMonthlyCents: 0,
  energy: {
    kind: "tou",
    periods: [
      { id: "off", centsPerKwh: 10 },
      { id: "peak", centsPerKwh: 40 },
    ],
    seasons: [{ name: "all", months: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12], otherHoursPeriodId: "off", weekday: [{ startHour: 16, endHour: 21, periodId: "peak" }] }],
  },
  compensation: { kind: "no-export" },
};

let w: World;
let d: TestDeal;
let utilityId: string;

beforeAll(async () => {
  w = await newWorld("Utility Clock Solar");
  d = await newDeal(w);
  // The test site is Greensboro, NC (America/New_York); its utility here bills on Central time.
  utilityId = (await createUtility(w.owner, { name: "Line Valley Power", timeZone: "America/Chicago", territoryNotes: null })).id;
  const plan = await createRatePlan(w.owner, { utilityId, active: true, plan: evening });
  await updateDealUtility(await openDeal(w.owner, d.dealId), { utilityId, ratePlanId: plan.id });
});

describe("the utility's clock", () => {
  it("a new utility without a time zone takes the company's", async () => {
    const settings = await getCompanySettings(w.owner.companyId);
    await updateCompanySettings(w.owner, { name: settings.name, licenseNumber: settings.licenseNumber, timeZone: "America/Denver", stallDays: settings.stallDays, finance: settings.finance });
    expect((await createUtility(w.owner, { name: "Front Range Electric", territoryNotes: null })).timeZone).toBe("America/Denver");
  });

  it("prices time-of-use hours on the utility's clock, not the site's, and says so on the Offers tab", async () => {
    const offer = await updateOffer(w.rep, d.cashOfferId, { inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });
    const usage = await getDealUsage(await openDeal(w.rep, d.dealId));
    const clock = { calendarYear: offer.results.assumptions.calendarYear };
    // The rows are Eastern standard time; the 16–21 window on Central clock hours is rows 17–21
    // EST in winter (CST = EST − 1 h) and 16–20 in summer (CDT = EST), where the site's own clock
    // gives rows 16–20 and 15–19 (tou-clock.test.ts works such a pair through by hand).
    const onUtilityClock = makeBillCalculator(evening, { ...clock, timeZone: "America/Chicago", rowsTimeZone: "America/New_York" })(usage.hourlyKwh!, null);
    const onSiteClock = makeBillCalculator(evening, { ...clock, timeZone: "America/New_York" })(usage.hourlyKwh!, null);
    expect(onUtilityClock.totalCents).not.toBe(onSiteClock.totalCents);
    expect(offer.results.monthly.billWithoutSolarCents).toEqual(onUtilityClock.months.map((m) => m.totalCents));
    expect(await utilityClockNote(await openDeal(w.rep, d.dealId))).toBe(
      'Time-of-use hours are read on Line Valley Power\'s clock, Central time (America/Chicago), not the house\'s, Eastern time (America/New_York): a plan\'s "4–9 pm" is Line Valley Power\'s 4–9 pm.',
    );
  });

  it("a new time zone for the utility makes its plans' offers stale; on the site's zone the note goes", async () => {
    expect((await listOffers(await openDeal(w.rep, d.dealId))).find((o) => o.id === d.cashOfferId)!.stale).toEqual([]);
    await updateUtility(w.owner, utilityId, { name: "Line Valley Power", timeZone: "America/New_York", territoryNotes: null });
    expect((await listOffers(await openDeal(w.rep, d.dealId))).find((o) => o.id === d.cashOfferId)!.stale).toEqual(["rate_plan"]);
    expect(await utilityClockNote(await openDeal(w.rep, d.dealId))).toBeNull();
  });
});
