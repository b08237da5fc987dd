import { NextResponse } from "next/server";
import { withDeal } from "@/server/deal-route";
import { getWeatherColumns } from "@/server/designs";
import { notFound } from "@/server/errors";
import { idSchema } from "@/server/route";

/**
 * A station's typical-year hourly columns for the browser's production engine (?stationId=).
 * Immutable for a station, so the browser may keep it for the session.
 */
export const GET = withDeal("weather:read", async ({ req, scope }) => {
  const stationId = req.nextUrl.searchParams.get("stationId") ?? "";
  if (!idSchema.safeParse(stationId).success) throw notFound("Weather station");
  const data = await getWeatherColumns(scope, stationId);
  return NextResponse.json({ data }, { headers: { "Cache-Control": "private, max-age=3600" } });
});
