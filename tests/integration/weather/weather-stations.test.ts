import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { deal, design, household, upload, weatherStation } from "@/db/schema";
import { stationFieldsSchema, type StationFieldsInput } from "@/lib/schemas/weather";
import { db } from "@/server/db";
import { HttpError } from "@/server/errors";
import { storage } from "@/server/storage";
import {
  createStation,
  deleteStation,
  getStationOrThrow,
  getUploadMetadataOrThrow,
  haversineKm,
  loadStationWeather,
  MAX_STATION_DISTANCE_KM,
  nearestStation,
} from "@/server/weather-stations";
import { addMember, newCompany } from "../support/fixtures";

const projectRoot = fileURLToPath(new URL("../../../", import.meta.url));
const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/**
 * A synthetic typical year as Kilowright's generic hourly CSV: 500 W/m² GHI from 06:00 to
 * 18:00 every day, dark otherwise. Annual GHI = 365 days × 12 h × 500 W/m² = 2190 kWh/m².
 * `breakLine` replaces the air temperature on that file line (1-based) with text.
 */
function syntheticCsv(breakLine?: number): string {
  const lines = ["# Invented test year for Kilowright's integration tests", "month,day,hour,ghi,dni,dhi,temp_air,wind_speed"];
  for (let m = 1; m <= 12; m++) {
    for (let d = 1; d <= MONTH_DAYS[m - 1]; d++) {
      for (let h = 0; h < 24; h++) {
        const sun = h >= 6 && h < 18;
        const temp = breakLine === lines.length + 1 ? "warm" : "15";
        lines.push([m, d, h, sun ? 500 : 0, sun ? 600 : 0, sun ? 100 : 0, temp, 2].join(","));
      }
    }
  }
  return lines.join("\n") + "\n";
}

const denverSite = { latitude: "39.73", longitude: "-105.18", elevationM: "1820", utcOffsetHours: "-7" };
const fields = (input: StationFieldsInput) => stationFieldsSchema.parse(input);
const bytesOf = (text: string) => new TextEncoder().encode(text);
const storageDir = () => process.env.STORAGE_DIR as string;
const companyFiles = (companyId: string) => {
  const dir = path.join(storageDir(), companyId, "weather");
  return existsSync(dir) ? readdirSync(dir) : [];
};

async function rejection(promise: Promise<unknown>): Promise<HttpError> {
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(HttpError);
  return err as HttpError;
}

async function rowsOf(companyId: string) {
  const stations = await db().select().from(weatherStation).where(eq(weatherStation.companyId, companyId));
  const uploads = await db().select().from(upload).where(eq(upload.companyId, companyId));
  return { stations, uploads };
}

