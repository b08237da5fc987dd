/**
 * Hourly production of a rooftop system over a typical weather year: several roof faces, each
 * transposed to its own plane (irradiance.ts), its own cell temperature and DC power (pvwatts.ts),
 * then a string inverter shared by all faces or a microinverter per module.
 *
 * Speed: sun positions and the face-independent sky terms are computed once per weather year and
 * model and cached (WeakMap on the WeatherYear object); each face is then a few tight loops over
 * Float64Arrays.
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { allocateColumns, planeOfArray, prepareSky, type SkyYear, type TranspositionModel } from "./irradiance";
import {
  DEFAULT_LOSSES_PCT,
  MODULE_GAMMA_PER_C,
  MOUNT_INOCT_C,
  PVWATTS_ETA_REFERENCE,
  combinedLossPct,
  fuentesCellTemperatureMany,
  lossBreakdownSchema,
  pvwattsInverter,
} from "./pvwatts";
import { sunPositionsForYear, type SunPositionsYear } from "./solar-position";
import { meanTemperatureC, type WeatherYear } from "./weather";
import { HOURS_PER_YEAR, HOUR_MONTH, monthlySums } from "./year-calendar";

/** Yearly output decline, %/yr: the median of Jordan & Kurtz (2013), "Photovoltaic Degradation Rates — An Analytical Review", Prog. Photovolt. 21:12–29. */
export const DEFAULT_DEGRADATION_PCT_PER_YEAR = 0.5;

const solarAccessSchema = z.union([
  z.number().finite().min(0).max(100),
  z.array(z.number().finite().min(0).max(100)).length(12, "give 12 monthly values (January first)"),
]);

export const roofFaceSchema = z
  .object({
    name: z.string().max(100).optional(),
    tiltDeg: z.number().finite().min(0).max(90),
    /** Degrees eastward from north: 90 east, 180 south, 270 west. */
    azimuthDeg: z.number().finite().min(0).max(360),
    moduleCount: z.number().int().min(1).max(1000),
    /** Module nameplate at STC, W. */
    moduleWatts: z.number().finite().min(10).max(1500),
    /** Share of the open-sky irradiance the face receives after shading, % (annual, or 12 monthly values). */
    solarAccessPct: solarAccessSchema.default(100),
    /** Module type (PVWatts γ) — or give `gammaPctPerC` from a catalog module instead. */
    moduleType: z.enum(["standard", "premium", "thin-film"]).default("standard"),
    /** Temperature coefficient of Pmax from the module's datasheet, %/°C (overrides moduleType). */
    gammaPctPerC: z.number().finite().min(-1).max(0).optional(),
    mount: z.enum(["roof", "open-rack"]).default("roof"),
  })
  .strict();

const inverterSchema = z.discriminatedUnion("kind", [
  z
    .object({
      kind: z.literal("string"),
      /** Total AC rating, kW. When absent, DC kW / dcAcRatio. */
      acKw: z.number().finite().positive().max(10_000).optional(),
      dcAcRatio: z.number().finite().min(0.5).max(3).default(1.2),
      /** Nominal efficiency, %. */
      efficiencyPct: z.number().finite().min(80).max(99.5).default(96),
    })
    .strict(),
  z
    .object({
      kind: z.literal("micro"),
      /** AC rating of each module's microinverter, W. */
      acWattsPerModule: z.number().finite().positive().max(2000),
      efficiencyPct: z.number().finite().min(80).max(99.5).default(96.5),
    })
    .strict(),
]);

export const systemSchema = z
  .object({
    faces: z.array(roofFaceSchema).min(1).max(24),
    inverter: inverterSchema.default({ kind: "string", dcAcRatio: 1.2, efficiencyPct: 96 }),
    /**
     * Either a loss breakdown (unlisted categories take the PVWatts defaults) or one combined %.
     * Faces' solar access already removes shade from the POA: with measured access, set the
     * breakdown's `shading` to 0 so shade is not counted twice.
     */
    losses: z.union([lossBreakdownSchema, z.object({ totalPct: z.number().finite().min(0).max(99) }).strict()]).default({}),
    transposition: z.enum(["perez", "haydavies", "isotropic"]).default("perez"),
    /** Ground reflectance for every hour, overriding the weather file's. */
    albedo: z.number().finite().min(0).max(1).optional(),
  })
  .strict();

export type SystemDesign = z.input<typeof systemSchema>;

/** A face's hourly series (only with `{ faceHours: true }`). */
export type FaceHours = {
  /** POA irradiance (after solar access), W/m². */
  poa: Float64Array;
  cellTempC: Float64Array;
  /** DC power after system losses, W. */
  dcW: Float64Array;
};

