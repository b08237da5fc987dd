import "server-only";
import { createHash } from "node:crypto";
import { and, asc, count, eq, type SQL } from "drizzle-orm";
import { fileTypeFromBuffer } from "file-type";
import { deal, design, household, upload, weatherStation } from "@/db/schema";
import { EngineInputError } from "@/engine/errors";
import { detectWeatherFormat, parseWeather, type WeatherFormat, type WeatherSite, type WeatherYear } from "@/engine/weather";
import { can } from "@/lib/permissions";
import { WEATHER_FILE_MAX_BYTES, WEATHER_FILE_MAX_LABEL, type StationFields } from "@/lib/schemas/weather";
import { db, transaction } from "@/server/db";
import { openDealOf } from "@/server/deal-scope";
import { forbidden, HttpError, notFound } from "@/server/errors";
import type { Member } from "@/server/session";
import { storage } from "@/server/storage";

/**
 * How far a site may be from the weather station whose typical year estimates its production.
 * 200 km is a common rule of thumb when picking a TMY station: beyond it the climate (cloud
 * cover, coastal or mountain effects, temperature) may differ enough that the estimate stops
 * describing the site. Past it we say so and ask for a production figure from another source.
 */
export const MAX_STATION_DISTANCE_KM = 200;

import { haversineKm } from "@/engine/geo";

export { haversineKm };

export type Station = {
  id: string;
  name: string;
  format: WeatherFormat;
  latitude: number;
  longitude: number;
  elevationM: number;
  utcOffsetHours: number;
  attribution: string;
  annualGhiKwhPerM2: number;
  uploadId: string;
  fileName: string;
  sizeBytes: number;
  createdAt: Date;
};

const stationColumns = {
  id: weatherStation.id,
  name: weatherStation.name,
  format: weatherStation.format,
  latitude: weatherStation.latitude,
  longitude: weatherStation.longitude,
  elevationM: weatherStation.elevationM,
  utcOffsetHours: weatherStation.utcOffsetHours,
  attribution: weatherStation.attribution,
  annualGhiKwhPerM2: weatherStation.annualGhiKwhPerM2,
  uploadId: weatherStation.uploadId,
  fileName: upload.fileName,
  sizeBytes: upload.sizeBytes,
  createdAt: weatherStation.createdAt,
};

function stationQuery(companyId: string, where?: SQL) {
  return db()
    .select(stationColumns)
    .from(weatherStation)
    .innerJoin(upload, and(eq(upload.id, weatherStation.uploadId), eq(upload.companyId, weatherStation.companyId)))
    .where(where ? and(eq(weatherStation.companyId, companyId), where) : eq(weatherStation.companyId, companyId));
}

export async function getStationOrThrow(companyId: string, stationId: string): Promise<Station> {
  const [row] = await stationQuery(companyId, eq(weatherStation.id, stationId)).limit(1);
  if (!row) throw notFound("Weather station");
  return row;
}

/** A household whose estimate uses a station: chosen on a design, or the nearest within range. */
export type StationSite = { householdId: string; name: string; city: string; distanceKm: number; how: "chosen" | "nearest" };
export type StationListRow = Station & { designCount: number; sites: StationSite[] };

/**
 * The company's stations with the sites that use them. Sites are limited to the households of
 * the deals the person may see (reps: their own).
 */
