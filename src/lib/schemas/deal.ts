// The new-lead and household forms: one schema, used by the form and by the server.
import { z } from "zod";
import { sitePositionProblem } from "@/engine/site-position";
import { LOCALES } from "@/lib/i18n/locales";
import { plainText } from "@/lib/schemas/text";
import { optionalIdField } from "@/lib/schemas/utility";

const optionalText = (max: number) =>
  plainText()
    .trim()
    .max(max, `Keep it under ${max} characters`)
    .transform((v) => (v === "" ? null : v))
    .nullable()
    .optional();
const optionalEmail = z
  .string()
  .trim()
  .toLowerCase()
  .transform((v) => (v === "" ? null : v))
  .pipe(z.email("Enter a valid e-mail address").nullable())
  .nullable()
  .optional();

export const LEAD_SOURCES = ["Referral", "Website", "Door to door", "Home show", "Phone", "Other"] as const;

const householdFields = z.object({
  name: plainText().trim().min(2, "Give the household a name, e.g. “Rivera household”").max(200),
  contactName: plainText().trim().min(2, "Enter the main contact's name").max(200),
  email: optionalEmail,
  phone: optionalText(40),
  secondContactName: optionalText(200),
  secondContactEmail: optionalEmail,
  secondContactPhone: optionalText(40),
  street: plainText().trim().min(3, "Enter the street address").max(200),
  city: plainText().trim().min(2, "Enter the city").max(100),
  region: plainText().trim().min(2, "Enter the state").max(50),
  postalCode: z.string().trim().regex(/^[0-9]{5}(-[0-9]{4})?$/, "Enter a ZIP code like 27401"),
  latitude: z.number({ error: "Enter the latitude in degrees" }).min(-90, "Latitude is between −90 and 90").max(90, "Latitude is between −90 and 90"),
  longitude: z.number({ error: "Enter the longitude in degrees" }).min(-180, "Longitude is between −180 and 180").max(180, "Longitude is between −180 and 180"),
  /** The homeowner's language for their page, PDF and e-mails; left out: unchanged (a new household: English). */
  language: z.enum(LOCALES, { message: "Pick the homeowner's language: English or Español" }).optional(),
});

/** A blank or failed position must never be stored as 0, 0 (sitePositionProblem). */
function realPosition(h: { latitude: number; longitude: number }, ctx: z.RefinementCtx) {
  if (!Number.isFinite(h.latitude) || !Number.isFinite(h.longitude)) return;
  const problem = sitePositionProblem(h.latitude, h.longitude);
  if (problem) for (const path of ["latitude", "longitude"]) ctx.addIssue({ code: "custom", path: [path], message: problem });
}

export const householdSchema = householdFields.superRefine(realPosition);
export type HouseholdInput = z.input<typeof householdSchema>;

export const leadSchema = householdFields
  .extend({
    utilityId: optionalIdField("Pick the utility from the list").nullable().optional(),
    ratePlanId: optionalIdField("Pick a rate plan from the list").nullable().optional(),
    source: z.enum(LEAD_SOURCES, { message: "Pick where the lead came from" }),
  })
  .superRefine(realPosition);
export type LeadInput = z.input<typeof leadSchema>;

export const dealSearchSchema = z.object({ q: z.string().trim().max(100).optional() });
