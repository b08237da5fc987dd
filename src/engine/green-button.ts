/**
 * Interval data → an hourly usage profile on the typical year's 8760-hour grid.
 *
 * Inputs:
 * - Green Button XML: the NAESB ESPI standard (REQ.21, Energy Services Provider Interface), an
 *   Atom feed whose entries hold LocalTimeParameters, MeterReading, ReadingType and
 *   IntervalBlock resources. An IntervalBlock holds IntervalReadings, each a timePeriod
 *   (start: seconds since 1970-01-01 UTC; duration: seconds) and a value. The ReadingType
 *   linked to the MeterReading gives the unit: value × 10^powerOfTenMultiplier in `uom`
 *   (72 = Wh; codes from the ESPI/IEC 61968-9 UnitSymbolKind list), the flow direction
 *   (1 = forward, delivered to the customer; 19 = reverse, received from the customer) and the
 *   accumulation behaviour (4 = deltaData, energy per interval). Codes named from memory of
 *   the ESPI schema.
 * - CSV: a `timestamp` column (interval start, ISO 8601) and a `kWh` column; or separate date
 *   and start-time columns with a usage column (and an optional units column), as utilities'
 *   interval downloads often have; header lines before the column row are skipped.
 *
 * Time: the grid is local standard time with no daylight saving (year-calendar.ts). ESPI
 * times are UTC and LocalTimeParameters.tzOffset gives the standard offset, so local standard
 * time = UTC + tzOffset; daylight saving is ignored on purpose. CSV timestamps with an offset
 * are converted with the site's standard offset; timestamps without one are read as local
 * standard time (a note says so: a meter clock that follows daylight saving shifts summer
 * hours by one).
 *
 * Aggregation: each reading is split over the clock hours it overlaps in proportion to the
 * overlap. An hour is measured when readings cover at least half of it; its kWh is then scaled
 * to the full hour (kWh × 3600 / covered seconds), which also averages duplicate readings.
 * Hours of several years fall on the same grid hour (29 February is dropped) and are averaged.
 *
 * Gaps: a missing hour takes the mean of the measured hours at the same hour of day in the same
 * calendar month; where that month has none at that hour, the reference residential load
 * (load-shape.ts) scaled to the measured hours. Every filled hour is counted as estimated.
 */
import { TZDate, tzOffset } from "@date-fns/tz";
import { XMLParser, XMLValidator } from "fast-xml-parser";
import { z } from "zod";
import { isBlankRecord, readCsvRecords, type CsvRecord } from "./csv";
import { EngineInputError, parseOrThrow, type EngineIssue } from "./errors";
import { REFERENCE_LOAD_HOURLY_KWH } from "./data/reference-load-8760";
import { HOURS_PER_YEAR, HOUR_MONTH, isTimeZone, MONTH_DAYS, MONTH_START_DAY, standardOffsetMinutes } from "./year-calendar";

/** ESPI UnitSymbolKind for watt-hours. */
export const ESPI_UOM_WH = 72;
/** ESPI FlowDirectionKind: forward (delivered to the customer) and reverse (received from the customer). */
export const ESPI_FLOW_FORWARD = 1;
export const ESPI_FLOW_REVERSE = 19;
/** ESPI AccumulationKind for energy per interval; bulkQuantity (1) and cumulative (3) are running register totals. */
export const ESPI_ACCUMULATION_DELTA = 4;
const ESPI_ACCUMULATION_RUNNING = new Set([1, 3]);
/** An hour counts as measured when readings cover at least this share of it. */
export const MIN_HOUR_COVERAGE = 0.5;
/** A month whose hours are at least this share measured is reported as measured. */
export const MEASURED_MONTH_COVERAGE = 0.9;
/** Longest reading accepted, seconds (a monthly register read is a bill, not interval data). */
export const MAX_READING_SECONDS = 7 * 86_400;
const MAX_REPORTED_GAPS = 50;
const MAX_ISSUES = 50;

// ---------------------------------------------------------------------------------------------
// Reading the XML: fast-xml-parser, with limits. Characters outside XML 1.0's Char production
// (§2.2: control characters, unpaired surrogates, U+FFFE/U+FFFF) and any DOCTYPE are refused
// first, so no DTD entity is ever declared or expanded (processEntities is off; the five
// predefined entities and character references are decoded here). Elements nest at most
// MAX_XML_DEPTH deep (the parser's maxNestedTags): 60,000 nested elements are refused, never
// walked. Every refusal is an EngineInputError naming the line (a 422 at the routes).
// ---------------------------------------------------------------------------------------------

/** Deepest element nesting read (our choice: an ESPI feed nests about 8 deep). */
export const MAX_XML_DEPTH = 64;

export type XmlElement = {
  /** Local name, namespace prefix removed ("espi:IntervalBlock" → "IntervalBlock"). */
  name: string;
  attributes: Readonly<Record<string, string>>;
  children: XmlElement[];
  text: string;
  line: number;
};

const ENTITIES: Record<string, string> = { amp: "&", lt: "<", gt: ">", quot: '"', apos: "'" };
const xmlFail = (line: number | null, message: string): never => {
  throw new EngineInputError([{ path: line === null ? "file" : `line ${line}`, message }], "Green Button XML");
};

