"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { householdSchema, leadSchema } from "@/lib/schemas/deal";
import { memberAction } from "@/server/action";
import { createLead, updateHousehold } from "@/server/deals";

export const createLeadAction = memberAction("deals:write", leadSchema, async (input, member) => {
  const created = await createLead(member, input);
  revalidatePath("/deals");
  return created;
});

export const updateHouseholdAction = memberAction(
  "deals:write",
  z.object({ dealId: z.uuid(), household: householdSchema }),
  async ({ dealId, household }, member) => {
    await updateHousehold(member, dealId, household);
    revalidatePath(`/deals/${dealId}`);
    return { dealId };
  },
);
