/**
 * Typical-year weather files → one normalized hourly structure.
 *
 * Formats read:
 *  - EPW, EnergyPlus Weather (U.S. DOE, "Auxiliary Programs" manual, chapter "Weather Converter
 *    Program", EPW data dictionary). Header line LOCATION carries lat, lon, time zone, elevation.
 *  - NREL TMY3 CSV (Wilcox & Marion 2008, "Users Manual for TMY3 Data Sets", NREL/TP-581-43156):
 *    line 1 = station id, name, state, UTC offset, lat, lon, elevation; line 2 = column names.
 *  - A generic hourly CSV with named columns `month,day,hour,ghi,dni,dhi,temp_air,wind_speed`
 *    (any order; `ghi` optional; `albedo` optional), with the site given beside it.
 *
 * Time convention (docs/weather-conventions.md): row i of the result covers the hour
 * [hour, hour+1) local standard time of its month/day; EPW hour 1 and TMY3 "01:00" (hour-ending
 * stamps) are hour 0. Sun positions for the hour are taken at its middle (solar-position.ts).
 * 29 February is dropped. Rows are placed by their month/day/hour, so every hour of the
 * 365-day year must appear exactly once.
 */
import { offsetContradiction, sunTimingShiftHours, sunTimingWarning } from "./weather-timing";
import { z } from "zod";
import { isBlankRecord, readCsvRecords, type CsvRecord } from "./csv";
import { EngineInputError, parseOrThrow, type EngineIssue } from "./errors";
import { sunPositionsForYear } from "./solar-position";
import { HOURS_PER_YEAR, MONTH_DAYS, MONTH_START_DAY } from "./year-calendar";

export type WeatherFormat = "epw" | "tmy3" | "csv";

export type WeatherSite = {
  latitude: number;
  longitude: number;
  elevationM: number;
  /** Local standard time − UTC, hours (Denver −7). */
  utcOffsetHours: number;
  name?: string;
};

/** A typical weather year on the 8760-hour grid of year-calendar.ts (hour 0 = 1 Jan 00:00–01:00 LST). */
export type WeatherYear = {
  format: WeatherFormat;
  /** Where the data came from, e.g. "TMY3 723170 GREENSBORO PIEDMONT TRIAD INT, NC". */
  sourceLabel: string;
  site: WeatherSite;
  /** Where the file's header puts its station, before any site given in the options (null when it names none). */
  station?: { latitude: number; longitude: number } | null;
  month: Uint8Array; // 1–12
  day: Uint8Array; // 1–31
  hour: Uint8Array; // 0–23, the hour's start
  /** Global horizontal irradiance, W/m² (hour mean). */
  ghi: Float64Array;
  /** Direct normal irradiance, W/m². */
  dni: Float64Array;
  /** Diffuse horizontal irradiance, W/m². */
  dhi: Float64Array;
  /** Dry-bulb air temperature, °C. */
  tempAirC: Float64Array;
  /** Wind speed, m/s (at the station's measurement height, usually 10 m). */
  windSpeedMs: Float64Array;
  /** Ground reflectance, 0–1 (file value where valid, else DEFAULT_ALBEDO). */
  albedo: Float64Array;
  /** True when GHI was derived as DNI·cos(zenith) + DHI. */
  ghiDerived: boolean;
  /** Hours whose albedo came from the file (the rest use DEFAULT_ALBEDO). */
  albedoFromFileHours: number;
  /** How far (h, + = later) the sunshine sits from solar noon at the stated offset (weather-timing.ts); null without sun. */
  timingShiftHours?: number | null;
  /** Notes for the user, e.g. "dropped 24 rows of 29 February". */
  notes: string[];
};

/** Ground reflectance used when the file gives none: 0.2, the customary grass/soil value (e.g. PVWatts v5 default, Dobos 2014). */
export const DEFAULT_ALBEDO = 0.2;

