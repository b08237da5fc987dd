import "server-only";
import { and, asc, eq, sql } from "drizzle-orm";
import { design, weatherStation } from "@/db/schema";
import { estimateProduction } from "@/engine/production";
import type { WeatherYear } from "@/engine/weather";
import { engineSystem, manualProductionHourly, MANUAL_SHAPE_NOTE, type InverterSpec, type ModuleSpec, type WeatherStationPlace } from "@/lib/offer-figures";
import { designDocumentSchema, saveDesignSchema, type DesignDocument } from "@/lib/schemas/design";
import { getInverterOrThrow, getModuleOrThrow, listActiveInverters, listActiveModules, type InverterModel, type ModuleModel } from "@/server/catalog";
import { db, transaction } from "@/server/db";
import { inDealOrThrow, openDeal, type DealScope } from "@/server/deal-scope";
import { getDealUsage } from "@/server/energy";
import { fieldError, HttpError } from "@/server/errors";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";
import { autoMoveStage } from "@/server/stages";
import { recordEvent } from "@/server/timeline";
import { haversineKm, loadStationWeather, MAX_STATION_DISTANCE_KM, nearestStation } from "@/server/weather-stations";

/** MariaDB keeps JSON as text, so the driver may hand back a string. */
export function jsonValue(raw: unknown): unknown {
  return typeof raw === "string" ? JSON.parse(raw) : raw;
}

export type DesignRecord = { id: string; dealId: string; document: DesignDocument; weatherStationId: string | null; revision: number; updatedAt: Date };

function parseDocument(raw: unknown): DesignDocument {
  const parsed = designDocumentSchema.safeParse(jsonValue(raw));
  if (!parsed.success) throw new HttpError(500, "design_unreadable", "The saved design does not match the current format. Open the Design tab and save it again.");
  return parsed.data;
}

const columns = { id: design.id, dealId: design.dealId, document: design.document, weatherStationId: design.weatherStationId, revision: design.revision, updatedAt: design.updatedAt };

/** The deal's design, or null before the first save. */
export async function getDesignForDeal(scope: DealScope): Promise<DesignRecord | null> {
  const { member, dealId } = scope;
  const [row] = await db()
    .select(columns)
    .from(design)
    .where(and(eq(design.companyId, member.companyId), eq(design.dealId, dealId)))
    .limit(1);
  return row ? { ...row, document: parseDocument(row.document) } : null;
}

/** A design by its id; reps only through deals they own (another company's: not found). */
export async function getDesignOrThrow(member: Member, designId: string): Promise<DesignRecord> {
  const rows = await db()
    .select(columns)
    .from(design)
    .where(and(eq(design.id, designId), eq(design.companyId, member.companyId)))
    .limit(1);
  const row = await inDealOrThrow(member, "Design", rows);
  return { ...row, document: parseDocument(row.document) };
}


/** Equipment of the design, checked against the company's catalog (422 naming the field). */
export async function designEquipment(member: Member, moduleId: string, inverterId: string, fieldPrefix = "document."): Promise<{ mod: ModuleModel; inv: InverterModel }> {
  const mod = await getModuleOrThrow(member.companyId, moduleId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? fieldError(`${fieldPrefix}moduleId`, "Pick a module from the catalog") : err;
  });
  const inv = await getInverterOrThrow(member.companyId, inverterId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? fieldError(`${fieldPrefix}inverterId`, "Pick an inverter from the catalog") : err;
  });
  return { mod, inv };
}

async function checkStation(companyId: string, stationId: string): Promise<void> {
  const [row] = await db()
    .select({ id: weatherStation.id })
    .from(weatherStation)
    .where(and(eq(weatherStation.id, stationId), eq(weatherStation.companyId, companyId)))
    .limit(1);
  if (!row) throw fieldError("document.weather.stationId", "Pick a weather station from the list");
}

