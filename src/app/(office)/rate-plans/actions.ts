"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { ratePlanRecordSchema } from "@/lib/schemas/rate-plan";
import { memberAction } from "@/server/action";
import { createRatePlan, updateRatePlan } from "@/server/rate-plans";

export const createRatePlanAction = memberAction("rates:manage", ratePlanRecordSchema, async (record, member) => {
  const created = await createRatePlan(member, record);
  revalidatePath("/rate-plans");
  return { id: created.id };
});

export const updateRatePlanAction = memberAction(
  "rates:manage",
  z.object({ id: z.uuid(), record: ratePlanRecordSchema }),
  async ({ id, record }, member) => {
    const updated = await updateRatePlan(member, id, record);
    revalidatePath("/rate-plans");
    revalidatePath(`/rate-plans/${id}`);
    return { id: updated.id, updatedAt: updated.updatedAt.toISOString() };
  },
);