export async function listStations(member: Member): Promise<StationListRow[]> {
  const stations = await stationQuery(member.companyId).orderBy(asc(weatherStation.name));
  const dealScope = can(member.role, "deals:read-all")
    ? eq(deal.companyId, member.companyId)
    : and(eq(deal.companyId, member.companyId), eq(deal.ownerUserId, member.userId));
  const [households, designRefs, designCounts] = await Promise.all([
    db()
      .selectDistinct({ id: household.id, name: household.name, city: household.city, latitude: household.latitude, longitude: household.longitude })
      .from(household)
      .innerJoin(deal, and(eq(deal.householdId, household.id), eq(deal.companyId, household.companyId)))
      .where(and(eq(household.companyId, member.companyId), dealScope))
      .orderBy(asc(household.name)),
    db()
      .select({ householdId: deal.householdId, stationId: design.weatherStationId })
      .from(design)
      .innerJoin(deal, and(eq(deal.id, design.dealId), eq(deal.companyId, design.companyId)))
      .where(eq(design.companyId, member.companyId)),
    db()
      .select({ stationId: design.weatherStationId, n: count() })
      .from(design)
      .where(eq(design.companyId, member.companyId))
      .groupBy(design.weatherStationId),
  ]);

  const chosen = new Map<string, Set<string>>();
  for (const r of designRefs) {
    if (!r.stationId) continue;
    if (!chosen.has(r.householdId)) chosen.set(r.householdId, new Set());
    chosen.get(r.householdId)?.add(r.stationId);
  }
  const sitesByStation = new Map<string, StationSite[]>(stations.map((s) => [s.id, []]));
  for (const h of households) {
    const explicit = chosen.get(h.id);
    if (explicit && explicit.size > 0) {
      for (const stationId of explicit) {
        const s = stations.find((x) => x.id === stationId);
        if (s) sitesByStation.get(s.id)?.push({ householdId: h.id, name: h.name, city: h.city, distanceKm: haversineKm(h, s), how: "chosen" });
      }
      continue;
    }
    const near = pickNearest(stations, h.latitude, h.longitude);
    if (near) sitesByStation.get(near.station.id)?.push({ householdId: h.id, name: h.name, city: h.city, distanceKm: near.distanceKm, how: "nearest" });
  }
  const countByStation = new Map(designCounts.filter((r) => r.stationId).map((r) => [r.stationId as string, r.n]));
  return stations.map((s) => ({ ...s, designCount: countByStation.get(s.id) ?? 0, sites: sitesByStation.get(s.id) ?? [] }));
}

function pickNearest<S extends { latitude: number; longitude: number }>(stations: S[], lat: number, lon: number): { station: S; distanceKm: number } | null {
  let best: { station: S; distanceKm: number } | null = null;
  for (const station of stations) {
    const distanceKm = haversineKm({ latitude: lat, longitude: lon }, station);
    if (!best || distanceKm < best.distanceKm) best = { station, distanceKm };
  }
  return best && best.distanceKm <= MAX_STATION_DISTANCE_KM ? best : null;
}

/** The company's station nearest to a point, or null when none lies within MAX_STATION_DISTANCE_KM. */
export async function nearestStation(companyId: string, lat: number, lon: number): Promise<{ station: Station; distanceKm: number } | null> {
  return pickNearest(await stationQuery(companyId), lat, lon);
}

/** The station a site's production estimate uses, and how far it is: what the Household tab shows. */
export type SiteStation =
  | { kind: "station"; name: string; distanceKm: number; how: "chosen" | "nearest" }
  | { kind: "manual" }
  | { kind: "none"; maxDistanceKm: number };

/**
 * As the estimate picks it (productionForDesign): the design's chosen station, else the
 * nearest within MAX_STATION_DISTANCE_KM; a design with a typed figure uses none.
 */
export async function siteStation(companyId: string, site: { latitude: number; longitude: number }, weather: { kind: "nearest" } | { kind: "station"; stationId: string } | { kind: "manual" }): Promise<SiteStation> {
  if (weather.kind === "manual") return { kind: "manual" };
  if (weather.kind === "station") {
    const station = await getStationOrThrow(companyId, weather.stationId).catch(() => null);
    if (station) return { kind: "station", name: station.name, distanceKm: haversineKm(site, station), how: "chosen" };
  }
  const near = await nearestStation(companyId, site.latitude, site.longitude);
  return near ? { kind: "station", name: near.station.name, distanceKm: near.distanceKm, how: "nearest" } : { kind: "none", maxDistanceKm: MAX_STATION_DISTANCE_KM };
}

// ── Upload ─────────────────────────────────────────────────────────────────────────────────

export type WeatherFileInput = { bytes: Uint8Array; fileName: string };

const SITE_FIELDS = ["latitude", "longitude", "elevationM", "utcOffsetHours"] as const;