export type FaceResult = {
  name: string;
  dcKw: number;
  annualPoaKwhPerM2: number;
  annualDcKwh: number;
  monthlyDcKwh: number[];
  hours?: FaceHours;
};

export type EstimateOptions = {
  /** Also return each face's hourly POA, cell temperature and DC (3 × 8760 numbers per face). */
  faceHours?: boolean;
};

export type ProductionResult = {
  dcKw: number;
  acKw: number;
  lossPct: number;
  faces: FaceResult[];
  /** System DC (after losses) and AC, W, for the 8760 hours. */
  hourlyDcW: Float64Array;
  hourlyAcW: Float64Array;
  monthlyAcKwh: number[];
  annualAcKwh: number;
  annualDcKwh: number;
  /** DC-capacity-weighted POA of the faces, kWh/m². */
  annualPoaKwhPerM2: number;
  /** AC energy lost to clipping at the inverter rating, kWh. */
  clippedKwh: number;
  /** Specific yield, kWh AC per kW DC. */
  kwhPerKw: number;
};

// ---------------------------------------------------------------- caches

const sunCache = new WeakMap<WeatherYear, SunPositionsYear>();
const skyCache = new WeakMap<WeatherYear, Map<TranspositionModel, SkyYear>>();

/** Sun positions for a weather year, computed once per WeatherYear object. */
export function sunForWeather(weather: WeatherYear): SunPositionsYear {
  let sun = sunCache.get(weather);
  if (!sun) {
    sun = sunPositionsForYear(weather.site, { temperatureC: meanTemperatureC(weather) });
    sunCache.set(weather, sun);
  }
  return sun;
}

function skyForWeather(weather: WeatherYear, model: TranspositionModel): SkyYear {
  let byModel = skyCache.get(weather);
  if (!byModel) {
    byModel = new Map();
    skyCache.set(weather, byModel);
  }
  let sky = byModel.get(model);
  if (!sky) {
    sky = prepareSky(weather, sunForWeather(weather), model);
    byModel.set(model, sky);
  }
  return sky;
}

/** Forget cached sun positions and sky terms (for benchmarks that time the cold path). */
export function clearProductionCache(weather: WeatherYear): void {
  sunCache.delete(weather);
  skyCache.delete(weather);
}

// ---------------------------------------------------------------- model

/**
 * Working columns, reused from call to call: allocating ~0.5 MB of fresh typed arrays per
 * estimate costs more than the whole model (page faults and GC of large buffers). Never handed to
 * callers; estimates run synchronously, so no two calls share them at once. `sharedScratch`:
 * beam, sky diffuse and ground parts of the POA and a face's DC (used one face at a time);
 * `faceScratch(g)`: POA, transmitted POA and cell temperature of the g-th face of a group.
 */
const FACE_GROUP = 4;
let shared: Float64Array[] | null = null;
function sharedScratch(): Float64Array[] {
  shared ??= allocateColumns(4);
  return shared;
}
const perFace: Float64Array[][] = [];
function faceScratch(g: number): Float64Array[] {
  perFace[g] ??= allocateColumns(3);
  return perFace[g];
}

type ParsedSystem = z.output<typeof systemSchema>;
type ParsedFace = ParsedSystem["faces"][number];
type MicroInverter = Extract<ParsedSystem["inverter"], { kind: "micro" }>;
type StringInverter = Extract<ParsedSystem["inverter"], { kind: "string" }>;
/** One face's hourly columns: POA, transmitted POA, cell temperature, DC; `own` when they are handed back to the caller. */
type FaceColumns = { poa: Float64Array; tr: Float64Array; cellTempC: Float64Array; dcW: Float64Array; own: Float64Array[] | null };

/** Scales a face's POA and transmitted POA by its solar access (one value, or one per month). */
function applySolarAccess(poa: Float64Array, tr: Float64Array, access: number | number[]): void {
  const n = HOURS_PER_YEAR;
  if (typeof access === "number") {
    if (access !== 100) {
      const f = access / 100;
      for (let i = 0; i < n; i++) {
        poa[i] *= f;
        tr[i] *= f;
      }
    }
  } else {
    const monthF = access.map((a) => a / 100);
    for (let i = 0; i < n; i++) {
      const f = monthF[HOUR_MONTH[i]];
      poa[i] *= f;
      tr[i] *= f;
    }
  }
}