describe("uploading a weather file as a station", () => {
  it("stores a valid hourly CSV: the original bytes, an upload row and the station with its annual GHI", async () => {
    const owner = await newCompany("Weather Upload Solar");
    const text = syntheticCsv();
    const station = await createStation(owner, { bytes: bytesOf(text), fileName: "test-year.csv" }, fields({ name: "Test field", format: "auto", ...denverSite }));

    expect(station).toMatchObject({ name: "Test field", format: "csv", latitude: 39.73, longitude: -105.18, elevationM: 1820, utcOffsetHours: -7, fileName: "test-year.csv" });
    expect(station.annualGhiKwhPerM2).toBeCloseTo(2190, 6);
    // Attribution taken from the CSV's leading comment line when none was typed.
    expect(station.attribution).toBe("Invented test year for Kilowright's integration tests");

    const { stations, uploads } = await rowsOf(owner.companyId);
    expect(stations).toHaveLength(1);
    expect(uploads).toHaveLength(1);
    const [u] = uploads;
    expect(u).toMatchObject({ purpose: "weather", mimeType: "text/csv", sizeBytes: bytesOf(text).byteLength, uploadedByUserId: owner.userId });
    expect(u.sha256).toBe(createHash("sha256").update(text).digest("hex"));
    expect(u.storageKey).toBe(`${owner.companyId}/weather/${u.id}.csv`);
    expect(new TextDecoder().decode((await storage().get(u.storageKey)) ?? new Uint8Array())).toBe(text);

    const year = await loadStationWeather(owner.companyId, station.id);
    expect(year.ghi).toHaveLength(8760);
    expect(year.ghi[12]).toBe(500);
    expect(year.site.latitude).toBe(39.73);
    expect(await getUploadMetadataOrThrow(owner, u.id)).toMatchObject({ id: u.id, purpose: "weather", sha256: u.sha256 });
    expect(await getUploadMetadataOrThrow(owner, u.id)).not.toHaveProperty("storageKey");
  });

  it("refuses a malformed file with its line number and stores nothing (no rows, no file)", async () => {
    const owner = await newCompany("Weather Refusal Solar");
    const err = await rejection(
      createStation(owner, { bytes: bytesOf(syntheticCsv(500)), fileName: "broken.csv" }, fields({ name: "Broken", format: "csv", ...denverSite })),
    );
    expect(err.status).toBe(422);
    expect(err.code).toBe("weather_file_invalid");
    expect(err.fields?.file?.[0]).toBe("Line 500: temp_air is not a number");
    expect(err.message).toContain("Line 500");

    const { stations, uploads } = await rowsOf(owner.companyId);
    expect(stations).toHaveLength(0);
    expect(uploads).toHaveLength(0);
    expect(companyFiles(owner.companyId)).toEqual([]);
  });

  it("asks for the site beside an hourly CSV, and refuses binary files and files over the limit", async () => {
    const owner = await newCompany("Weather Site Solar");
    const noSite = await rejection(createStation(owner, { bytes: bytesOf(syntheticCsv()), fileName: "x.csv" }, fields({ name: "No site" })));
    expect(noSite.status).toBe(422);
    expect(Object.keys(noSite.fields ?? {}).sort()).toEqual(["elevationM", "latitude", "longitude", "utcOffsetHours"]);

    const pdf = bytesOf("%PDF-1.7\n1 0 obj\n<<>>\nendobj\n");
    const binary = await rejection(createStation(owner, { bytes: pdf, fileName: "weather.csv" }, fields({ name: "Pdf", ...denverSite })));
    expect(binary.status).toBe(415);
    expect(binary.fields?.file?.[0]).toContain("PDF");

    const huge = new Uint8Array(5 * 1024 * 1024 + 1).fill(0x31);
    expect((await rejection(createStation(owner, { bytes: huge, fileName: "big.csv" }, fields({ name: "Big", ...denverSite })))).status).toBe(413);

    const { stations, uploads } = await rowsOf(owner.companyId);
    expect(stations.length + uploads.length).toBe(0);
    expect(companyFiles(owner.companyId)).toEqual([]);
  });

  it("deletes the stored file again when the database insert fails", async () => {
    const owner = await newCompany("Weather Rollback Solar");
    // A company id with no company row: the upload insert fails on its foreign key.
    const ghost = { ...owner, companyId: crypto.randomUUID() };
    await expect(
      createStation(ghost, { bytes: bytesOf(syntheticCsv()), fileName: "x.csv" }, fields({ name: "Ghost", ...denverSite })),
    ).rejects.toThrow();
    expect(companyFiles(ghost.companyId)).toEqual([]);
  });

  it("reads the Greensboro TMY3 reference file with its header's site and a name and attribution from it", async () => {
    const owner = await newCompany("Weather TMY3 Solar");
    const bytes = new Uint8Array(readFileSync(path.join(projectRoot, "src/engine/data/tmy3-723170-greensboro-nc.csv")));
    const station = await createStation(owner, { bytes, fileName: "tmy3-723170-greensboro-nc.csv" }, fields({}));
    expect(station).toMatchObject({ format: "tmy3", latitude: 36.1, longitude: -79.95, elevationM: 273, utcOffsetHours: -5 });
    expect(station.name).toContain("GREENSBORO");
    expect(station.attribution).toContain("723170");
    // Central North Carolina receives roughly 4–4.5 kWh/m² a day on the horizontal.
    expect(station.annualGhiKwhPerM2).toBeGreaterThan(1450);
    expect(station.annualGhiKwhPerM2).toBeLessThan(1650);
  });
});