function fileRefused(status: number, code: string, message: string): HttpError {
  return new HttpError(status, code, message, { file: [message] });
}

/** Checks size and that the bytes are text; returns the text. Nothing is stored here. */
async function readWeatherText(file: WeatherFileInput): Promise<string> {
  if (file.bytes.byteLength === 0) throw fileRefused(422, "file_empty", "The file is empty.");
  if (file.bytes.byteLength > WEATHER_FILE_MAX_BYTES) {
    throw fileRefused(413, "file_too_large", `The file is larger than ${WEATHER_FILE_MAX_LABEL}. A typical-year weather file is about 2 MB.`);
  }
  // Binary formats (zip, PDF, images, spreadsheets) are recognised by their signature.
  const detected = await fileTypeFromBuffer(file.bytes);
  if (detected && detected.mime !== "text/csv" && detected.mime !== "text/plain") {
    throw fileRefused(415, "file_type", `This is a ${detected.ext.toUpperCase()} file (${detected.mime}), not a text weather file. Upload an EPW, TMY3 CSV or hourly CSV.`);
  }
  if (file.bytes.includes(0)) throw fileRefused(415, "file_type", "The file contains binary data, not text. Upload an EPW, TMY3 CSV or hourly CSV.");
  return new TextDecoder("utf-8").decode(file.bytes);
}

/** Where the data comes from, when the admin typed nothing: the file's own header. */
function attributionFromFile(text: string, weather: WeatherYear): string | null {
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/, 40);
  if (weather.format === "csv") {
    const comments: string[] = [];
    for (const line of lines) {
      if (line.trim() === "") continue;
      if (!line.trimStart().startsWith("#")) break;
      const t = line.trimStart().slice(1).trim();
      if (t) comments.push(t);
    }
    return comments.length ? comments.join(" ") : null;
  }
  if (weather.format === "tmy3") return `NREL TMY3 station ${weather.sourceLabel.replace(/^TMY3\s*/, "")}`;
  const comment = lines.find((l) => /^COMMENTS 1,/i.test(l))?.replace(/^COMMENTS 1,/i, "").trim();
  return [weather.sourceLabel, comment].filter(Boolean).join(". ");
}

/** An engine error as a 422 naming the file's lines, or the typed site field it concerns. */
function weatherFileError(err: EngineInputError): HttpError {
  const fields: Record<string, string[]> = {};
  const fileIssues: string[] = [];
  for (const issue of err.issues) {
    const siteField = SITE_FIELDS.find((f) => issue.path === f);
    if (siteField) (fields[siteField] ??= []).push(`${issue.message} (from the file header or the form)`);
    else fileIssues.push(issue.path && issue.path !== "file" ? `${issue.path[0].toUpperCase()}${issue.path.slice(1)}: ${issue.message}` : issue.message);
  }
  if (fileIssues.length) fields.file = fileIssues;
  const first = fileIssues[0] ?? Object.entries(fields).map(([k, v]) => `${k}: ${v[0]}`)[0] ?? err.message;
  const total = err.issues.length;
  return new HttpError(422, "weather_file_invalid", `The weather file was not stored (${total} ${total === 1 ? "problem" : "problems"}). ${first}`, fields);
}

/** Sum of hourly GHI (W/m² hour means × 1 h) over the year, in kWh/m². */
export function annualGhiKwhPerM2(weather: WeatherYear): number {
  let wh = 0;
  for (let i = 0; i < weather.ghi.length; i++) wh += weather.ghi[i];
  return wh / 1000;
}

/**
 * Stores a weather file as a station. The file is parsed first; only a file that parses
 * completely is written to storage, and its upload and station rows go in one transaction.
 * If the database write fails, the stored file is deleted again.
 */