/** The g-th face of a group: its POA after solar access, in scratch columns or (faceHours) its own. */
function faceColumns(sky: SkyYear, face: ParsedFace, albedo: number | undefined, gi: number, faceHours: boolean, work: Float64Array[]): FaceColumns {
  const cols = faceScratch(gi);
  const own = faceHours ? allocateColumns(3, HOURS_PER_YEAR) : null;
  const plane = planeOfArray(sky, face.tiltDeg, face.azimuthDeg, albedo, {
    poa: own ? own[0] : cols[0],
    poaTransmitted: cols[1],
    beam: work[0],
    skyDiffuse: work[1],
    ground: work[2],
  });
  applySolarAccess(plane.poa, plane.poaTransmitted, face.solarAccessPct);
  return { poa: plane.poa, tr: plane.poaTransmitted, cellTempC: own ? own[1] : cols[2], dcW: own ? own[2] : work[3], own };
}

/**
 * A face's DC after losses, added into the system's hourly DC (and, with microinverters, its
 * hourly AC); `k` is the face's index, for its default name.
 */
function faceDc(face: ParsedFace, k: number, c: FaceColumns, keep: number, micro: MicroInverter | null, hourlyDcW: Float64Array, hourlyAcW: Float64Array): FaceResult {
  const n = HOURS_PER_YEAR;
  const { poa, tr, cellTempC, dcW, own } = c;
  const faceDcW0 = face.moduleCount * face.moduleWatts;
  const gamma = face.gammaPctPerC !== undefined ? face.gammaPctPerC / 100 : MODULE_GAMMA_PER_C[face.moduleType];
  let poaSum = 0;
  let dcSum = 0;
  // monthly DC summed in the same loop (same order of additions as monthlySums)
  const monthlyDcWh = [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];
  const scale = (faceDcW0 / 1000) * keep;
  for (let i = 0; i < n; i++) {
    poaSum += poa[i];
    const t = tr[i];
    if (t <= 0) {
      dcW[i] = 0;
      continue;
    }
    let p = t * scale * (1 + gamma * (cellTempC[i] - 25));
    if (p < 0) p = 0;
    dcW[i] = p;
    dcSum += p;
    hourlyDcW[i] += p;
    monthlyDcWh[HOUR_MONTH[i]] += p;
  }
  if (micro) {
    // Every module on a face sees the same irradiance: one module's inverter times the count.
    const eta = micro.efficiencyPct / 100;
    const pdc0 = micro.acWattsPerModule / eta;
    const m = face.moduleCount;
    for (let i = 0; i < n; i++) if (dcW[i] > 0) hourlyAcW[i] += m * pvwattsInverter(dcW[i] / m, pdc0, eta, PVWATTS_ETA_REFERENCE);
  }
  return {
    name: face.name ?? `Face ${k + 1}`,
    dcKw: faceDcW0 / 1000,
    annualPoaKwhPerM2: poaSum / 1000,
    annualDcKwh: dcSum / 1000,
    monthlyDcKwh: monthlyDcWh.map((wh) => wh / 1000),
    ...(own && { hours: { poa, cellTempC, dcW } }),
  };
}

/** One string inverter for the whole system: hourly AC into `hourlyAcW`, its rating, monthly AC and the energy clipped. */
function stringInverterAc(inv: StringInverter | null, dcKw: number, hourlyDcW: Float64Array, hourlyAcW: Float64Array): { acKw: number; monthlyAcWh: number[]; clippedWh: number } {
  const eta = (inv?.efficiencyPct ?? 96) / 100;
  const acKw = inv?.acKw ?? dcKw / (inv?.dcAcRatio ?? 1.2);
  const pac0 = acKw * 1000;
  const pdc0 = pac0 / eta;
  const monthlyAcWh = [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]; // summed in the loop, in monthlySums' order
  let clippedWh = 0;
  for (let i = 0; i < HOURS_PER_YEAR; i++) {
    const dc = hourlyDcW[i];
    if (dc <= 0) continue;
    const ac = pvwattsInverter(dc, pdc0, eta, PVWATTS_ETA_REFERENCE);
    hourlyAcW[i] = ac;
    monthlyAcWh[HOUR_MONTH[i]] += ac;
    if (ac >= pac0) {
      // what the efficiency curve would have given without the limit
      const zeta = dc / pdc0;
      const unclipped = (eta / PVWATTS_ETA_REFERENCE) * (-0.0162 * zeta - 0.0059 / zeta + 0.9858) * dc;
      clippedWh += unclipped - pac0;
    }
  }
  return { acKw, monthlyAcWh, clippedWh };
}

