// The deal's utility and rate plan, changed from the Household tab: the plan must be one of
// that utility's (src/server/deals.ts).
import { z } from "zod";
import { optionalIdField } from "@/lib/schemas/utility";

export const dealUtilitySchema = z.object({
  utilityId: optionalIdField("Pick the utility from the list"),
  ratePlanId: optionalIdField("Pick a rate plan from the list"),
});