/** XML 1.0 §2.2 Char: tab, LF, CR, U+0020–U+D7FF, U+E000–U+FFFD, U+10000–U+10FFFF (the `u` flag makes an unpaired surrogate match). */
const NOT_XML_CHAR = /[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/u;
const isXmlChar = (cp: number) => cp === 0x9 || cp === 0xa || cp === 0xd || (cp >= 0x20 && cp <= 0xd7ff) || (cp >= 0xe000 && cp <= 0xfffd) || (cp >= 0x10000 && cp <= 0x10ffff);
const hex = (cp: number) => `U+${cp.toString(16).toUpperCase().padStart(4, "0")}`;

function decodeEntities(s: string, line: number): string {
  if (!s.includes("&")) return s;
  return s.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|[a-zA-Z]+);/g, (_, ref: string) => {
    if (ref.startsWith("#")) {
      const cp = ref.startsWith("#x") ? parseInt(ref.slice(2), 16) : parseInt(ref.slice(1), 10);
      if (!isXmlChar(cp)) xmlFail(line, `character reference &${ref}; is not an XML character`);
      return String.fromCodePoint(cp);
    }
    const value = ENTITIES[ref];
    if (value === undefined) xmlFail(line, `unknown XML entity &${ref};`);
    return value;
  });
}

const localName = (qname: string) => qname.slice(qname.indexOf(":") + 1);
/** Shared by every element without attributes (most of them), so none allocates its own. */
const NO_ATTRIBUTES: Readonly<Record<string, string>> = Object.freeze({});

const parser = new XMLParser({
  preserveOrder: true,
  ignoreAttributes: false,
  attributeNamePrefix: "",
  parseTagValue: false,
  parseAttributeValue: false,
  trimValues: true,
  processEntities: false,
  htmlEntities: false,
  ignoreDeclaration: true,
  ignorePiTags: true,
  captureMetaData: true,
  maxNestedTags: MAX_XML_DEPTH,
});
const META = XMLParser.getMetaDataSymbol() as unknown as symbol;
type OrderedNode = Record<string, unknown> & { ":@"?: Record<string, string> };

/** Parse an XML document into its root element. Throws EngineInputError with the line of the problem. */
export function parseXml(text: string): XmlElement {
  const newlines: number[] = [];
  for (let nl = text.indexOf("\n"); nl !== -1; nl = text.indexOf("\n", nl + 1)) newlines.push(nl);
  const lineAt = (pos: number) => {
    let lo = 0;
    let hi = newlines.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (newlines[mid] < pos) lo = mid + 1;
      else hi = mid;
    }
    return lo + 1;
  };
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const offset = text.length - body.length;

  const bad = NOT_XML_CHAR.exec(body);
  if (bad) xmlFail(lineAt(bad.index + offset), `invalid character ${hex(bad[0].codePointAt(0)!)}: XML allows no control characters (other than tab and line breaks) and no unpaired surrogates`);
  const doctype = /<!DOCTYPE|<!ENTITY|<!ELEMENT|<!ATTLIST/i.exec(body);
  if (doctype) xmlFail(lineAt(doctype.index + offset), "DOCTYPE and DTD declarations are not accepted");

  const valid = XMLValidator.validate(body, { allowBooleanAttributes: false });
  if (valid !== true) xmlFail(valid.err.line, valid.err.msg);

  let ordered: OrderedNode[];
  try {
    ordered = parser.parse(body) as OrderedNode[];
  } catch (err) {
    if (err instanceof Error && /nested tags/i.test(err.message)) xmlFail(null, `elements nest deeper than ${MAX_XML_DEPTH} levels; a Green Button file nests about 8`);
    return xmlFail(null, `the XML could not be read (${err instanceof Error ? err.message : "unknown error"})`);
  }

  // The parser's nodes → XmlElement (recursion is bounded by MAX_XML_DEPTH).
  const toElement = (node: OrderedNode, key: string): XmlElement => {
    const meta = (node as unknown as Record<symbol, { startIndex?: number } | undefined>)[META];
    const line = meta?.startIndex === undefined ? 0 : lineAt(meta.startIndex + offset);
    const attrs = node[":@"];
    let attributes: Readonly<Record<string, string>> = NO_ATTRIBUTES;
    if (attrs) {
      const out: Record<string, string> = {};
      for (const [k, v] of Object.entries(attrs)) out[localName(k)] = decodeEntities(String(v), line);
      attributes = out;
    }
    const element: XmlElement = { name: localName(key), attributes, children: [], text: "", line };
    for (const child of node[key] as OrderedNode[]) {
      if ("#text" in child) element.text += decodeEntities(String(child["#text"]), line);
      else {
        const childKey = Object.keys(child).find((k) => k !== ":@");
        if (childKey !== undefined) element.children.push(toElement(child, childKey));
      }
    }
    return element;
  };
  const roots = ordered.filter((n) => !("#text" in n));
  const rootKey = roots[0] && Object.keys(roots[0]).find((k) => k !== ":@");
  if (rootKey === undefined) return xmlFail(1, "no XML element found");
  return toElement(roots[0], rootKey);
}

function* descendants(el: XmlElement, name: string): Generator<XmlElement> {
  for (const child of el.children) {
    if (child.name === name) yield child;
    else yield* descendants(child, name);
  }
}
const child = (el: XmlElement, name: string) => el.children.find((c) => c.name === name);
const childText = (el: XmlElement, name: string) => child(el, name)?.text.trim();

// ---------------------------------------------------------------------------------------------
// Readings
// ---------------------------------------------------------------------------------------------

/** One interval, with its start in "local standard seconds" (seconds since 1970-01-01 00:00 of the local standard clock). */
export type IntervalReading = { startSec: number; durationSec: number; kwh: number };