/** Hourly production of a system on a weather year. Throws EngineInputError naming each bad field. */
export function estimateProduction(weather: WeatherYear, design: SystemDesign, options: EstimateOptions = {}): ProductionResult {
  const sys = parseOrThrow(systemSchema, design, "system design");
  if (weather.ghi.length !== HOURS_PER_YEAR) {
    throw new EngineInputError([{ path: "weather", message: `expected ${HOURS_PER_YEAR} hours, got ${weather.ghi.length}` }], "production");
  }
  const lossPct = "totalPct" in sys.losses ? sys.losses.totalPct : combinedLossPct(sys.losses);
  const keep = 1 - lossPct / 100;
  const sky = skyForWeather(weather, sys.transposition);

  const [hourlyDcW, hourlyAcW] = allocateColumns(2, HOURS_PER_YEAR);
  const work = sharedScratch();
  const faces: FaceResult[] = [];
  let dcKw = 0;
  let weightedPoa = 0;
  const micro = sys.inverter.kind === "micro" ? sys.inverter : null;

  // Faces go through in groups of up to FACE_GROUP: the POA of each face of a group, then their
  // cell temperatures side by side (fuentesCellTemperatureMany), then each face's DC in order.
  for (let g0 = 0; g0 < sys.faces.length; g0 += FACE_GROUP) {
    const group = sys.faces.slice(g0, g0 + FACE_GROUP);
    const groupCols = group.map((face, gi) => faceColumns(sky, face, sys.albedo, gi, options.faceHours ?? false, work));
    fuentesCellTemperatureMany(
      groupCols.map((c) => c.poa),
      weather.tempAirC,
      weather.windSpeedMs,
      group.map((face) => MOUNT_INOCT_C[face.mount]),
      groupCols.map((c) => c.cellTempC),
    );
    group.forEach((face, gi) => {
      const faceDcW0 = face.moduleCount * face.moduleWatts;
      dcKw += faceDcW0 / 1000;
      const result = faceDc(face, g0 + gi, groupCols[gi], keep, micro, hourlyDcW, hourlyAcW);
      weightedPoa += result.annualPoaKwhPerM2 * faceDcW0;
      faces.push(result);
    });
  }

  let acKw: number;
  let clippedWh = 0;
  let monthlyAcWh: number[];
  if (micro) {
    monthlyAcWh = monthlySums(hourlyAcW);
    acKw = (micro.acWattsPerModule * sys.faces.reduce((s, f) => s + f.moduleCount, 0)) / 1000;
  } else {
    ({ acKw, monthlyAcWh, clippedWh } = stringInverterAc(sys.inverter.kind === "string" ? sys.inverter : null, dcKw, hourlyDcW, hourlyAcW));
  }
  const monthlyAcKwh = monthlyAcWh.map((wh) => wh / 1000);
  const annualAcKwh = monthlyAcKwh.reduce((s, v) => s + v, 0);
  const annualDcKwh = faces.reduce((s, f) => s + f.annualDcKwh, 0);
  return {
    dcKw,
    acKw,
    lossPct,
    faces,
    hourlyDcW,
    hourlyAcW,
    monthlyAcKwh,
    annualAcKwh,
    annualDcKwh,
    annualPoaKwhPerM2: dcKw > 0 ? weightedPoa / (dcKw * 1000) : 0,
    clippedKwh: clippedWh / 1000,
    kwhPerKw: dcKw > 0 ? annualAcKwh / dcKw : 0,
  };
}

/** Production in year `year` (1 = first year) after yearly degradation: annual·(1 − rate)^(year − 1). */
export function productionInYear(firstYearKwh: number, year: number, degradationPctPerYear = DEFAULT_DEGRADATION_PCT_PER_YEAR): number {
  const issues = [];
  if (!Number.isFinite(firstYearKwh) || firstYearKwh < 0) issues.push({ path: "firstYearKwh", message: "must be a number ≥ 0" });
  if (!Number.isInteger(year) || year < 1 || year > 100) issues.push({ path: "year", message: "must be a whole number from 1 to 100" });
  if (!Number.isFinite(degradationPctPerYear) || degradationPctPerYear < 0 || degradationPctPerYear > 20) {
    issues.push({ path: "degradationPctPerYear", message: "must be from 0 to 20 %/yr" });
  }
  if (issues.length) throw new EngineInputError(issues, "degradation");
  return firstYearKwh * Math.pow(1 - degradationPctPerYear / 100, year - 1);
}

/** Production for years 1…years after degradation. */
export function productionByYear(firstYearKwh: number, years: number, degradationPctPerYear = DEFAULT_DEGRADATION_PCT_PER_YEAR): number[] {
  return Array.from({ length: years }, (_, k) => productionInYear(firstYearKwh, k + 1, degradationPctPerYear));
}

export { DEFAULT_LOSSES_PCT };
