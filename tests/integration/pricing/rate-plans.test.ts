import { describe, expect, it } from "vitest";
import { makeBillCalculator } from "@/engine/rates";
import type { RatePlanRecordInput } from "@/lib/schemas/rate-plan";
import { HttpError } from "@/server/errors";
import type { Member } from "@/server/session";
import { createRatePlan, getRatePlanOrThrow, listRatePlans, updateRatePlan } from "@/server/rate-plans";
import { addMember, newCompany, newUtility } from "../support/fixtures";

/** A plan body of the company's "Riverside Municipal Power" (made once per company). */
const utilities = new Map<string, string>();
async function of(owner: Member, body: PlanBody): Promise<RatePlanRecordInput> {
  let id = utilities.get(owner.companyId);
  if (!id) utilities.set(owner.companyId, (id = await newUtility(owner, "Riverside Municipal Power")));
  return { ...body, utilityId: id };
}

type PlanBody = Omit<RatePlanRecordInput, "utilityId">;

const flat: PlanBody = {
  plan: { name: "Home Flat R-1", fixedMonthlyCents: 1_400, energy: { kind: "flat", centsPerKwh: 13.5 }, compensation: { kind: "net-metering", surplusCentsPerKwh: 3 } },
};

const tou: PlanBody = {
  plan: {
    name: "Home TOU R-4",
    fixedMonthlyCents: 1_500,
    minimumBillCents: 2_000,
    energy: {
      kind: "tou",
      periods: [
        { id: "peak", label: "Peak", centsPerKwh: 18 },
        { id: "base", label: "Base", centsPerKwh: 11 },
      ],
      seasons: [{ name: "All year", months: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12], otherHoursPeriodId: "base", weekday: [{ startHour: 16, endHour: 21, periodId: "peak" }] }],
    },
    compensation: { kind: "net-billing", exportCentsPerKwh: 5.5 },
  },
};

async function failure(promise: Promise<unknown>): Promise<HttpError> {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HttpError);
  return err as HttpError;
}

describe("rate plans", () => {
  it("creates, lists, reads, updates and retires plans; the stored plan bills in the engine", async () => {
    const owner = await newCompany("Rates Solar");
    const a = await createRatePlan(owner, await of(owner, flat));
    const b = await createRatePlan(owner, await of(owner, tou));
    expect(a).toMatchObject({ name: "Home Flat R-1", utilityName: "Riverside Municipal Power", active: true });
    // Defaults of the engine's schema are filled in on save.
    expect(a.plan.minimumBillCents).toBe(0);
    expect(a.plan.compensation).toEqual({ kind: "net-metering", trueUpMonth: 12, surplusCentsPerKwh: 3 });
    expect((await listRatePlans(owner.companyId)).map((p) => p.name)).toEqual(["Home Flat R-1", "Home TOU R-4"]);

    const read = await getRatePlanOrThrow(owner.companyId, b.id);
    const bill = makeBillCalculator(read.plan)(new Array(8760).fill(900 / 730), null);
    expect(bill.months).toHaveLength(12);
    expect(bill.totalCents).toBeGreaterThan(12 * 1_500);

    const changed = await updateRatePlan(owner, a.id, { ...(await of(owner, flat)), active: false, plan: { ...flat.plan, name: "Home Flat R-1 (2025)" } });
    expect(changed).toMatchObject({ name: "Home Flat R-1 (2025)", active: false });
    // Active plans first.
    expect((await listRatePlans(owner.companyId)).map((p) => p.id)).toEqual([b.id, a.id]);
  });

  it("rejects a bad plan naming the field and writes nothing", async () => {
    const owner = await newCompany("Bad Rates Solar");
    const a = await createRatePlan(owner, await of(owner, flat));
    const badTiers: RatePlanRecordInput = {
      ...(await of(owner, flat)),
      plan: { ...flat.plan, energy: { kind: "tiered", tiers: [{ upToKwh: 500, centsPerKwh: 12 }, { upToKwh: 400, centsPerKwh: 14 }, { upToKwh: null, centsPerKwh: 15 }] } },
    };
    const err = await failure(updateRatePlan(owner, a.id, badTiers));
    expect(err.status).toBe(422);
    expect(err.fields).toEqual({ "plan.energy.tiers.1.upToKwh": ["tier limits must increase"] });
    expect((await getRatePlanOrThrow(owner.companyId, a.id)).plan.energy.kind).toBe("flat");

    const badTou = { ...(await of(owner, tou)), plan: { ...tou.plan, energy: { ...(tou.plan.energy as object), seasons: [{ name: "Summer", months: [6, 7, 8], otherHoursPeriodId: "base" }] } } };
    const touErr = await failure(createRatePlan(owner, badTou));
    expect(touErr.fields?.["plan.energy.seasons"]?.[0]).toBe("month 1 is in no season");
    expect(await listRatePlans(owner.companyId)).toHaveLength(1);
  });

  it("another company's plan is not found, for reading and for writing; reps cannot write", async () => {
    const owner = await newCompany("Tenant A Solar");
    const plan = await createRatePlan(owner, await of(owner, flat));
    const other = await newCompany("Tenant B Solar");
    expect((await failure(getRatePlanOrThrow(other.companyId, plan.id))).status).toBe(404);
    expect((await failure(updateRatePlan(other, plan.id, await of(other, tou)))).status).toBe(404);
    // A plan belongs to one of its own company's utilities: another company's is refused by field.
    const foreign = await failure(createRatePlan(other, await of(owner, tou)));
    expect([foreign.status, foreign.fields]).toEqual([422, { utilityId: ["Pick the utility from the list"] }]);
    expect((await getRatePlanOrThrow(owner.companyId, plan.id)).name).toBe("Home Flat R-1");
    expect(await listRatePlans(other.companyId)).toEqual([]);

    const rep = await addMember(owner, "sales_rep");
    expect((await failure(createRatePlan(rep, await of(owner, flat)))).status).toBe(403);
    expect((await failure(updateRatePlan(rep, plan.id, await of(owner, tou)))).status).toBe(403);
    expect((await listRatePlans(rep.companyId)).length).toBe(1);
  });
});