type ReadingTypeInfo = { uom: number | null; powerOfTen: number; flowDirection: number | null; accumulation: number | null; line: number };

export type EspiParse = {
  readings: IntervalReading[];
  tzOffsetHours: number;
  /** kWh received from the customer (flowDirection 19), if the feed has that channel. */
  receivedKwh: number | null;
  notes: string[];
};

function intOf(el: XmlElement, name: string, issues: EngineIssue[]): number | null {
  const raw = childText(el, name);
  if (raw === undefined || raw === "") return null;
  const v = Number(raw);
  if (!Number.isFinite(v)) {
    issues.push({ path: `line ${child(el, name)?.line ?? el.line}`, message: `${name} "${raw}" is not a number` });
    return null;
  }
  return v;
}

/** The file's UTC offset in seconds: LocalTimeParameters.tzOffset, else the caller's site offset (null: neither). */
function espiTzOffsetSec(root: XmlElement, utcOffsetHours: number | undefined, issues: EngineIssue[], notes: string[]): number | null {
  let tzOffsetSec: number | null = null;
  for (const ltp of descendants(root, "LocalTimeParameters")) tzOffsetSec = intOf(ltp, "tzOffset", issues);
  if (tzOffsetSec === null && root.name === "LocalTimeParameters") tzOffsetSec = intOf(root, "tzOffset", issues);
  if (tzOffsetSec === null) {
    if (utcOffsetHours === undefined) {
      issues.push({ path: "utcOffsetHours", message: "the file has no LocalTimeParameters.tzOffset; give the site's UTC offset" });
    } else {
      tzOffsetSec = utcOffsetHours * 3600;
      notes.push(`No LocalTimeParameters in the file: used the site's UTC offset (${utcOffsetHours} h).`);
    }
  } else if (utcOffsetHours !== undefined && Math.abs(utcOffsetHours * 3600 - tzOffsetSec) > 1) {
    notes.push(`The file's time zone (UTC${tzOffsetSec >= 0 ? "+" : ""}${tzOffsetSec / 3600}) differs from the site's (${utcOffsetHours} h); the file's was used.`);
  }
  return tzOffsetSec;
}

const linksOf = (entry: XmlElement) => entry.children.filter((c) => c.name === "link").map((l) => ({ rel: l.attributes.rel ?? "", href: l.attributes.href ?? "" }));

/**
 * The document's Atom entries, and how to find an IntervalBlock's ReadingType: ReadingTypes by
 * their self link, MeterReadings' links to ReadingTypes (or the only ReadingType there is).
 */
function espiReadingTypes(root: XmlElement, issues: EngineIssue[]): { entries: XmlElement[]; typeForBlock: (entry: XmlElement | null) => ReadingTypeInfo | null } {
  const readingTypes = new Map<string, ReadingTypeInfo>();
  const allTypes: ReadingTypeInfo[] = [];
  const meterReadingType = new Map<string, string[]>();
  const entries = root.name === "entry" ? [root] : [...descendants(root, "entry")];
  const readType = (rt: XmlElement): ReadingTypeInfo => ({
    uom: intOf(rt, "uom", issues),
    powerOfTen: intOf(rt, "powerOfTenMultiplier", issues) ?? 0,
    flowDirection: intOf(rt, "flowDirection", issues),
    accumulation: intOf(rt, "accumulationBehaviour", issues),
    line: rt.line,
  });
  for (const entry of entries) {
    const content = child(entry, "content");
    const self = linksOf(entry).find((l) => l.rel === "self")?.href;
    const rt = content && child(content, "ReadingType");
    if (rt) {
      const info = readType(rt);
      allTypes.push(info);
      if (self) readingTypes.set(self, info);
    }
    if (content && child(content, "MeterReading") && self) {
      meterReadingType.set(self, linksOf(entry).filter((l) => l.rel === "related").map((l) => l.href));
    }
  }
  if (entries.length === 0) for (const rt of descendants(root, "ReadingType")) allTypes.push(readType(rt));

  const typeForBlock = (entry: XmlElement | null): ReadingTypeInfo | null => {
    if (entry) {
      const hrefs = linksOf(entry).filter((l) => l.rel === "self" || l.rel === "up").map((l) => l.href);
      for (const [meterHref, related] of meterReadingType) {
        if (hrefs.some((h) => h.startsWith(`${meterHref}/`))) {
          for (const r of related) {
            const t = readingTypes.get(r);
            if (t) return t;
          }
        }
      }
    }
    return allTypes.length === 1 ? allTypes[0] : null;
  };
  return { entries, typeForBlock };
}

/** The IntervalBlocks, each with the Atom entry holding it (null in a bare document). */
function espiIntervalBlocks(root: XmlElement, entries: XmlElement[], issues: EngineIssue[]): { block: XmlElement; entry: XmlElement | null }[] {
  const blocks: { block: XmlElement; entry: XmlElement | null }[] = [];
  if (entries.length > 0) {
    for (const entry of entries) {
      const content = child(entry, "content");
      if (content) for (const block of descendants(content, "IntervalBlock")) blocks.push({ block, entry });
    }
  } else {
    for (const block of root.name === "IntervalBlock" ? [root] : descendants(root, "IntervalBlock")) blocks.push({ block, entry: null });
  }
  if (blocks.length === 0) issues.push({ path: "IntervalBlock", message: "the file holds no IntervalBlock" });
  return blocks;
}

