import { NextResponse } from "next/server";
import { getWeatherColumns } from "@/server/designs";
import { openDeal } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, withMember } from "@/server/route";

/**
 * A station's typical-year hourly columns for the browser's production engine (?stationId=).
 * Immutable for a station, so the browser may keep it for the session.
 */
export const GET = withMember<{ id: string }>("weather:read", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const stationId = req.nextUrl.searchParams.get("stationId") ?? "";
  if (!idSchema.safeParse(stationId).success) throw notFound("Weather station");
  const data = await getWeatherColumns(await openDeal(member, params.id), stationId);
  return NextResponse.json({ data }, { headers: { "Cache-Control": "private, max-age=3600" } });
});