/**
 * Physical limits for hourly means. Irradiance: the solar constant (≈1361 W/m², Kopp & Lean 2011)
 * bounds DNI; cloud enhancement can push hourly GHI slightly above it. Temperature: the recorded
 * extremes −89.2 °C and 56.7 °C (WMO archive, from memory) with margin. Wind: hourly mean.
 */
export const LIMITS = {
  ghi: { min: 0, max: 1500, unit: "W/m²" },
  dni: { min: 0, max: 1400, unit: "W/m²" },
  dhi: { min: 0, max: 1000, unit: "W/m²" },
  temp_air: { min: -90, max: 60, unit: "°C" },
  wind_speed: { min: 0, max: 50, unit: "m/s" },
} as const;
/** Small negative irradiance (sensor night offset) is read as 0; anything below this is an error. */
const NEGATIVE_IRRADIANCE_TOLERANCE = -10;
/** Most issues reported from one file; the rest are counted. */
const MAX_ISSUES = 50;

type Field = keyof typeof LIMITS;

export const weatherSiteSchema = z.object({
  latitude: z.number().finite().min(-90).max(90),
  longitude: z.number().finite().min(-180).max(180),
  elevationM: z.number().finite().min(-500).max(9000),
  utcOffsetHours: z.number().finite().min(-12).max(14),
  name: z.string().max(200).optional(),
});

export type ParseWeatherOptions = {
  format?: WeatherFormat;
  /** Required for the generic CSV; for EPW/TMY3 it overrides the header's values field by field. */
  site?: Partial<WeatherSite>;
  /** Label for the result (defaults to one built from the header). */
  sourceLabel?: string;
};

/** Guess the format from the content. */
export function detectWeatherFormat(text: string): WeatherFormat {
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/, 3);
  if (/^LOCATION,/i.test(lines[0] ?? "")) return "epw";
  if (/^Date \(MM\/DD\/YYYY\)/i.test(lines[1] ?? "")) return "tmy3";
  return "csv";
}

/** Collects issues with file line numbers and stops collecting past MAX_ISSUES. */
class IssueList {
  readonly list: EngineIssue[] = [];
  private dropped = 0;
  add(line: number | null, message: string): void {
    if (this.list.length < MAX_ISSUES) this.list.push({ path: line === null ? "file" : `line ${line}`, message });
    else this.dropped++;
  }
  throwIfAny(context: string): void {
    if (this.list.length === 0) return;
    if (this.dropped) this.list.push({ path: "file", message: `${this.dropped} more issues not listed` });
    throw new EngineInputError(this.list, context);
  }
}

/** One parsed data row before placement on the year grid. */
type RawRow = {
  line: number;
  month: number;
  day: number;
  hour: number; // 0–23, hour start
  ghi: number | null;
  dni: number;
  dhi: number;
  temp: number;
  wind: number;
  albedo: number | null;
};

function num(s: string | undefined): number {
  if (s === undefined) return Number.NaN;
  const t = s.trim();
  return t === "" ? Number.NaN : Number(t);
}

/** Range-check one value; returns the value to store or NaN after recording an issue. */
function checkValue(issues: IssueList, line: number, field: Field, v: number, missingCode?: number): number {
  const lim = LIMITS[field];
  if (!Number.isFinite(v)) {
    issues.add(line, `${field} is not a number`);
    return Number.NaN;
  }
  if (missingCode !== undefined && v === missingCode) {
    issues.add(line, `${field} is missing (code ${missingCode})`);
    return Number.NaN;
  }
  const isIrradiance = field === "ghi" || field === "dni" || field === "dhi";
  if (isIrradiance && v < 0 && v >= NEGATIVE_IRRADIANCE_TOLERANCE) return 0;
  if (v < lim.min || v > lim.max) {
    issues.add(line, `${field} ${v} ${lim.unit} is outside ${lim.min}–${lim.max} ${lim.unit}`);
    return Number.NaN;
  }
  return v;
}

function validAlbedo(v: number): number | null {
  return Number.isFinite(v) && v > 0 && v < 1 ? v : null;
}