/** Whether a block's ReadingType is interval energy in Wh; an issue says why not. */
function isIntervalEnergy(block: XmlElement, type: ReadingTypeInfo | null, issues: EngineIssue[]): type is ReadingTypeInfo {
  if (!type) {
    issues.push({ path: `line ${block.line}`, message: "cannot tell which ReadingType (unit) this IntervalBlock uses" });
    return false;
  }
  if (type.uom !== null && type.uom !== ESPI_UOM_WH) {
    issues.push({ path: `line ${type.line}`, message: `ReadingType uom ${type.uom} is not energy in Wh (${ESPI_UOM_WH}); only Wh readings are accepted` });
    return false;
  }
  if (type.accumulation !== null && ESPI_ACCUMULATION_RUNNING.has(type.accumulation)) {
    issues.push({ path: `line ${type.line}`, message: `accumulationBehaviour ${type.accumulation} is a running register total; interval energy (deltaData, ${ESPI_ACCUMULATION_DELTA}) is needed` });
    return false;
  }
  return true;
}

/** One block's IntervalReadings: delivered ones into `acc.readings`, received ones (reverse) summed into `acc.receivedKwh`. */
function readEspiBlock(block: XmlElement, kwhPerUnit: number, reverse: boolean, offset: number, issues: EngineIssue[], acc: { readings: IntervalReading[]; receivedKwh: number | null }): void {
  for (const ir of block.children) {
    if (ir.name !== "IntervalReading") continue;
    const period = child(ir, "timePeriod");
    const start = period ? intOf(period, "start", issues) : null;
    const duration = period ? intOf(period, "duration", issues) : null;
    const value = intOf(ir, "value", issues);
    if (start === null || duration === null || value === null) {
      if (issues.length < MAX_ISSUES) issues.push({ path: `line ${ir.line}`, message: "IntervalReading needs timePeriod start, duration and value" });
      continue;
    }
    if (duration <= 0 || duration > MAX_READING_SECONDS) {
      issues.push({ path: `line ${ir.line}`, message: `duration ${duration} s is outside 1 s … ${MAX_READING_SECONDS} s` });
      continue;
    }
    const kwh = value * kwhPerUnit;
    if (reverse) acc.receivedKwh = (acc.receivedKwh ?? 0) + kwh;
    else acc.readings.push({ startSec: start + offset, durationSec: duration, kwh });
  }
}

/** Read the delivered-energy interval readings of an ESPI (Green Button) XML document. */
export function parseEspiXml(text: string, options: { utcOffsetHours?: number } = {}): EspiParse {
  const root = parseXml(text);
  const issues: EngineIssue[] = [];
  const notes: string[] = [];
  const tzOffsetSec = espiTzOffsetSec(root, options.utcOffsetHours, issues, notes);
  const { entries, typeForBlock } = espiReadingTypes(root, issues);
  const blocks = espiIntervalBlocks(root, entries, issues);

  const acc: { readings: IntervalReading[]; receivedKwh: number | null } = { readings: [], receivedKwh: null };
  const offset = tzOffsetSec ?? 0;
  let skippedOther = 0;
  for (const { block, entry } of blocks) {
    const type = typeForBlock(entry);
    if (!isIntervalEnergy(block, type, issues)) continue;
    const reverse = type.flowDirection === ESPI_FLOW_REVERSE;
    if (type.flowDirection !== null && type.flowDirection !== ESPI_FLOW_FORWARD && !reverse) {
      skippedOther++;
      continue;
    }
    readEspiBlock(block, Math.pow(10, type.powerOfTen) / 1000, reverse, offset, issues, acc);
    if (issues.length >= MAX_ISSUES) break;
  }
  const { readings, receivedKwh } = acc;
  if (receivedKwh !== null) notes.push(`The feed also has ${round1(receivedKwh)} kWh received from the customer (flowDirection 19); it is not counted as usage.`);
  if (skippedOther > 0) notes.push(`${skippedOther} IntervalBlock(s) with another flow direction (e.g. net) were left out.`);
  if (issues.length > 0) throw new EngineInputError(issues.slice(0, MAX_ISSUES), "Green Button XML");
  if (readings.length === 0) throw new EngineInputError([{ path: "IntervalReading", message: "no delivered-energy readings found" }], "Green Button XML");
  return { readings, tzOffsetHours: offset / 3600, receivedKwh, notes };
}

// ---------------------------------------------------------------------------------------------
// CSV
// ---------------------------------------------------------------------------------------------

const TIMESTAMP_HEADERS = ["timestamp", "datetime", "date_time", "date time", "start", "start_time_utc", "interval start", "interval_start"];
const DATE_HEADERS = ["date"];
const START_TIME_HEADERS = ["start time", "start_time", "time"];
const END_TIME_HEADERS = ["end time", "end_time"];
const ENERGY_HEADERS = ["kwh", "usage", "usage (kwh)", "value", "consumption", "energy", "import (kwh)"];
const UNIT_HEADERS = ["units", "unit"];

const ISO_RE = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/;

