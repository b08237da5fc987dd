// The electrical design's inputs a person types: the service panel of a household (Household
// tab) and the company's NEC edition and designer (Settings → Company). Shared by the forms and
// the server. The edition is a company setting because the AHJs a company works under adopt
// editions at different times; the checks name their sections per edition.
import { z } from "zod";
import { NEC_EDITIONS, type NecEdition } from "@/engine/electrical/nec-tables";
import { plainText } from "@/lib/schemas/text";

/** Until a company picks one: the edition most U.S. jurisdictions had adopted by 2026 (our choice). */
export const DEFAULT_NEC_EDITION: NecEdition = "2020";
/** Residential service voltages (120/240 V split phase; 120/208 V from a three-phase network). */
export const SERVICE_VOLTAGES = [240, 208] as const;

const amps = (what: string) =>
  z
    .number({ error: `Enter the ${what} in amperes` })
    .int(`The ${what} is a whole number of amperes`)
    .min(30, `The ${what} is 30–1200 A`)
    .max(1200, `The ${what} is 30–1200 A`)
    .nullable();

/** PUT /api/deals/[id]/service-panel. Null: not known yet (the design stays incomplete). */
export const servicePanelSchema = z
  .object({
    serviceBusbarA: amps("busbar rating"),
    serviceMainBreakerA: amps("main breaker rating"),
    serviceVoltageV: z.union(SERVICE_VOLTAGES.map((v) => z.literal(v)) as [z.ZodLiteral<240>, z.ZodLiteral<208>], { error: "Pick 240 V or 208 V" }).nullable(),
  })
  .refine((p) => p.serviceBusbarA === null || p.serviceMainBreakerA === null || p.serviceMainBreakerA <= p.serviceBusbarA, {
    path: ["serviceMainBreakerA"],
    message: "The main breaker cannot be rated above the busbar",
  });
export type ServicePanelInput = z.input<typeof servicePanelSchema>;

export const SERVICE_PANEL_LABELS = { serviceBusbarA: "Busbar rating", serviceMainBreakerA: "Main breaker", serviceVoltageV: "Service voltage" } as const;

/** Settings → Company → Electrical design; stored under company.settings.electrical. */
export const electricalSettingsSchema = z.object({
  necEdition: z.enum(NEC_EDITIONS, { error: `Pick the NEC edition: ${NEC_EDITIONS.join(", ")}` }),
  /** The company's designer, printed on the packet's "checked by" line; null: left blank to sign. */
  designerName: z
    .union([z.string(), z.null()])
    .transform((v) => (v ?? "").trim())
    .pipe(plainText().max(200, "Keep the name under 200 characters"))
    .transform((v) => (v === "" ? null : v)),
});
export type ElectricalSettingsInput = z.input<typeof electricalSettingsSchema>;
export type ElectricalSettings = z.output<typeof electricalSettingsSchema>;
export const ELECTRICAL_SETTINGS_LABELS = { necEdition: "NEC edition", designerName: "Designer" } as const;

/** company.settings.electrical as stored, read forgivingly (missing or damaged: the defaults). */
export function readElectricalSettings(settings: unknown): ElectricalSettings {
  const raw = settings && typeof settings === "object" ? (settings as { electrical?: unknown }).electrical : undefined;
  const parsed = electricalSettingsSchema.safeParse(raw);
  return parsed.success ? parsed.data : { necEdition: DEFAULT_NEC_EDITION, designerName: null };
}