// ---------------------------------------------------------------- EPW
// EPW data fields (0-based): 1 month, 2 day, 3 hour 1–24 (hour ending), 6 dry bulb °C,
// 13 GHI Wh/m², 14 DNI Wh/m², 15 DHI Wh/m², 21 wind speed m/s, 32 albedo (missing 999).
// Missing-value codes per the EPW data dictionary: radiation 9999, dry bulb 99.9, wind 999.
const EPW = { month: 1, day: 2, hour: 3, temp: 6, ghi: 13, dni: 14, dhi: 15, wind: 21, albedo: 32, minFields: 22 };
const EPW_HEADER_LINES = 8;

function parseEpw(records: CsvRecord[], issues: IssueList): { site: Partial<WeatherSite>; label: string; rows: RawRow[] } {
  const loc = records[0]?.cells ?? [];
  const site: Partial<WeatherSite> = {
    name: [loc[1], loc[2], loc[3]].filter((x) => x && x.trim() && x.trim() !== "-" && x.trim() !== "unknown").join(", ") || undefined,
    latitude: num(loc[6]),
    longitude: num(loc[7]),
    utcOffsetHours: num(loc[8]),
    elevationM: num(loc[9]),
  };
  const dataStart = records.findIndex((r) => /^DATA PERIODS/i.test(r.cells[0])) + 1 || EPW_HEADER_LINES;
  const rows: RawRow[] = [];
  for (const record of records.slice(dataStart)) {
    if (isBlankRecord(record)) continue;
    const { line, cells: f } = record;
    if (f.length < EPW.minFields) {
      issues.add(line, `expected at least ${EPW.minFields} fields, found ${f.length}`);
      continue;
    }
    const hour = num(f[EPW.hour]);
    rows.push({
      line,
      month: num(f[EPW.month]),
      day: num(f[EPW.day]),
      hour: hour - 1,
      ghi: checkValue(issues, line, "ghi", num(f[EPW.ghi]), 9999),
      dni: checkValue(issues, line, "dni", num(f[EPW.dni]), 9999),
      dhi: checkValue(issues, line, "dhi", num(f[EPW.dhi]), 9999),
      temp: checkValue(issues, line, "temp_air", num(f[EPW.temp]), 99.9),
      wind: checkValue(issues, line, "wind_speed", num(f[EPW.wind]), 999),
      albedo: validAlbedo(num(f[EPW.albedo])),
    });
  }
  return { site, label: `EPW ${site.name ?? "station"} (${loc[4]?.trim() || "unknown source"})`, rows };
}

// ---------------------------------------------------------------- TMY3
const TMY3_COLUMNS = {
  date: "Date (MM/DD/YYYY)",
  time: "Time (HH:MM)",
  ghi: "GHI (W/m^2)",
  dni: "DNI (W/m^2)",
  dhi: "DHI (W/m^2)",
  temp: "Dry-bulb (C)",
  wind: "Wspd (m/s)",
  albedo: "Alb (unitless)",
} as const;