/** Saves the deal's design (one per deal; saving replaces it), with a timeline event. */
export async function saveDesign(member: Member, input: unknown): Promise<DesignRecord> {
  const parsed = saveDesignSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const { dealId, document } = parsed.data;
  const scope = await openDeal(member, dealId);
  const { mod, inv } = await designEquipment(member, document.moduleId, document.inverterId);
  if (document.weather.kind === "station") await checkStation(member.companyId, document.weather.stationId);
  const stationId = document.weather.kind === "station" ? document.weather.stationId : null;
  const modules = document.faces.reduce((s, f) => s + f.moduleCount, 0);
  const kw = (modules * mod.stcWatts) / 1000;
  await transaction(async (tx) => {
    const [existing] = await tx
      .select({ id: design.id })
      .from(design)
      .where(and(eq(design.companyId, member.companyId), eq(design.dealId, dealId)))
      .limit(1);
    if (existing) {
      await tx
        .update(design)
        .set({ document, weatherStationId: stationId, revision: sql`${design.revision} + 1` })
        .where(and(eq(design.id, existing.id), eq(design.companyId, member.companyId)));
    } else {
      await tx.insert(design).values({ id: crypto.randomUUID(), companyId: member.companyId, dealId, document, weatherStationId: stationId });
    }
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "design.saved",
      summary: `Design saved by ${member.name}: ${modules} × ${mod.manufacturer} ${mod.model} (${kw.toFixed(2)} kW DC), ${inv.manufacturer} ${inv.model}`,
      actorUserId: member.userId,
      data: { modules, kwDc: kw },
    });
    // The first saved design moves a lead or a deal with bills to Designing (never back from later).
    await autoMoveStage(tx, {
      companyId: member.companyId,
      dealId,
      from: ["lead", "bills_in"],
      to: "designing",
      summary: `Moved to Designing: design saved (${modules} modules, ${kw.toFixed(2)} kW DC)`,
      actorUserId: member.userId,
      data: { cause: "design" },
    });
  });
  const saved = await getDesignForDeal(scope);
  if (!saved) throw new Error("design vanished right after saving");
  return saved;
}

// ── What the Design tab loads once ───────────────────────────────────────────────────────

export type StationOption = { id: string; name: string; distanceKm: number; attribution: string };

export type DesignInputs = {
  dealId: string;
  site: { latitude: number; longitude: number };
  usage: { monthlyKwh: number[]; annualKwh: number; source: "bills" | "interval" | "none"; estimatedMonths: boolean[] };
  modules: ModuleModel[];
  inverters: InverterModel[];
  stations: StationOption[];
  nearest: { stationId: string; distanceKm: number } | null;
  maxStationDistanceKm: number;
  design: DesignRecord | null;
};

export async function listStationOptions(companyId: string, site: { latitude: number; longitude: number }): Promise<StationOption[]> {
  const rows = await db()
    .select({ id: weatherStation.id, name: weatherStation.name, latitude: weatherStation.latitude, longitude: weatherStation.longitude, attribution: weatherStation.attribution })
    .from(weatherStation)
    .where(eq(weatherStation.companyId, companyId))
    .orderBy(asc(weatherStation.name));
  return rows
    .map((r) => ({ id: r.id, name: r.name, attribution: r.attribution, distanceKm: Math.round(haversineKm(site, r) * 10) / 10 }))
    .sort((a, b) => a.distanceKm - b.distanceKm);
}

export async function getDesignInputs(scope: DealScope): Promise<DesignInputs> {
  const { member, dealId } = scope;
  const site = { latitude: scope.household.latitude, longitude: scope.household.longitude };
  const [usage, modules, inverters, stations, nearest, saved] = await Promise.all([
    getDealUsage(scope),
    listActiveModules(member.companyId),
    listActiveInverters(member.companyId),
    listStationOptions(member.companyId, site),
    nearestStation(member.companyId, site.latitude, site.longitude),
    getDesignForDeal(scope),
  ]);
  // A saved design may use equipment deactivated since: keep it pickable for this design.
  if (saved) {
    if (!modules.some((m) => m.id === saved.document.moduleId)) modules.push(await getModuleOrThrow(member.companyId, saved.document.moduleId));
    if (!inverters.some((i) => i.id === saved.document.inverterId)) inverters.push(await getInverterOrThrow(member.companyId, saved.document.inverterId));
  }
  return {
    dealId,
    site,
    usage: { monthlyKwh: usage.monthlyKwh, annualKwh: usage.annualKwh, source: usage.source, estimatedMonths: usage.estimatedMonths },
    modules,
    inverters,
    stations,
    nearest: nearest ? { stationId: nearest.station.id, distanceKm: Math.round(nearest.distanceKm * 10) / 10 } : null,
    maxStationDistanceKm: MAX_STATION_DISTANCE_KM,
    design: saved,
  };
}