/** Parse an ISO-like timestamp to seconds; `offsetSec` is null when the text carries no offset. */
function parseTimestamp(s: string): { sec: number; offsetSec: number | null } | null {
  const m = ISO_RE.exec(s.trim());
  if (!m) return null;
  const [y, mo, d, h, mi, se] = [m[1], m[2], m[3], m[4] ?? "0", m[5] ?? "0", m[6] ?? "0"].map(Number);
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 24 || mi > 59 || se > 60) return null;
  const t = Date.UTC(y, mo - 1, d, h, mi, se);
  const check = new Date(Date.UTC(y, mo - 1, d));
  if (check.getUTCDate() !== d) return null;
  let offsetSec: number | null = null;
  if (m[7]) {
    if (m[7] === "Z") offsetSec = 0;
    else {
      const sign = m[7][0] === "-" ? -1 : 1;
      const digits = m[7].slice(1).replace(":", "");
      offsetSec = sign * (Number(digits.slice(0, 2)) * 3600 + Number(digits.slice(2)) * 60);
    }
  }
  return { sec: t / 1000, offsetSec };
}

/** A date as YYYY-MM-DD or M/D/YYYY. */
function normaliseDate(s: string): string | null {
  const us = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/.exec(s.trim());
  if (us) return `${us[3]}-${us[1].padStart(2, "0")}-${us[2].padStart(2, "0")}`;
  return /^\d{4}-\d{2}-\d{2}$/.test(s.trim()) ? s.trim() : null;
}

type CsvColumns = { ts: number; date: number; start: number; end: number; kwh: number; unit: number };
type CsvRow = { sec: number; endSec: number | null; kwh: number };

/** The header row in the first 50 lines (a time column and an energy column) and where each column is. */
function findCsvHeader(records: CsvRecord[]): { headerIdx: number; col: CsvColumns } {
  const norm = (s: string) => s.trim().toLowerCase();
  let headerIdx = -1;
  let cols: string[] = [];
  for (let i = 0; i < records.length && records[i].line <= 50; i++) {
    const c = records[i].cells.map(norm);
    const hasTime = c.some((x) => TIMESTAMP_HEADERS.includes(x)) || (c.some((x) => DATE_HEADERS.includes(x)) && c.some((x) => START_TIME_HEADERS.includes(x)));
    if (hasTime && c.some((x) => ENERGY_HEADERS.includes(x))) {
      headerIdx = i;
      cols = c;
      break;
    }
  }
  if (headerIdx === -1) {
    throw new EngineInputError(
      [{ path: "line 1", message: "no header row with a timestamp (or date and start time) column and a kWh (or usage) column in the first 50 lines" }],
      "interval CSV",
    );
  }
  const find = (names: string[]) => cols.findIndex((c) => names.includes(c));
  return {
    headerIdx,
    col: { ts: find(TIMESTAMP_HEADERS), date: find(DATE_HEADERS), start: find(START_TIME_HEADERS), end: find(END_TIME_HEADERS), kwh: find(ENERGY_HEADERS), unit: find(UNIT_HEADERS) },
  };
}

/** A row's start as written: the timestamp column, or the date and start time joined (null: an issue says why). */
function rowStamp(f: string[], col: CsvColumns, lineNo: string, issues: EngineIssue[]): string | null {
  if (col.ts >= 0) return f[col.ts] ?? "";
  const date = normaliseDate(f[col.date] ?? "");
  if (!date) {
    issues.push({ path: lineNo, message: `date "${f[col.date] ?? ""}" is not YYYY-MM-DD or M/D/YYYY` });
    return null;
  }
  return `${date}T${(f[col.start] ?? "").padStart(5, "0")}`;
}

/** A row's energy in kWh, Wh converted by the unit column (null: an issue says why). */
function rowKwh(f: string[], col: CsvColumns, lineNo: string, issues: EngineIssue[]): number | null {
  const raw = (f[col.kwh] ?? "").replace(/,/g, "");
  let kwh = Number(raw);
  if (raw === "" || !Number.isFinite(kwh) || kwh < 0) {
    issues.push({ path: lineNo, message: `kWh "${f[col.kwh] ?? ""}" must be a number ≥ 0` });
    return null;
  }
  if (col.unit >= 0) {
    const unit = (f[col.unit] ?? "").trim().toLowerCase();
    if (unit === "wh") kwh /= 1000;
    else if (unit !== "kwh" && unit !== "") {
      issues.push({ path: lineNo, message: `unit "${f[col.unit]}" is not kWh or Wh` });
      return null;
    }
  }
  return kwh;
}

/**
 * One data row: its start in local standard seconds, its end when an end-time column gives it, and
 * its kWh. null: an issue says why; "stop": stamps carry offsets but no site offset was given.
 */
function readCsvRow(
  record: CsvRecord,
  col: CsvColumns,
  utcOffsetHours: number | undefined,
  wallClock: ((naiveSec: number) => number) | null,
  counts: { withOffset: number; withoutOffset: number },
  issues: EngineIssue[],
): CsvRow | null | "stop" {
  const f = record.cells.map((c) => c.trim());
  const lineNo = `line ${record.line}`;
  if (record.problem) {
    issues.push({ path: lineNo, message: `this row cannot be read: ${record.problem}` });
    return null;
  }
  const stamp = rowStamp(f, col, lineNo, issues);
  if (stamp === null) return null;
  const ts = parseTimestamp(stamp);
  if (!ts) {
    issues.push({ path: lineNo, message: `timestamp "${stamp}" is not an ISO 8601 date and time` });
    return null;
  }
  const kwh = rowKwh(f, col, lineNo, issues);
  if (kwh === null) return null;
  let sec = ts.sec;
  if (ts.offsetSec !== null) {
    counts.withOffset++;
    if (utcOffsetHours === undefined) {
      issues.push({ path: "utcOffsetHours", message: "timestamps carry a UTC offset; give the site's standard UTC offset to place them in local standard time" });
      return "stop";
    }
    sec = ts.sec - ts.offsetSec + utcOffsetHours * 3600;
  } else {
    counts.withoutOffset++;
    if (wallClock) sec = wallClock(ts.sec);
  }
  let endSec: number | null = null;
  if (col.end >= 0 && col.ts < 0 && f[col.end]) {
    const end = parseTimestamp(`${stamp.slice(0, 10)}T${f[col.end].padStart(5, "0")}`);
    if (end) {
      // "00:59" style end times name the last minute of the interval.
      endSec = end.sec + (end.sec % 3600 === 3540 || end.sec % 900 === 840 ? 60 : 0);
      if (endSec <= ts.sec) endSec += 86_400; // an interval ending after midnight
      endSec = sec + (endSec - ts.sec);
    }
  }
  return { sec, endSec, kwh };
}