function parseTmy3(records: CsvRecord[], issues: IssueList): { site: Partial<WeatherSite>; label: string; rows: RawRow[] } {
  const meta = records[0]?.cells ?? [];
  const site: Partial<WeatherSite> = {
    name: `${meta[1]?.trim() ?? ""}${meta[2]?.trim() ? `, ${meta[2].trim()}` : ""}` || undefined,
    utcOffsetHours: num(meta[3]),
    latitude: num(meta[4]),
    longitude: num(meta[5]),
    elevationM: num(meta[6]),
  };
  const header = (records[1]?.cells ?? []).map((h) => h.trim());
  const col = {} as Record<keyof typeof TMY3_COLUMNS, number>;
  for (const [key, name] of Object.entries(TMY3_COLUMNS) as [keyof typeof TMY3_COLUMNS, string][]) {
    col[key] = header.indexOf(name);
    // Units are part of the column name; a different unit is a different column.
    if (col[key] < 0 && key !== "albedo") issues.add(2, `column "${name}" not found (units must match)`);
  }
  issues.throwIfAny("TMY3 weather file");
  const rows: RawRow[] = [];
  for (const record of records.slice(2)) {
    if (isBlankRecord(record)) continue;
    const { line, cells: f } = record;
    const date = /^(\d{1,2})\/(\d{1,2})\/\d{4}$/.exec(f[col.date]?.trim() ?? "");
    const time = /^(\d{1,2}):(\d{2})$/.exec(f[col.time]?.trim() ?? "");
    if (!date || !time) {
      issues.add(line, `date/time "${f[col.date]} ${f[col.time]}" is not MM/DD/YYYY HH:MM`);
      continue;
    }
    rows.push({
      line,
      month: Number(date[1]),
      day: Number(date[2]),
      hour: Number(time[1]) - 1, // "01:00" ends hour 0
      ghi: checkValue(issues, line, "ghi", num(f[col.ghi])),
      dni: checkValue(issues, line, "dni", num(f[col.dni])),
      dhi: checkValue(issues, line, "dhi", num(f[col.dhi])),
      temp: checkValue(issues, line, "temp_air", num(f[col.temp])),
      wind: checkValue(issues, line, "wind_speed", num(f[col.wind])),
      albedo: col.albedo >= 0 ? validAlbedo(num(f[col.albedo])) : null,
    });
  }
  return { site, label: `TMY3 ${meta[0]?.trim() ?? ""} ${site.name ?? ""}`.trim(), rows };
}

// ---------------------------------------------------------------- generic CSV
export const GENERIC_CSV_COLUMNS = ["month", "day", "hour", "ghi", "dni", "dhi", "temp_air", "wind_speed", "albedo"] as const;
const REQUIRED_CSV_COLUMNS = ["month", "day", "hour", "dni", "dhi", "temp_air", "wind_speed"] as const;

function parseGenericCsv(records: CsvRecord[], issues: IssueList): { rows: RawRow[]; hasGhi: boolean } {
  // Comment lines were blanked before parsing (see parseWeather), so blank records are skipped here.
  const data = records.filter((r) => !isBlankRecord(r));
  const headerRecord = data.shift();
  if (!headerRecord) {
    issues.add(null, "no header line");
    issues.throwIfAny("weather CSV");
    return { rows: [], hasGhi: false };
  }
  const header = headerRecord.cells.map((x) => x.trim().toLowerCase());
  const col = new Map<string, number>();
  header.forEach((name, i) => col.set(name, i));
  for (const name of REQUIRED_CSV_COLUMNS) {
    if (!col.has(name)) issues.add(headerRecord.line, `column "${name}" is missing (expected ${GENERIC_CSV_COLUMNS.join(",")}; ghi and albedo optional)`);
  }
  issues.throwIfAny("weather CSV");
  const hasGhi = col.has("ghi");
  const idx = (name: string) => col.get(name) ?? -1;
  const rows: RawRow[] = [];
  for (const { line, cells: f } of data) {
    rows.push({
      line,
      month: num(f[idx("month")]),
      day: num(f[idx("day")]),
      hour: num(f[idx("hour")]),
      ghi: hasGhi ? checkValue(issues, line, "ghi", num(f[idx("ghi")])) : null,
      dni: checkValue(issues, line, "dni", num(f[idx("dni")])),
      dhi: checkValue(issues, line, "dhi", num(f[idx("dhi")])),
      temp: checkValue(issues, line, "temp_air", num(f[idx("temp_air")])),
      wind: checkValue(issues, line, "wind_speed", num(f[idx("wind_speed")])),
      albedo: col.has("albedo") ? validAlbedo(num(f[idx("albedo")])) : null,
    });
  }
  return { rows, hasGhi };
}

// ---------------------------------------------------------------- common

/** Index of (month, day, hour) on the 8760 grid, or −1 when not a valid typical-year hour. */
export function hourIndex(month: number, day: number, hour: number): number {
  if (!Number.isInteger(month) || month < 1 || month > 12) return -1;
  if (!Number.isInteger(day) || day < 1 || day > MONTH_DAYS[month - 1]) return -1;
  if (!Number.isInteger(hour) || hour < 0 || hour > 23) return -1;
  return (MONTH_START_DAY[month - 1] + day - 1) * 24 + hour;
}