/** A station's typical year as plain columns for the browser's engine (rounded: W/m² to 0.1, °C and m/s to 0.1). */
export type WeatherColumns = {
  stationId: string;
  sourceLabel: string;
  format: WeatherYear["format"];
  site: WeatherYear["site"];
  month: number[];
  day: number[];
  hour: number[];
  ghi: number[];
  dni: number[];
  dhi: number[];
  tempAirC: number[];
  windSpeedMs: number[];
  albedo: number[];
};

const r1 = (xs: ArrayLike<number>) => Array.from(xs, (x) => Math.round(x * 10) / 10);
const r3 = (xs: ArrayLike<number>) => Array.from(xs, (x) => Math.round(x * 1000) / 1000);

export async function getWeatherColumns(scope: DealScope, stationId: string): Promise<WeatherColumns> {
  const w = await loadStationWeather(scope.companyId, stationId);
  return {
    stationId,
    sourceLabel: w.sourceLabel,
    format: w.format,
    site: w.site,
    month: Array.from(w.month),
    day: Array.from(w.day),
    hour: Array.from(w.hour),
    ghi: r1(w.ghi),
    dni: r1(w.dni),
    dhi: r1(w.dhi),
    tempAirC: r1(w.tempAirC),
    windSpeedMs: r1(w.windSpeedMs),
    albedo: r3(w.albedo),
  };
}

// ── Production on the server (offers) ────────────────────────────────────────────────────

/** `station`: where the typical year was measured (absent for a figure typed from another source). */
export type ServerProduction = { hourlyKwh: Float64Array; label: string; notes: string[]; station?: WeatherStationPlace };

/**
 * Year-1 hourly production for a design's faces with the given module counts and equipment:
 * from the chosen or nearest station's typical year, or the figure typed from another source.
 * Throws 422 when no station covers the site and no figure was typed.
 */
export async function productionForDesign(
  member: Member,
  site: { latitude: number; longitude: number },
  doc: DesignDocument,
  counts: number[],
  mod: ModuleSpec,
  inv: InverterSpec,
): Promise<ServerProduction> {
  const totalModules = counts.reduce((a, b) => a + b, 0);
  if (doc.weather.kind === "manual") {
    // The typed figure describes the design as saved; scale it by the offer's DC size.
    const designModules = doc.faces.reduce((s, f) => s + f.moduleCount, 0);
    const scale = designModules > 0 ? totalModules / designModules : 0;
    const monthly = doc.weather.monthlyKwh ? doc.weather.monthlyKwh.map((v) => v * scale) : null;
    return {
      hourlyKwh: manualProductionHourly(doc.weather.annualKwh * scale, monthly),
      label: `Typed from another source: ${doc.weather.source}`,
      notes: [MANUAL_SHAPE_NOTE, ...(scale !== 1 ? [`The typed figure was scaled by ${scale.toFixed(3)} for this offer's module count.`] : [])],
    };
  }
  let stationId: string;
  if (doc.weather.kind === "station") stationId = doc.weather.stationId;
  else {
    const near = await nearestStation(member.companyId, site.latitude, site.longitude);
    if (!near) {
      throw new HttpError(
        422,
        "no_weather",
        `No weather station lies within ${MAX_STATION_DISTANCE_KM} km of this site. On the Design tab, type an annual production figure from another source.`,
      );
    }
    stationId = near.station.id;
  }
  const weather = await loadStationWeather(member.companyId, stationId);
  const sys = engineSystem(doc.faces, counts, mod, inv, { inverterCount: doc.inverterCount, lossesPct: doc.lossesPct });
  if (!sys) throw fieldError("faceCounts", "Place at least one module");
  const result = estimateProduction(weather, sys);
  const hourlyKwh = new Float64Array(result.hourlyAcW.length);
  for (let i = 0; i < hourlyKwh.length; i++) hourlyKwh[i] = result.hourlyAcW[i] / 1000;
  return { hourlyKwh, label: weather.sourceLabel, notes: [], station: { name: weather.site.name ?? weather.sourceLabel, latitude: weather.site.latitude, longitude: weather.site.longitude } };
}
