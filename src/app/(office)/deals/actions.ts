"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { householdSchema, leadSchema } from "@/lib/schemas/deal";
import { dealUtilitySchema } from "@/lib/schemas/deal-settings";
import { memberAction } from "@/server/action";
import { openDeal } from "@/server/deal-scope";
import { createLead, updateDealUtility, updateHousehold } from "@/server/deals";

export const createLeadAction = memberAction("deals:write", leadSchema, async (input, member) => {
  const created = await createLead(member, input);
  revalidatePath("/deals");
  return created;
});

export const updateHouseholdAction = memberAction(
  "deals:write",
  z.object({ dealId: z.uuid(), household: householdSchema }),
  async ({ dealId, household }, member) => {
    await updateHousehold(await openDeal(member, dealId), household);
    revalidatePath(`/deals/${dealId}`);
    return { dealId };
  },
);

export const updateDealUtilityAction = memberAction(
  "deals:write",
  z.object({ dealId: z.uuid(), utility: dealUtilitySchema }),
  async ({ dealId, utility }, member) => {
    await updateDealUtility(await openDeal(member, dealId), utility);
    revalidatePath(`/deals/${dealId}`);
    return { dealId };
  },
);
