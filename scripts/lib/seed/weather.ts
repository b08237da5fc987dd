// Demo weather stations: the real public reference files (attribution beside each file).
// Greensboro (TMY3) serves the demo's Piedmont Triad households; Denver (the hourly inputs of
// an NREL PVWatts result, as a generic CSV) is a second, distant station. Each file is stored
// like an admin's upload: bytes in the instance's storage folder, an `upload` row and a
// `weather_station` row, with the site and annual GHI taken from the engine's parse.
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { upload, weatherStation } from "../../../src/db/schema";
import { parseWeather, type WeatherFormat, type WeatherSite } from "../../../src/engine/weather";
import type { SeedContext } from "../seed-demo";
import { seedStore } from "../seed-files";

export const order = 5;

/** Fixed ids, so other areas' seeds (designs) can point at a station. */
export const GREENSBORO_STATION_ID = "7a11a55e-0000-4000-8000-000000005101";
export const DENVER_STATION_ID = "7a11a55e-0000-4000-8000-000000005102";
const GREENSBORO_UPLOAD_ID = "7a11a55e-0000-4000-8000-000000005111";
const DENVER_UPLOAD_ID = "7a11a55e-0000-4000-8000-000000005112";

const here = path.dirname(fileURLToPath(import.meta.url));
const projectRoot = path.resolve(here, "../../..");

type DemoStation = {
  stationId: string;
  uploadId: string;
  file: string;
  fileName: string;
  format: WeatherFormat;
  name: string;
  /** For the generic CSV, which has no header with the site. */
  site?: WeatherSite;
  attribution: string;
};

const STATIONS: DemoStation[] = [
  {
    stationId: GREENSBORO_STATION_ID,
    uploadId: GREENSBORO_UPLOAD_ID,
    file: path.join(projectRoot, "src/engine/data/tmy3-723170-greensboro-nc.csv"),
    fileName: "tmy3-723170-greensboro-nc.csv",
    format: "tmy3",
    name: "Greensboro Piedmont Triad Int'l (TMY3 723170)",
    attribution:
      "NREL National Solar Radiation Database, TMY3 station 723170, Greensboro Piedmont Triad International, NC (U.S. DOE, public). File from pvlib-python (BSD-3-Clause, pvlib python contributors).",
  },
  {
    stationId: DENVER_STATION_ID,
    uploadId: DENVER_UPLOAD_ID,
    file: path.join(here, "data/denver-pvwatts-hourly-weather.csv"),
    fileName: "denver-pvwatts-hourly-weather.csv",
    format: "csv",
    name: "Denver West (PVWatts hourly inputs)",
    site: { latitude: 39.73, longitude: -105.18, elevationM: 1819.6, utcOffsetHours: -7 },
    attribution:
      "Hourly weather inputs of an NREL PVWatts result for Denver, CO (U.S. DOE, public). File from pvlib-python tests/data (BSD-3-Clause, pvlib python contributors).",
  },
];

export async function seed(ctx: SeedContext): Promise<void> {
  const store = seedStore("weather stations");
  for (const s of STATIONS) {
    const bytes = new Uint8Array(await readFile(s.file));
    const weather = parseWeather(new TextDecoder("utf-8").decode(bytes), { format: s.format, site: s.site });
    // Annual GHI as the app computes it (src/server/weather-stations.ts annualGhiKwhPerM2): Σ W/m² × 1 h / 1000.
    let ghiWh = 0;
    for (let i = 0; i < weather.ghi.length; i++) ghiWh += weather.ghi[i];
    const storageKey = `${ctx.companyId}/weather/${s.uploadId}.${s.format === "epw" ? "epw" : "csv"}`;
    await store.put(storageKey, bytes);
    await ctx.tx.insert(upload).values({
      id: s.uploadId,
      companyId: ctx.companyId,
      purpose: "weather",
      fileName: s.fileName,
      mimeType: "text/csv",
      sizeBytes: bytes.byteLength,
      sha256: createHash("sha256").update(bytes).digest("hex"),
      storageKey,
      uploadedByUserId: ctx.people.find((p) => p.role === "admin")?.id ?? null,
    });
    await ctx.tx.insert(weatherStation).values({
      id: s.stationId,
      companyId: ctx.companyId,
      name: s.name,
      format: s.format,
      latitude: weather.site.latitude,
      longitude: weather.site.longitude,
      elevationM: weather.site.elevationM,
      utcOffsetHours: weather.site.utcOffsetHours,
      attribution: s.attribution,
      annualGhiKwhPerM2: ghiWh / 1000,
      uploadId: s.uploadId,
    });
  }
}
