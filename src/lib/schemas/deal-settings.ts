// The deal's utility and rate plan, changed from the Household tab.
import { z } from "zod";

export const dealUtilitySchema = z.object({
  utilityName: z
    .string()
    .trim()
    .max(200, "Keep it under 200 characters")
    .transform((v) => (v === "" ? null : v)),
  ratePlanId: z
    .string()
    .transform((v) => (v === "" ? null : v))
    .pipe(z.uuid("Pick a rate plan from the list").nullable()),
});