export async function createStation(member: Member, file: WeatherFileInput, fields: StationFields): Promise<Station> {
  if (!can(member.role, "weather:manage")) throw forbidden("adding weather stations");
  const text = await readWeatherText(file);
  const format: WeatherFormat = fields.format === "auto" ? detectWeatherFormat(text) : fields.format;
  if (format === "csv") {
    const missing = SITE_FIELDS.filter((k) => fields[k] === undefined);
    if (missing.length) {
      const msg = "Required for an hourly CSV: the file does not say where it was measured";
      throw new HttpError(422, "validation_failed", `An hourly CSV needs the site typed beside it: ${missing.join(", ")}.`, Object.fromEntries(missing.map((k) => [k, [msg]])));
    }
  }
  const site: Partial<WeatherSite> = {};
  for (const k of SITE_FIELDS) if (fields[k] !== undefined) site[k] = fields[k];

  let weather: WeatherYear;
  try {
    weather = parseWeather(text, { format, site });
  } catch (err) {
    if (err instanceof EngineInputError) throw weatherFileError(err);
    throw err;
  }

  const name = (fields.name ?? weather.site.name?.trim() ?? "").slice(0, 200);
  if (!name) throw new HttpError(422, "validation_failed", "name: Give the station a name (the file has none).", { name: ["Give the station a name (the file has none)"] });
  const attribution = fields.attribution ?? attributionFromFile(text, weather);
  if (!attribution) {
    const msg = "Say where the data comes from (source and licence); the file has no header to take it from";
    throw new HttpError(422, "validation_failed", `attribution: ${msg}.`, { attribution: [msg] });
  }

  const uploadId = crypto.randomUUID();
  const stationId = crypto.randomUUID();
  const storageKey = `${member.companyId}/weather/${uploadId}.${format === "epw" ? "epw" : "csv"}`;
  const sha256 = createHash("sha256").update(file.bytes).digest("hex");
  const fileName = (file.fileName.trim() || `weather.${format === "epw" ? "epw" : "csv"}`).slice(0, 255);

  await storage().put(storageKey, file.bytes);
  try {
    await transaction(async (tx) => {
      await tx.insert(upload).values({
        id: uploadId,
        companyId: member.companyId,
        purpose: "weather",
        fileName,
        mimeType: "text/csv",
        sizeBytes: file.bytes.byteLength,
        sha256,
        storageKey,
        uploadedByUserId: member.userId,
      });
      await tx.insert(weatherStation).values({
        id: stationId,
        companyId: member.companyId,
        name,
        format,
        latitude: weather.site.latitude,
        longitude: weather.site.longitude,
        elevationM: weather.site.elevationM,
        utcOffsetHours: weather.site.utcOffsetHours,
        attribution,
        annualGhiKwhPerM2: annualGhiKwhPerM2(weather),
        uploadId,
      });
    });
  } catch (err) {
    await storage()
      .delete(storageKey)
      .catch((cleanup: unknown) => console.error("weather upload: could not delete the stored file after a failed insert", storageKey, cleanup));
    throw err;
  }
  return getStationOrThrow(member.companyId, stationId);
}

/** Deletes a station and its file, unless a design uses it (409). */
export async function deleteStation(member: Member, stationId: string): Promise<{ id: string }> {
  if (!can(member.role, "weather:manage")) throw forbidden("deleting weather stations");
  const station = await getStationOrThrow(member.companyId, stationId);
  const [{ storageKey }] = await db()
    .select({ storageKey: upload.storageKey })
    .from(upload)
    .where(and(eq(upload.id, station.uploadId), eq(upload.companyId, member.companyId)));
  await transaction(async (tx) => {
    const [used] = await tx
      .select({ n: count() })
      .from(design)
      .where(and(eq(design.companyId, member.companyId), eq(design.weatherStationId, stationId)));
    if (used.n > 0) {
      throw new HttpError(409, "station_in_use", `${station.name} is used by ${used.n} ${used.n === 1 ? "design" : "designs"}. Pick another station on those designs first.`);
    }
    await tx.delete(weatherStation).where(and(eq(weatherStation.id, stationId), eq(weatherStation.companyId, member.companyId)));
    await tx.delete(upload).where(and(eq(upload.id, station.uploadId), eq(upload.companyId, member.companyId)));
  });
  // After the commit: a file left behind by a failure here is unreferenced, never a dangling row.
  await storage()
    .delete(storageKey)
    .catch((err: unknown) => console.error("weather station deleted; its file could not be removed", storageKey, err));
  return { id: stationId };
}