describe("nearest station", () => {
  it("computes the haversine great-circle distance Greensboro → Denver as worked by hand", () => {
    // Greensboro TMY3 header: 36.100 N, 79.950 W. Denver PVWatts site: 39.73 N, 105.18 W. R = 6371.0088 km.
    // Δφ = 3.63° = 0.0633555 rad, Δλ = −25.23° = −0.4403466 rad
    // sin²(Δφ/2) = 0.0010031; cos φ₁ = 0.8079899; cos φ₂ = 0.7690650; sin²(Δλ/2) = 0.0476980
    // a = 0.0010031 + 0.8079899 × 0.7690650 × 0.0476980 = 0.0306425
    // d = 2 × 6371.0088 × asin(√0.0306425) = 2 × 6371.0088 × 0.1759566 = 2242.04 km
    // (airport-to-airport GSO–DEN is commonly listed near 1,394 mi ≈ 2,243 km.)
    expect(haversineKm({ latitude: 36.1, longitude: -79.95 }, { latitude: 39.73, longitude: -105.18 })).toBeCloseTo(2242.04, 1);
    expect(haversineKm({ latitude: 10, longitude: 20 }, { latitude: 10, longitude: 20 })).toBe(0);
  });

  it("answers the nearest station within range and nothing beyond it", async () => {
    const owner = await newCompany("Weather Nearest Solar");
    const denver = await createStation(owner, { bytes: bytesOf(syntheticCsv()), fileName: "den.csv" }, fields({ name: "Denver test", ...denverSite }));
    const greensboroSite = { latitude: "36.1", longitude: "-79.95", elevationM: "273", utcOffsetHours: "-5" };
    const greensboro = await createStation(owner, { bytes: bytesOf(syntheticCsv()), fileName: "gso.csv" }, fields({ name: "Greensboro test", ...greensboroSite }));

    // A demo household in Greensboro (36.1012 N, 79.7711 W): 16.1 km east of the station.
    // Δφ = 0.0012°, Δλ = 0.1789°: a ≈ (0.0000105)² + 0.80799 × 0.80797 × (0.00156119)² = 1.5913e-6, d = 2R·asin(0.0012615) = 16.07 km.
    const near = await nearestStation(owner.companyId, 36.1012, -79.7711);
    expect(near?.station.id).toBe(greensboro.id);
    expect(near?.distanceKm).toBeCloseTo(16.07, 1);

    const boulder = await nearestStation(owner.companyId, 40.015, -105.27);
    expect(boulder?.station.id).toBe(denver.id);

    // Mid-Atlantic Ocean: both stations far beyond MAX_STATION_DISTANCE_KM.
    expect(await nearestStation(owner.companyId, 30, -50)).toBeNull();
    expect(MAX_STATION_DISTANCE_KM).toBe(200);
  });
});

describe("tenancy and roles", () => {
  it("another company finds nothing by id; a rep cannot add or delete stations", async () => {
    const owner = await newCompany("Weather Tenancy A");
    const station = await createStation(owner, { bytes: bytesOf(syntheticCsv()), fileName: "a.csv" }, fields({ name: "Company A field", ...denverSite }));
    const other = await newCompany("Weather Tenancy B");

    expect((await rejection(getStationOrThrow(other.companyId, station.id))).status).toBe(404);
    expect((await rejection(loadStationWeather(other.companyId, station.id))).status).toBe(404);
    expect((await rejection(getUploadMetadataOrThrow(other, station.uploadId))).status).toBe(404);
    expect((await rejection(deleteStation(other, station.id))).status).toBe(404);
    expect(await nearestStation(other.companyId, 39.73, -105.18)).toBeNull();

    const rep = await addMember(owner, "sales_rep", "Rita Rep");
    expect((await rejection(createStation(rep, { bytes: bytesOf(syntheticCsv()), fileName: "r.csv" }, fields({ name: "Rep", ...denverSite })))).status).toBe(403);
    expect((await rejection(deleteStation(rep, station.id))).status).toBe(403);
    expect(await getStationOrThrow(owner.companyId, station.id)).toMatchObject({ id: station.id });
  });
});

describe("deleting a station", () => {
  it("is refused while a design uses it, then removes the row, the upload and the file", async () => {
    const owner = await newCompany("Weather Delete Solar");
    const station = await createStation(owner, { bytes: bytesOf(syntheticCsv()), fileName: "d.csv" }, fields({ name: "To delete", ...denverSite }));
    const [{ storageKey }] = await db().select({ storageKey: upload.storageKey }).from(upload).where(eq(upload.id, station.uploadId));

    const householdId = crypto.randomUUID();
    const dealId = crypto.randomUUID();
    const designId = crypto.randomUUID();
    await db().insert(household).values({ id: householdId, companyId: owner.companyId, name: "Test household", street: "1 Test Road", city: "Golden", region: "CO", postalCode: "80401", latitude: 39.75, longitude: -105.2 });
    await db().insert(deal).values({ id: dealId, companyId: owner.companyId, householdId });
    await db().insert(design).values({ id: designId, companyId: owner.companyId, dealId, document: sql`${JSON.stringify({})}`, weatherStationId: station.id });

    const inUse = await rejection(deleteStation(owner, station.id));
    expect(inUse.status).toBe(409);
    expect(inUse.message).toContain("1 design");
    expect(await storage().get(storageKey)).not.toBeNull();

    await db().update(design).set({ weatherStationId: null }).where(eq(design.id, designId));
    await deleteStation(owner, station.id);
    const { stations, uploads } = await rowsOf(owner.companyId);
    expect(stations).toHaveLength(0);
    expect(uploads).toHaveLength(0);
    expect(await storage().get(storageKey)).toBeNull();
  });
});
