// Weather station upload and nearest-station lookup: one schema per input, used by the form
// (zodResolver) and by the route handlers. The file itself is checked by size here and by
// parsing on the server (src/engine/weather.ts).
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";

/** Largest weather file accepted. A full EPW year is about 1.9 MB, a TMY3 CSV about 1.7 MB. */
export const WEATHER_FILE_MAX_BYTES = 5 * 1024 * 1024;
export const WEATHER_FILE_MAX_LABEL = "5 MB";

export const WEATHER_FORMAT_CHOICES = ["auto", "epw", "tmy3", "csv"] as const;
export type WeatherFormatChoice = (typeof WEATHER_FORMAT_CHOICES)[number];
export const WEATHER_FORMAT_LABELS: Record<WeatherFormatChoice, string> = {
  auto: "Detect from the file",
  epw: "EPW (EnergyPlus weather)",
  tmy3: "TMY3 CSV (NREL)",
  csv: "Hourly CSV (site typed below)",
};

/**
 * An optional number typed in a form field: empty means "not given". Text is read as a number
 * here on purpose: these fields arrive as multipart form text (and query strings), never as JSON.
 */
const optionalNumber = (label: string, min: number, max: number, unit: string) =>
  z.preprocess(
    (v) => (v === undefined || v === null || (typeof v === "string" && v.trim() === "") ? undefined : typeof v === "string" ? Number(v.trim()) : v),
    z
      .number({ message: `Enter the ${label} as a number` })
      .finite(`Enter the ${label} as a number`)
      .min(min, `The ${label} is between ${min} and ${max}${unit}`)
      .max(max, `The ${label} is between ${min} and ${max}${unit}`)
      .optional(),
  );

const optionalText = (max: number, message: string, multiline = false) =>
  z.preprocess(
    (v) => (typeof v === "string" && v.trim() === "" ? undefined : typeof v === "string" ? v.trim() : v),
    plainText({ multiline }).max(max, message).optional(),
  );

/**
 * The typed fields beside the file. The site (latitude … UTC offset) is required for the
 * generic CSV and, for EPW and TMY3, overrides the file header field by field.
 */
export const stationFieldsSchema = z
  .object({
    name: optionalText(200, "Keep the name under 200 characters"),
    format: z.enum(WEATHER_FORMAT_CHOICES, { message: "Pick a file format" }).default("auto"),
    latitude: optionalNumber("latitude", -90, 90, "°"),
    longitude: optionalNumber("longitude", -180, 180, "°"),
    elevationM: optionalNumber("elevation", -500, 9000, " m"),
    utcOffsetHours: optionalNumber("UTC offset", -12, 14, " h"),
    attribution: optionalText(2000, "Keep the attribution under 2,000 characters", true),
  })
  .superRefine((v, ctx) => {
    if (v.format !== "csv") return;
    for (const key of ["latitude", "longitude", "elevationM", "utcOffsetHours"] as const) {
      if (v[key] === undefined) ctx.addIssue({ code: "custom", path: [key], message: "Required for an hourly CSV: the file does not say where it was measured" });
    }
  });
export type StationFieldsInput = z.input<typeof stationFieldsSchema>;
export type StationFields = z.output<typeof stationFieldsSchema>;

/** A required number typed in a form field or a query string ("" is missing, not 0). */
const requiredNumber = (label: string, min: number, max: number) =>
  z.preprocess(
    (v) => (v === undefined || v === null || (typeof v === "string" && v.trim() === "") ? undefined : typeof v === "string" ? Number(v.trim()) : v),
    z
      .number({ message: `Enter the ${label} in degrees` })
      .finite(`Enter the ${label} in degrees`)
      .min(min, `The ${label} is between ${min} and ${max}`)
      .max(max, `The ${label} is between ${min} and ${max}`),
  );

/** GET /api/weather-stations/nearest?lat=&lon= and the "check a location" form. */
export const nearestQuerySchema = z.object({
  lat: requiredNumber("latitude", -90, 90),
  lon: requiredNumber("longitude", -180, 180),
});
export type NearestQueryInput = z.input<typeof nearestQuerySchema>;
