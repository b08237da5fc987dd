// The deal's working design (table design, column document): equipment from the catalog, roof
// faces with their module counts, where the production estimate's weather comes from, and the
// string plan for string inverters. Shared by the Design tab's form and the server (PUT /api/designs).
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";

const num = (label: string) => z.number({ error: `${label} must be a number` }).finite(`${label} must be a number`);

/** Share of open-sky irradiance a face receives after shading, %: one annual value or 12 monthly values (January first). */
export const solarAccessSchema = z.union([
  num("Solar access").min(0, "Solar access must be 0–100 %").max(100, "Solar access must be 0–100 %"),
  z.array(num("Solar access").min(0, "Solar access must be 0–100 %").max(100, "Solar access must be 0–100 %")).length(12, "Give 12 monthly values, January first"),
]);

export const designFaceSchema = z
  .object({
    /** Stable key of the face inside the design (offers refer to faces by it). */
    id: z.string().trim().min(1).max(40),
    name: plainText().trim().min(1, "Give the face a name").max(100),
    tiltDeg: num("Tilt").min(0, "Tilt must be 0–90°").max(90, "Tilt must be 0–90°"),
    /** Degrees clockwise from north: 90 east, 180 south, 270 west. */
    azimuthDeg: num("Azimuth").min(0, "Azimuth must be 0–360°").max(360, "Azimuth must be 0–360°"),
    usableSlots: z.number({ error: "Usable slots must be a number" }).int("Usable slots must be a whole number").min(0, "Usable slots must be 0 or more").max(1000, "Usable slots must be at most 1000"),
    solarAccessPct: solarAccessSchema,
    moduleCount: z.number({ error: "Modules must be a number" }).int("Modules must be a whole number").min(0, "Modules must be 0 or more").max(1000),
  })
  .refine((f) => f.moduleCount <= f.usableSlots, { path: ["moduleCount"], message: "More modules than usable slots on this face" });
export type DesignFace = z.output<typeof designFaceSchema>;

/**
 * Where production comes from: the nearest station, one the rep picked, or — when no station
 * covers the site — an annual figure (optionally 12 monthly figures) from another source, named.
 */
export const designWeatherSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("nearest") }),
  z.object({ kind: z.literal("station"), stationId: z.string().uuid("Pick a weather station from the list") }),
  z.object({
    kind: z.literal("manual"),
    annualKwh: num("Annual production").positive("Annual production must be above 0 kWh").max(1_000_000),
    monthlyKwh: z.array(num("Monthly production").min(0)).length(12, "Give 12 monthly values, January first").nullable().default(null),
    source: plainText().trim().min(3, "Say where the figure comes from").max(300),
  }),
]);

/** Common cold design default when no site figure is typed, °C (our choice; replace with the site's record low). */
/** Combined losses default, %: the PVWatts v5 default breakdown combines to about 14 % (Dobos 2014). */
export const DEFAULT_SYSTEM_LOSSES_PCT = 14;

export const DEFAULT_LOWEST_TEMP_C = -10;
export const DEFAULT_HIGHEST_TEMP_C = 35;

export const stringPlanSchema = z
  .object({
    /** Modules in series in each string. */
    stringSizes: z.array(z.number().int("String size must be a whole number").min(1, "A string needs at least 1 module").max(100)).max(60),
    /** The site's record-low (or extreme-minimum) ambient temperature, °C (NEC 690.7). */
    lowestTempC: num("Lowest temperature").min(-70, "Lowest temperature must be −70 °C or warmer").max(40),
    /** Hot design ambient temperature, °C (for Vmp at a hot cell). */
    highestTempC: num("Highest temperature").min(-20).max(60),
  })
  .refine((p) => p.highestTempC > p.lowestTempC, { path: ["highestTempC"], message: "Must be above the lowest temperature" });

export const designDocumentSchema = z
  .object({
    moduleId: z.string({ error: "Pick a module" }).uuid("Pick a module from the catalog"),
    inverterId: z.string({ error: "Pick an inverter" }).uuid("Pick an inverter from the catalog"),
    /** String inverters: how many of the model (micros: one per module group, counted from the modules). */
    inverterCount: z.number().int("Inverters must be a whole number").min(1, "At least 1 inverter").max(20).default(1),
    faces: z.array(designFaceSchema).min(1, "Add at least one roof face").max(24, "At most 24 roof faces"),
    weather: designWeatherSchema.default({ kind: "nearest" }),
    /** Combined system losses, % (PVWatts default breakdown ≈ 14 %). */
    lossesPct: num("Losses").min(0, "Losses must be 0–99 %").max(99, "Losses must be 0–99 %").default(DEFAULT_SYSTEM_LOSSES_PCT),
    /** The sizing helper's last target. */
    targetOffsetPct: num("Target offset").min(1, "Target offset must be 1–200 %").max(200, "Target offset must be 1–200 %").default(100),
    stringPlan: stringPlanSchema.nullable().default(null),
  })
  .superRefine((d, ctx) => {
    const ids = new Set<string>();
    d.faces.forEach((f, i) => {
      if (ids.has(f.id)) ctx.addIssue({ code: "custom", path: ["faces", i, "id"], message: "Two faces share one key" });
      ids.add(f.id);
    });
  });
export type DesignDocument = z.output<typeof designDocumentSchema>;
export type DesignDocumentInput = z.input<typeof designDocumentSchema>;

/** PUT /api/designs: the deal and its whole design (one per deal; saving replaces it). */
export const saveDesignSchema = z.object({
  dealId: z.string().uuid("Unknown deal"),
  document: designDocumentSchema,
});