/** The rows in time order as readings, each as long as its end time says or else the common step. */
function csvReadings(rows: CsvRow[]): IntervalReading[] {
  rows.sort((a, b) => a.sec - b.sec);
  // Interval length: the most common step between consecutive starts (rows without an end time).
  const steps = new Map<number, number>();
  for (let i = 1; i < rows.length; i++) {
    const step = rows[i].sec - rows[i - 1].sec;
    if (step > 0) steps.set(step, (steps.get(step) ?? 0) + 1);
  }
  let commonStep = 3600;
  let bestCount = 0;
  for (const [step, count] of steps) if (count > bestCount || (count === bestCount && step < commonStep)) [commonStep, bestCount] = [step, count];
  return rows.map((r, i) => {
    let duration = r.endSec !== null ? r.endSec - r.sec : commonStep;
    // A row followed sooner than the common step (e.g. 15-minute rows inside hourly data) ends at the next row.
    if (r.endSec === null && i + 1 < rows.length) {
      const gap = rows[i + 1].sec - r.sec;
      if (gap > 0 && gap < duration) duration = gap;
    }
    return { startSec: r.sec, durationSec: Math.min(Math.max(duration, 1), MAX_READING_SECONDS), kwh: r.kwh };
  });
}

/**
 * Read interval CSV: timestamp + kWh columns, or date + start time (+ end time, units) + usage.
 * Each row is an interval starting at its timestamp; its length comes from the end-time column
 * or from the most common step between consecutive timestamps.
 */
export function parseIntervalCsv(text: string, options: { utcOffsetHours?: number; timeZone?: string } = {}): { readings: IntervalReading[]; notes: string[] } {
  const wallClock = options.timeZone ? wallClockReader(options.timeZone) : null;
  const records = readCsvRecords(text);
  const { headerIdx, col } = findCsvHeader(records);
  const issues: EngineIssue[] = [];
  const notes: string[] = [];
  const rows: CsvRow[] = [];
  const counts = { withOffset: 0, withoutOffset: 0 };
  for (let i = headerIdx + 1; i < records.length && issues.length < MAX_ISSUES; i++) {
    if (isBlankRecord(records[i])) continue;
    const row = readCsvRow(records[i], col, options.utcOffsetHours, wallClock, counts, issues);
    if (row === "stop") break;
    if (row) rows.push(row);
  }
  if (issues.length > 0) throw new EngineInputError(issues, "interval CSV");
  if (rows.length === 0) throw new EngineInputError([{ path: `line ${headerIdx + 2}`, message: "no data rows" }], "interval CSV");
  if (counts.withoutOffset > 0) {
    notes.push(
      options.timeZone
        ? `Timestamps without a UTC offset were read as clock time in ${options.timeZone} (daylight saving included) and placed in local standard time.`
        : "Timestamps without a UTC offset were read as local standard time.",
    );
  }
  if (counts.withOffset > 0 && counts.withoutOffset > 0) notes.push("Some timestamps carry a UTC offset and some do not.");
  return { readings: csvReadings(rows), notes };
}

/**
 * Wall-clock stamps in a zone → seconds in local standard time (the grid's time). Meter exports
 * without an offset are wall-clock: in summer their "15:00" is 14:00 standard time. The hour
 * repeated when daylight saving ends appears twice; its second appearance is the later one.
 */
function wallClockReader(timeZone: string): (naiveSec: number) => number {
  const seen = new Set<number>();
  return (naiveSec) => {
    const wall = new Date(naiveSec * 1000);
    const instant = new TZDate(wall.getUTCFullYear(), wall.getUTCMonth(), wall.getUTCDate(), wall.getUTCHours(), wall.getUTCMinutes(), wall.getUTCSeconds(), timeZone).getTime();
    const standardMin = standardOffsetMinutes(timeZone, wall.getUTCFullYear());
    let ms = instant;
    if (seen.has(ms) && tzOffset(timeZone, new Date(ms + 3_600_000)) < tzOffset(timeZone, new Date(ms))) ms += 3_600_000;
    seen.add(ms);
    return ms / 1000 + standardMin * 60;
  };
}

// ---------------------------------------------------------------------------------------------
// Onto the 8760-hour grid
// ---------------------------------------------------------------------------------------------

export type IntervalMonth = {
  month: number;
  kwh: number;
  measuredHours: number;
  hours: number;
  coverage: number;
  status: "measured" | "partly estimated" | "estimated";
};

