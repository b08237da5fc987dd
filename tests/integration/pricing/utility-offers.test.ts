// Offers use the household's utility: its plans without question, another utility's plan only
// with a reason the Timeline keeps, and only its own rebates (plus those for every utility).
import { and, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { timelineEvent } from "@/db/schema";
import { db } from "@/server/db";
import { openDeal } from "@/server/deal-scope";
import { updateDealUtility } from "@/server/deals";
import { createOffer, listOffers, updateOffer } from "@/server/offers";
import { getPriceBook, savePriceBook } from "@/server/price-book";
import { createRatePlan, getRatePlanOrThrow } from "@/server/rate-plans";
import { newUtility } from "../support/fixtures";
import { newDeal, newWorld, rejection, type TestDeal, type World } from "../proposals/support";

let w: World;
let d: TestDeal;
let otherPlanId: string;
let otherUtility: string;

const rebate = (id: string, utilityId: string | null, amountCents: number) => ({
  id,
  name: id,
  source: "utility" as const,
  utilityId,
  amount: { kind: "fixed" as const, amountCents },
  startDate: "2020-01-01",
  endDate: "2040-12-31",
  timing: "upfront" as const,
  eligibility: {},
});

beforeAll(async () => {
  w = await newWorld("Utility Offers Solar");
  d = await newDeal(w);
  otherUtility = await newUtility(w.owner, "Across The River Power");
  otherPlanId = (
    await createRatePlan(w.owner, {
      utilityId: otherUtility,
      active: true,
      plan: { name: "River flat", fixedMonthlyCents: 800, energy: { kind: "flat", centsPerKwh: 9 }, compensation: { kind: "net-metering" } },
    })
  ).id;
  const book = await getPriceBook(w.owner.companyId);
  // The deal's utility: "Test Electric", named by the plan its lead was made with.
  const testElectric = (await getRatePlanOrThrow(w.owner.companyId, w.ratePlanId)).utilityId;
  await savePriceBook(w.owner, {
    ...book,
    incentives: [...book.incentives, rebate("own-utility-rebate", testElectric, 40_000), rebate("other-utility-rebate", otherUtility, 70_000), rebate("any-utility-rebate", null, 10_000)],
  });
});

describe("offers and the household's utility", () => {
  it("applies only the household's utility's rebates and those for every utility", async () => {
    const offer = await updateOffer(w.rep, d.cashOfferId, { inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });
    const applied = offer.results.incentives.applied.map((a) => a.id);
    expect(applied).toContain("own-utility-rebate");
    expect(applied).toContain("any-utility-rebate");
    expect(applied).not.toContain("other-utility-rebate");
    expect(offer.basis?.priceBook.document.incentives.map((r) => r.id)).not.toContain("other-utility-rebate");
  });

  it("refuses another utility's plan without a reason, naming both utilities, and writes nothing", async () => {
    const refused = await rejection(createOffer(w.rep, { dealId: d.dealId, inputs: { name: "River plan", ratePlanId: otherPlanId } }), 422);
    expect(refused.fields?.["inputs.ratePlanOverrideReason"]?.[0]).toBe(
      '"River flat" is a plan of Across The River Power, not of Test Electric: pick one of Test Electric\'s plans, or say why this one applies',
    );
    const events = await db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, d.dealId), eq(timelineEvent.kind, "offer.foreign_rate_plan")));
    expect(events).toEqual([]);
  });

  it("takes another utility's plan with a reason, and the Timeline names plan, utilities and reason", async () => {
    const reason = "Moving to the river side in March; the new meter is on that utility";
    const offer = await createOffer(w.rep, { dealId: d.dealId, inputs: { name: "River plan", ratePlanId: otherPlanId, ratePlanOverrideReason: reason } });
    expect(offer.basis?.ratePlan.id).toBe(otherPlanId);
    const [event] = await db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, d.dealId), eq(timelineEvent.kind, "offer.foreign_rate_plan")));
    expect(event.summary).toBe(`Rhea Rep priced "River plan" with Across The River Power's plan "River flat", not Test Electric's: ${reason}`);
    expect(event.data).toEqual({ offerId: offer.id });
  });

  it("a change of the household's utility makes every offer stale, also one priced with its own plan (its rebates were the old utility's)", async () => {
    const before = await listOffers(await openDeal(w.rep, d.dealId));
    const river = before.find((o) => o.name === "River plan")!;
    expect(river.stale).toEqual([]);
    await updateDealUtility(await openDeal(w.rep, d.dealId), { utilityId: otherUtility, ratePlanId: otherPlanId });
    const after = await listOffers(await openDeal(w.rep, d.dealId));
    expect(after.find((o) => o.name === "River plan")!.stale).toEqual(["utility"]);
    expect(after.find((o) => o.id === d.cashOfferId)!.stale).toEqual(["rate_plan", "utility"]);
  });
});