/**
 * Read a weather file's text into a WeatherYear. Throws EngineInputError listing every problem
 * (with file line numbers) — never returns a year with gaps or out-of-range values.
 */
export function parseWeather(text: string, options: ParseWeatherOptions = {}): WeatherYear {
  const clean = text.replace(/^\uFEFF/, "");
  const lines = clean.split(/\r?\n/);
  const format = options.format ?? detectWeatherFormat(clean);
  const issues = new IssueList();
  const context = `${format.toUpperCase()} weather file`;

  if (format === "epw" && !/^LOCATION,/i.test(lines[0] ?? "")) {
    throw new EngineInputError([{ path: "line 1", message: "not an EPW file: the first line must start with LOCATION," }], context);
  }
  if (format === "tmy3" && !/^Date \(MM\/DD\/YYYY\)/i.test(lines[1] ?? "")) {
    throw new EngineInputError([{ path: "line 2", message: 'not a TMY3 file: the second line must start with "Date (MM/DD/YYYY)"' }], context);
  }

  let parsed: { site: Partial<WeatherSite>; label: string; rows: RawRow[]; hasGhi: boolean };
  if (format === "epw") parsed = { ...parseEpw(readCsvRecords(clean), issues), hasGhi: true };
  else if (format === "tmy3") parsed = { ...parseTmy3(readCsvRecords(clean), issues), hasGhi: true };
  else {
    // "#" lines are free text (attribution): blanked, not parsed, so a stray quote in them cannot
    // swallow the lines after; the line count stays, so errors still name the file's lines.
    const withoutComments = lines.map((l) => (l.trimStart().startsWith("#") ? "" : l)).join("\n");
    parsed = { ...parseGenericCsv(readCsvRecords(withoutComments), issues), site: {}, label: "hourly CSV" };
  }

  // Site: header values, overridden by explicit options.
  const site = parseOrThrow(weatherSiteSchema, { ...parsed.site, ...stripUndefined(options.site ?? {}) }, `${context}: site`);
  const contradiction = offsetContradiction(site.longitude, site.utcOffsetHours);
  if (contradiction) throw new EngineInputError([{ path: "site.utcOffsetHours", message: contradiction }], context);

  const { out, leapRows, albedoFromFileHours } = placeOnGrid(parsed.rows, issues, context);
  const tempMean = checkUnits(out, issues, context);
  const n = HOURS_PER_YEAR;

  const ghiDerived = !parsed.hasGhi;
  if (ghiDerived) {
    // GHI = DNI·cos(zenith) + DHI, the closure relation, with the zenith at each hour's evaluation instant.
    const sun = sunPositionsForYear(site, { temperatureC: tempMean });
    for (let i = 0; i < n; i++) {
      const cz = Math.cos((sun.zenithDeg[i] * Math.PI) / 180);
      out.ghi[i] = out.dni[i] * (cz > 0 ? cz : 0) + out.dhi[i];
    }
  }

  const notes: string[] = [];
  const timingShiftHours = sunTimingShiftHours(out.ghi, site.longitude, site.utcOffsetHours);
  const timingWarning = sunTimingWarning(timingShiftHours, site.utcOffsetHours);
  if (timingWarning) notes.push(timingWarning);
  if (leapRows) notes.push(`dropped ${leapRows} rows of 29 February`);
  if (ghiDerived) notes.push("GHI derived as DNI·cos(zenith) + DHI");
  if (albedoFromFileHours < n) notes.push(`albedo ${DEFAULT_ALBEDO} used for ${n - albedoFromFileHours} hours without a valid file value`);

  return {
    format,
    sourceLabel: options.sourceLabel ?? parsed.label,
    site,
    station: typeof parsed.site.latitude === "number" && typeof parsed.site.longitude === "number" ? { latitude: parsed.site.latitude, longitude: parsed.site.longitude } : null,
    ...out,
    ghiDerived,
    albedoFromFileHours,
    timingShiftHours,
    notes,
  };
}