export type IntervalProfile = {
  /** 8760 hourly kWh, hour 0 = 1 January 00:00 local standard time; gaps filled (see `measured`). */
  hourlyKwh: number[];
  /** 1 where the hour was measured, 0 where it was filled. */
  measured: Uint8Array;
  measuredHours: number;
  /** Measured hours ÷ 8760. */
  coverage: number;
  monthlyKwh: number[];
  annualKwh: number;
  months: IntervalMonth[];
  /** Runs of unmeasured grid hours, as typical-year dates ("MM-DD HH:00", local standard time). */
  gaps: { from: string; to: string; hours: number }[];
  gapCount: number;
  readings: number;
  /** First and last reading start, local standard time. */
  firstReading: string;
  lastReading: string;
  receivedKwh: number | null;
  notes: string[];
};

const round1 = (x: number) => Math.round(x * 10) / 10;
const pad2 = (n: number) => String(n).padStart(2, "0");
const localIso = (sec: number) => new Date(sec * 1000).toISOString().slice(0, 16).replace("T", " ");

function gridLabel(h: number): string {
  const day = Math.floor(h / 24);
  const m = HOUR_MONTH[h];
  return `${pad2(m + 1)}-${pad2(day - MONTH_START_DAY[m] + 1)} ${pad2(h % 24)}:00`;
}

/** Each reading split over the clock hours it touches: kWh and seconds covered per hour since 1970, and the first and last start. */
function spreadOverClockHours(readings: readonly IntervalReading[], notes: string[]): { kwhByHour: Map<number, number>; secByHour: Map<number, number>; first: number; last: number } {
  const kwhByHour = new Map<number, number>();
  const secByHour = new Map<number, number>();
  let first = Infinity;
  let last = -Infinity;
  let longReadings = 0;
  for (const r of readings) {
    if (!(Number.isFinite(r.startSec) && r.durationSec > 0 && Number.isFinite(r.kwh) && r.kwh >= 0)) {
      throw new EngineInputError([{ path: "readings", message: `reading at ${r.startSec} s is not a finite, non-negative interval` }], "interval data");
    }
    first = Math.min(first, r.startSec);
    last = Math.max(last, r.startSec);
    if (r.durationSec > 3600) longReadings++;
    const end = r.startSec + r.durationSec;
    for (let hourStart = Math.floor(r.startSec / 3600) * 3600; hourStart < end; hourStart += 3600) {
      const overlap = Math.min(end, hourStart + 3600) - Math.max(r.startSec, hourStart);
      if (overlap <= 0) continue;
      const key = hourStart / 3600;
      kwhByHour.set(key, (kwhByHour.get(key) ?? 0) + (r.kwh * overlap) / r.durationSec);
      secByHour.set(key, (secByHour.get(key) ?? 0) + overlap);
    }
  }
  if (longReadings > 0) notes.push(`${longReadings} reading(s) longer than an hour were spread evenly over their hours.`);
  return { kwhByHour, secByHour, first, last };
}

/**
 * The clock hours at least half covered, scaled to a full hour and placed on the typical-year
 * grid: per grid hour the sum and the count of years (29 February left out).
 */
function ontoTypicalYear(kwhByHour: Map<number, number>, secByHour: Map<number, number>, notes: string[]): { sum: Float64Array; count: Uint16Array } {
  const sum = new Float64Array(HOURS_PER_YEAR);
  const count = new Uint16Array(HOURS_PER_YEAR);
  let duplicates = 0;
  let leapDayHours = 0;
  const years = new Set<number>();
  for (const [key, kwh] of kwhByHour) {
    const covered = secByHour.get(key) ?? 0;
    if (covered < MIN_HOUR_COVERAGE * 3600) continue;
    if (covered > 3600 + 1) duplicates++;
    const date = new Date(key * 3_600_000);
    const m = date.getUTCMonth();
    const d = date.getUTCDate();
    if (m === 1 && d === 29) {
      leapDayHours++;
      continue;
    }
    years.add(date.getUTCFullYear());
    const h = (MONTH_START_DAY[m] + d - 1) * 24 + date.getUTCHours();
    sum[h] += (kwh * 3600) / covered;
    count[h]++;
  }
  if (duplicates > 0) notes.push(`${duplicates} hour(s) had overlapping readings; they were averaged.`);
  if (leapDayHours > 0) notes.push(`${leapDayHours} hour(s) of 29 February were left out (the typical year has 365 days).`);
  if (years.size > 1) notes.push(`Readings span ${years.size} calendar years; the same hour of different years was averaged.`);
  return { sum, count };
}

/** The measured hours' kWh (the mean over the years) and which hours they are; at least one is needed. */
function measuredHoursOf(sum: Float64Array, count: Uint16Array): { measured: Uint8Array; hourly: number[]; measuredHours: number } {
  const measured = new Uint8Array(HOURS_PER_YEAR);
  const hourly = new Array<number>(HOURS_PER_YEAR).fill(0);
  let measuredHours = 0;
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    if (count[h] > 0) {
      measured[h] = 1;
      hourly[h] = sum[h] / count[h];
      measuredHours++;
    }
  }
  if (measuredHours === 0) {
    throw new EngineInputError([{ path: "readings", message: "no hour is at least half covered by readings" }], "interval data");
  }
  return { measured, hourly, measuredHours };
}