// ── Reading a station's year ───────────────────────────────────────────────────────────────

/**
 * A small per-process LRU of parsed years. It is a pure cache of immutable data: the key is
 * the file's SHA-256 plus the site the file was parsed with, and a stored weather file never
 * changes, so any app node computes the same value and losing the cache only costs a re-parse.
 */
const WEATHER_CACHE_SIZE = 4;
const weatherCache = new Map<string, WeatherYear>();

function cacheGet(key: string): WeatherYear | undefined {
  const hit = weatherCache.get(key);
  if (hit) {
    weatherCache.delete(key);
    weatherCache.set(key, hit);
  }
  return hit;
}

function cachePut(key: string, value: WeatherYear): void {
  weatherCache.set(key, value);
  while (weatherCache.size > WEATHER_CACHE_SIZE) {
    const oldest = weatherCache.keys().next().value;
    if (oldest === undefined) break;
    weatherCache.delete(oldest);
  }
}

/** The station's typical year, parsed by the engine from the stored file. */
export async function loadStationWeather(companyId: string, stationId: string): Promise<WeatherYear> {
  const [row] = await db()
    .select({
      ...stationColumns,
      sha256: upload.sha256,
      storageKey: upload.storageKey,
    })
    .from(weatherStation)
    .innerJoin(upload, and(eq(upload.id, weatherStation.uploadId), eq(upload.companyId, weatherStation.companyId)))
    .where(and(eq(weatherStation.id, stationId), eq(weatherStation.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound("Weather station");
  const site: WeatherSite = { latitude: row.latitude, longitude: row.longitude, elevationM: row.elevationM, utcOffsetHours: row.utcOffsetHours, name: row.name };
  const key = [row.sha256, row.format, site.latitude, site.longitude, site.elevationM, site.utcOffsetHours, row.name].join("|");
  const cached = cacheGet(key);
  if (cached) return cached;

  const bytes = await storage().get(row.storageKey);
  if (!bytes) throw new HttpError(500, "weather_file_missing", `The weather file of ${row.name} is missing from storage. Upload it again.`);
  if (createHash("sha256").update(bytes).digest("hex") !== row.sha256) {
    throw new HttpError(500, "weather_file_changed", `The stored weather file of ${row.name} does not match its checksum. Upload it again.`);
  }
  const weather = parseWeather(new TextDecoder("utf-8").decode(bytes), { format: row.format, site, sourceLabel: row.name });
  cachePut(key, weather);
  return weather;
}

// ── Uploads (metadata only) ────────────────────────────────────────────────────────────────

export type UploadMetadata = {
  id: string;
  purpose: "bill" | "interval_data" | "weather" | "site_photo";
  dealId: string | null;
  fileName: string;
  mimeType: string;
  sizeBytes: number;
  sha256: string;
  uploadedByUserId: string | null;
  createdAt: Date;
};

/**
 * One upload's metadata (never its bytes or storage key), for a person of the owning company.
 * A file attached to a deal is visible only to those who may see that deal; weather files to
 * those with weather:read.
 */
export async function getUploadMetadataOrThrow(member: Member, uploadId: string): Promise<UploadMetadata> {
  const [row] = await db()
    .select({
      id: upload.id,
      purpose: upload.purpose,
      dealId: upload.dealId,
      fileName: upload.fileName,
      mimeType: upload.mimeType,
      sizeBytes: upload.sizeBytes,
      sha256: upload.sha256,
      uploadedByUserId: upload.uploadedByUserId,
      createdAt: upload.createdAt,
    })
    .from(upload)
    .where(and(eq(upload.id, uploadId), eq(upload.companyId, member.companyId)))
    .limit(1);
  if (!row) throw notFound("Upload");
  if (row.dealId) {
    await openDealOf(member, row.dealId, "Upload");
  } else if (row.purpose === "weather" && !can(member.role, "weather:read")) throw forbidden("reading weather files");
  return row;
}
