import { NextResponse } from "next/server";
import { nearestQuerySchema } from "@/lib/schemas/weather";
import { validationError, withMember } from "@/server/route";
import { MAX_STATION_DISTANCE_KM, nearestStation } from "@/server/weather-stations";

/**
 * The company's station nearest to ?lat=&lon=, within MAX_STATION_DISTANCE_KM. Beyond that
 * the answer says so plainly instead of offering a station whose climate may differ.
 */
export const GET = withMember("weather:read", async ({ req, member }) => {
  const params = req.nextUrl.searchParams;
  const parsed = nearestQuerySchema.safeParse({ lat: params.get("lat") ?? undefined, lon: params.get("lon") ?? undefined });
  if (!parsed.success) throw validationError(parsed.error);
  const found = await nearestStation(member.companyId, parsed.data.lat, parsed.data.lon);
  if (!found) {
    return NextResponse.json({
      data: {
        found: false,
        maxDistanceKm: MAX_STATION_DISTANCE_KM,
        message: `No weather station within ${MAX_STATION_DISTANCE_KM} km of this site. Its climate may differ from any station on file: enter a production figure from another source, or ask an admin to add a weather file for this area.`,
      },
    });
  }
  return NextResponse.json({ data: { found: true, maxDistanceKm: MAX_STATION_DISTANCE_KM, distanceKm: found.distanceKm, station: found.station } });
});