/** Fills the unmeasured hours of `hourly`: same month, same hour of day; else the reference load scaled to the measured hours. */
function fillUnmeasured(hourly: number[], measured: Uint8Array, measuredHours: number, notes: string[]): void {
  const slotSum = new Float64Array(12 * 24);
  const slotCount = new Uint16Array(12 * 24);
  let measuredKwh = 0;
  let measuredRef = 0;
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    if (!measured[h]) continue;
    const slot = HOUR_MONTH[h] * 24 + (h % 24);
    slotSum[slot] += hourly[h];
    slotCount[slot]++;
    measuredKwh += hourly[h];
    measuredRef += REFERENCE_LOAD_HOURLY_KWH[h];
  }
  const refScale = measuredRef > 0 ? measuredKwh / measuredRef : 0;
  let fromReference = 0;
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    if (measured[h]) continue;
    const slot = HOUR_MONTH[h] * 24 + (h % 24);
    if (slotCount[slot] > 0) hourly[h] = slotSum[slot] / slotCount[slot];
    else {
      hourly[h] = REFERENCE_LOAD_HOURLY_KWH[h] * refScale;
      fromReference++;
    }
  }
  if (measuredHours < HOURS_PER_YEAR) {
    notes.push(
      `${HOURS_PER_YEAR - measuredHours} of ${HOURS_PER_YEAR} hours were estimated: ${HOURS_PER_YEAR - measuredHours - fromReference} from the same month and hour of day, ${fromReference} from the reference load scaled to the measured hours.`,
    );
  }
}

/** The runs of unmeasured hours: all counted, the first MAX_REPORTED_GAPS listed. */
function gapRuns(measured: Uint8Array): { gaps: IntervalProfile["gaps"]; gapCount: number } {
  const gaps: IntervalProfile["gaps"] = [];
  let gapCount = 0;
  for (let h = 0; h < HOURS_PER_YEAR; ) {
    if (measured[h]) {
      h++;
      continue;
    }
    const start = h;
    while (h < HOURS_PER_YEAR && !measured[h]) h++;
    gapCount++;
    if (gaps.length < MAX_REPORTED_GAPS) gaps.push({ from: gridLabel(start), to: gridLabel(h - 1), hours: h - start });
  }
  return { gaps, gapCount };
}

/** Each month's kWh and how much of it was measured. */
function intervalMonths(hourly: number[], measured: Uint8Array): IntervalMonth[] {
  return MONTH_DAYS.map((days, m) => {
    let kwh = 0;
    let mh = 0;
    for (let h = MONTH_START_DAY[m] * 24; h < (MONTH_START_DAY[m] + days) * 24; h++) {
      kwh += hourly[h];
      mh += measured[h];
    }
    const coverage = mh / (days * 24);
    return {
      month: m + 1,
      kwh,
      measuredHours: mh,
      hours: days * 24,
      coverage,
      status: coverage >= MEASURED_MONTH_COVERAGE ? "measured" : mh > 0 ? "partly estimated" : "estimated",
    };
  });
}

/** Put interval readings (local standard seconds) onto the typical-year grid and fill the gaps. */
export function readingsToProfile(readings: readonly IntervalReading[], notesIn: string[] = [], receivedKwh: number | null = null): IntervalProfile {
  const notes = [...notesIn];
  const { kwhByHour, secByHour, first, last } = spreadOverClockHours(readings, notes);
  const { sum, count } = ontoTypicalYear(kwhByHour, secByHour, notes);
  const { measured, hourly, measuredHours } = measuredHoursOf(sum, count);
  fillUnmeasured(hourly, measured, measuredHours, notes);
  const { gaps, gapCount } = gapRuns(measured);
  const months = intervalMonths(hourly, measured);
  const monthlyKwh = months.map((m) => m.kwh);
  return {
    hourlyKwh: hourly,
    measured,
    measuredHours,
    coverage: measuredHours / HOURS_PER_YEAR,
    monthlyKwh,
    annualKwh: monthlyKwh.reduce((a, b) => a + b, 0),
    months,
    gaps,
    gapCount,
    readings: readings.length,
    firstReading: localIso(first),
    lastReading: localIso(last),
    receivedKwh,
    notes,
  };
}

export const intervalImportOptionsSchema = z.object({
  format: z.enum(["auto", "espi-xml", "csv"]).default("auto"),
  /** The site's standard UTC offset, hours (e.g. −5); used when the file does not give one. */
  utcOffsetHours: z.number().finite().min(-12).max(14).optional(),
  /** The site's IANA time zone: CSV stamps without an offset are its clock time (daylight saving included). */
  timeZone: z.string().refine(isTimeZone, { message: "is not a known time zone" }).optional(),
});
export type IntervalImportOptions = z.input<typeof intervalImportOptionsSchema>;

/** Green Button XML or interval CSV text → hourly profile with coverage and gaps. */
export function importIntervalData(text: string, options: IntervalImportOptions = {}): IntervalProfile {
  const opts = parseOrThrow(intervalImportOptionsSchema, options, "interval data");
  if (typeof text !== "string" || text.trim() === "") throw new EngineInputError([{ path: "file", message: "is empty" }], "interval data");
  const format = opts.format === "auto" ? (text.trimStart().replace(/^\uFEFF/, "").startsWith("<") ? "espi-xml" : "csv") : opts.format;
  if (format === "espi-xml") {
    const parsed = parseEspiXml(text, { utcOffsetHours: opts.utcOffsetHours });
    return readingsToProfile(parsed.readings, parsed.notes, parsed.receivedKwh);
  }
  const parsed = parseIntervalCsv(text, { utcOffsetHours: opts.utcOffsetHours, timeZone: opts.timeZone });
  return readingsToProfile(parsed.readings, parsed.notes);
}
