// A utility can be deleted only when nothing uses it; otherwise the refusal names what does.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { ratePlan, utility } from "@/db/schema";
import { db } from "@/server/db";
import { openDeal } from "@/server/deal-scope";
import { updateDealUtility } from "@/server/deals";
import { getPriceBook, savePriceBook } from "@/server/price-book";
import { createRatePlan } from "@/server/rate-plans";
import { deleteUtility, listUtilities } from "@/server/utilities";
import { newUtility } from "../support/fixtures";
import { newDeal, newWorld, rejection, type World } from "../proposals/support";

let w: World;
let other: World;

const plan = (name: string) => ({ name, fixedMonthlyCents: 800, energy: { kind: "flat" as const, centsPerKwh: 9 }, compensation: { kind: "net-metering" as const } });
const stillThere = async (id: string) => (await db().select({ id: utility.id }).from(utility).where(eq(utility.id, id))).length === 1;

beforeAll(async () => {
  w = await newWorld("Utility Delete Solar");
  other = await newWorld("Utility Delete Other Solar");
});

describe("deleting a utility", () => {
  it("deletes one nothing uses, for an owner", async () => {
    const id = await newUtility(w.owner, "Typo Power Co");
    await expect(deleteUtility(w.owner, id)).resolves.toEqual({ id });
    expect((await listUtilities(w.owner.companyId)).map((u) => u.id)).not.toContain(id);
  });

  it("refuses a sales rep (403) and another company (404), and keeps the utility", async () => {
    const id = await newUtility(w.owner, "Kept Power Co");
    expect((await rejection(deleteUtility(w.rep, id), 403)).code).toBe("forbidden");
    expect((await rejection(deleteUtility(other.owner, id), 404)).code).toBe("not_found");
    expect(await stillThere(id)).toBe(true);
  });

  it("refuses (409) one a household, two rate plans and an incentive use, naming them, and deletes nothing", async () => {
    const id = await newUtility(w.owner, "Busy Valley Power");
    const plans = [await createRatePlan(w.owner, { utilityId: id, active: true, plan: plan("Valley flat") }), await createRatePlan(w.owner, { utilityId: id, active: false, plan: plan("Valley old") })];
    const d = await newDeal(w);
    await updateDealUtility(await openDeal(w.owner, d.dealId), { utilityId: id, ratePlanId: plans[0].id });
    const book = await getPriceBook(w.owner.companyId);
    await savePriceBook(w.owner, {
      ...book,
      incentives: [
        ...book.incentives,
        { id: "valley-rebate", name: "Valley rebate", source: "utility", utilityId: id, amount: { kind: "fixed", amountCents: 10_000 }, startDate: "2020-01-01", endDate: "2040-12-31", timing: "upfront", eligibility: {} },
      ],
    });
    const refused = await rejection(deleteUtility(w.owner, id), 409);
    expect(refused.code).toBe("utility_in_use");
    expect(refused.message).toBe("Busy Valley Power is used by 1 household, 2 rate plans and 1 price book incentive, so it cannot be deleted. Give them another utility first.");
    expect(await stillThere(id)).toBe(true);
    expect(await db().select({ id: ratePlan.id }).from(ratePlan).where(eq(ratePlan.utilityId, id))).toHaveLength(2);
  });

  it("refuses one only a price book incentive names", async () => {
    const id = await newUtility(w.owner, "Rebate Only Power");
    const book = await getPriceBook(w.owner.companyId);
    await savePriceBook(w.owner, {
      ...book,
      incentives: [...book.incentives, { id: "rebate-only", name: "Rebate only", source: "utility", utilityId: id, amount: { kind: "fixed", amountCents: 5_000 }, startDate: "2020-01-01", endDate: "2040-12-31", timing: "upfront", eligibility: {} }],
    });
    expect((await rejection(deleteUtility(w.owner, id), 409)).message).toBe("Rebate Only Power is used by 1 price book incentive, so it cannot be deleted. Give it another utility first.");
  });
});
