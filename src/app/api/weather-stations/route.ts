import { NextResponse } from "next/server";
import { stationFieldsSchema, WEATHER_FILE_MAX_BYTES, WEATHER_FILE_MAX_LABEL } from "@/lib/schemas/weather";
import { BODY_CAPS } from "@/server/body-limit";
import { HttpError } from "@/server/errors";
import { readForm, validationError, withMember } from "@/server/route";
import { createStation, listStations } from "@/server/weather-stations";

/** The company's weather stations with the sites that use them. */
export const GET = withMember("weather:read", async ({ member }) => {
  return NextResponse.json({ data: await listStations(member) });
});

/**
 * Adds a station from an uploaded weather file (multipart/form-data: `file` plus the typed
 * fields of stationFieldsSchema). Nothing is stored unless the whole file parses.
 */
export const POST = withMember("weather:manage", async ({ req, member }) => {
  if (!(req.headers.get("content-type") ?? "").toLowerCase().startsWith("multipart/form-data")) {
    throw new HttpError(415, "unsupported_media_type", "Send the weather file as multipart/form-data with a field named file.");
  }
  const form = await readForm(req, BODY_CAPS.weather, "the weather file");
  const file = form.get("file");
  if (!(file instanceof File)) {
    throw new HttpError(422, "validation_failed", "file: Choose a weather file to upload.", { file: ["Choose a weather file to upload"] });
  }
  const text = (name: string) => {
    const v = form.get(name);
    return typeof v === "string" ? v : undefined;
  };
  const parsed = stationFieldsSchema.safeParse({
    name: text("name"),
    format: text("format") || undefined,
    latitude: text("latitude"),
    longitude: text("longitude"),
    elevationM: text("elevationM"),
    utcOffsetHours: text("utcOffsetHours"),
    attribution: text("attribution"),
  });
  if (!parsed.success) throw validationError(parsed.error);
  if (file.size > WEATHER_FILE_MAX_BYTES) {
    throw new HttpError(413, "file_too_large", `The file is larger than ${WEATHER_FILE_MAX_LABEL}.`, { file: [`The file is larger than ${WEATHER_FILE_MAX_LABEL}.`] });
  }
  const bytes = new Uint8Array(await file.arrayBuffer());
  const station = await createStation(member, { bytes, fileName: file.name }, parsed.data);
  return NextResponse.json({ data: station }, { status: 201 });
});
