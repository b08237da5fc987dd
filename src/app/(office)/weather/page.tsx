import type { Metadata } from "next";
import { NoAccess } from "@/components/no-access";
import { can } from "@/lib/permissions";
import { formatDate } from "@/lib/format";
import { getCompanySettings } from "@/server/company-settings";
import { getMember } from "@/server/session";
import { listStations, MAX_STATION_DISTANCE_KM } from "@/server/weather-stations";
import { WeatherClient, type StationView } from "./weather-client";

export const metadata: Metadata = { title: "Weather" };

export default async function WeatherPage() {
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "weather:read")) return <NoAccess section="Weather" />;
  const [stations, { timeZone }] = await Promise.all([listStations(member), getCompanySettings(member.companyId)]);
  const views: StationView[] = stations.map((s) => ({
    id: s.id,
    name: s.name,
    format: s.format,
    latitude: s.latitude,
    longitude: s.longitude,
    elevationM: s.elevationM,
    utcOffsetHours: s.utcOffsetHours,
    attribution: s.attribution,
    annualGhiKwhPerM2: s.annualGhiKwhPerM2,
    fileName: s.fileName,
    sizeBytes: s.sizeBytes,
    createdAt: s.createdAt.toISOString(),
    addedOn: formatDate(s.createdAt, timeZone),
    designCount: s.designCount,
    sites: s.sites,
  }));
  return (
    <>
      <h1 className="text-2xl font-semibold">Weather</h1>
      <p className="mt-1 max-w-3xl text-graphite-soft">
        Typical-year weather files behind every production estimate. A site uses the station nearest to it, up to{" "}
        <span className="figure">{MAX_STATION_DISTANCE_KM}</span> km away; farther than that its climate may differ, so the estimate asks for a
        production figure from another source instead.
      </p>
      <WeatherClient stations={views} canManage={can(member.role, "weather:manage")} seesAllSites={can(member.role, "deals:read-all")} maxDistanceKm={MAX_STATION_DISTANCE_KM} />
    </>
  );
}