/** Rows onto the 8760-hour grid: 29 February dropped, each hour exactly once (issues name the lines). */
function placeOnGrid(rows: RawRow[], issues: IssueList, context: string) {
  // Place rows on the grid; drop 29 February; require each hour exactly once.
  const n = HOURS_PER_YEAR;
  const seenAt = new Int32Array(n).fill(0);
  const out = {
    month: new Uint8Array(n),
    day: new Uint8Array(n),
    hour: new Uint8Array(n),
    ghi: new Float64Array(n),
    dni: new Float64Array(n),
    dhi: new Float64Array(n),
    tempAirC: new Float64Array(n),
    windSpeedMs: new Float64Array(n),
    albedo: new Float64Array(n).fill(DEFAULT_ALBEDO),
  };
  let leapRows = 0;
  let albedoFromFileHours = 0;
  for (const r of rows) {
    if (r.month === 2 && r.day === 29) {
      leapRows++;
      continue;
    }
    const i = hourIndex(r.month, r.day, r.hour);
    if (i < 0) {
      issues.add(r.line, `month ${r.month}, day ${r.day}, hour ${r.hour} is not an hour of the year`);
      continue;
    }
    if (seenAt[i]) {
      issues.add(r.line, `duplicate hour (month ${r.month}, day ${r.day}, hour ${r.hour}; first on line ${seenAt[i]})`);
      continue;
    }
    seenAt[i] = r.line;
    out.ghi[i] = r.ghi ?? 0;
    out.dni[i] = r.dni;
    out.dhi[i] = r.dhi;
    out.tempAirC[i] = r.temp;
    out.windSpeedMs[i] = r.wind;
    if (r.albedo !== null) {
      out.albedo[i] = r.albedo;
      albedoFromFileHours++;
    }
  }
  let missing = 0;
  for (let i = 0; i < n; i++) {
    if (!seenAt[i]) {
      if (missing < 10) {
        const d = Math.floor(i / 24);
        const m = MONTH_START_DAY.findLastIndex((s) => s <= d);
        issues.add(null, `hour missing: month ${m + 1}, day ${d - MONTH_START_DAY[m] + 1}, hour ${i % 24}`);
      }
      missing++;
    }
  }
  if (missing > 10) issues.add(null, `${missing} hours missing in all (expected ${n} hourly rows, 29 February excluded)`);
  issues.throwIfAny(context);

  return { out, leapRows, albedoFromFileHours };
}

/**
 * Unit sanity on the whole year (catches kW/m², kWh/m² or MJ/m² columns and °F temperatures that
 * fall inside the per-value limits), then each row's month, day and hour. Returns the mean air
 * temperature.
 */
function checkUnits(out: ReturnType<typeof placeOnGrid>["out"], issues: IssueList, context: string): number {
  const n = HOURS_PER_YEAR;
  let maxIrr = 0;
  let tempSum = 0;
  for (let i = 0; i < n; i++) {
    maxIrr = Math.max(maxIrr, out.dni[i], out.dhi[i], out.ghi[i]);
    tempSum += out.tempAirC[i];
  }
  if (maxIrr < 20) issues.add(null, `irradiance never exceeds ${maxIrr} — expected W/m² (hour means), not kW/m² or kWh/m²`);
  if (tempSum / n > 40) issues.add(null, `mean air temperature ${(tempSum / n).toFixed(1)} — expected °C, not °F`);
  issues.throwIfAny(context);

  for (let i = 0; i < n; i++) {
    const d = Math.floor(i / 24);
    const m = MONTH_START_DAY.findLastIndex((s) => s <= d);
    out.month[i] = m + 1;
    out.day[i] = d - MONTH_START_DAY[m] + 1;
    out.hour[i] = i % 24;
  }

  return tempSum / n;
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/** Annual mean air temperature, °C (SPA's refraction input). */
export function meanTemperatureC(w: WeatherYear): number {
  let s = 0;
  for (let i = 0; i < w.tempAirC.length; i++) s += w.tempAirC[i];
  return s / w.tempAirC.length;
}
