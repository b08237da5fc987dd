// A utility the company's customers buy power from (Utilities screen), and the deal's choice of
// utility and plan (Household tab). Shared by the forms and the server.
import { z } from "zod";
import { COMPANY_TIME_ZONES } from "@/lib/schemas/company-settings";
import { plainText } from "@/lib/schemas/text";

const ZONE_IDS = COMPANY_TIME_ZONES.map((z) => z.id) as [string, ...string[]];

export const utilitySchema = z.object({
  name: plainText().trim().min(2, "Give the utility's name as its bills print it").max(200, "Keep it under 200 characters"),
  /** The utility's billing clock; the same U.S. zones a company picks from. */
  timeZone: z.enum(ZONE_IDS, "Pick a time zone from the list"),
  territoryNotes: plainText({ multiline: true })
    .trim()
    .max(2000, "Keep the notes under 2,000 characters")
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .default(null),
});
export type UtilityInput = z.input<typeof utilitySchema>;
/** A new utility: without a time zone it takes the company's (most utilities bill on their customers' clock). */
export const newUtilitySchema = utilitySchema.partial({ timeZone: true });

/** "" (a select's "not known yet") as null, else a record id. */
export const optionalIdField = (message: string) =>
  z
    .string()
    .transform((v) => (v === "" ? null : v))
    .pipe(z.uuid(message).nullable());
