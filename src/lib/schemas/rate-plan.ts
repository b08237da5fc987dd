// A saved utility rate plan: the engine's rate plan input (src/engine/rates.ts, reused as is)
// plus the utility it belongs to and whether reps may still pick it. Shared by the editor and the server.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import { ratePlanSchema } from "@/engine/rates";

export const ratePlanRecordSchema = z.object({
  utilityId: z.uuid("Pick the plan's utility from the list"),
  active: z.boolean().default(true),
  plan: ratePlanSchema.safeExtend({ name: plainText().trim().min(1, "is required").max(200) }),
});
export type RatePlanRecordInput = z.input<typeof ratePlanRecordSchema>;
export type RatePlanRecord = z.output<typeof ratePlanRecordSchema>;

/** The sample household the editor bills to sanity-check a plan: 900 kWh every month. */
export const PREVIEW_MONTHLY_KWH = 900;
