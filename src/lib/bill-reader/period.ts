// The current billing period: a printed range ("10/28/2025 - 11/25/2025", "Oct 28, 2025 to
// Nov 25, 2025", "Service from 09/14/25 through 10/13/25") or the previous and current
// meter-read dates, with or without the days ("(29 days)").
import { dayNumber, findDates, monthIndex, type FoundDate } from "./dates";
import { center, type Line } from "./layout";
import { whereOf, type BillReading, type Confidence } from "./types";

type Candidate = {
  start: string;
  end: string;
  line: Line;
  score: number;
  days: number | null;
};

// Spanish / French / Portuguese bills join a range with "al", "a", "hasta", "au", "à", "até".
const BETWEEN = /^\s*(?:-|–|—|to|through|thru|until|and|al|a|hasta|au|à|até)\s*$/iu;
const PERIOD_LABEL = /\b(billing|service|usage|meter|read(?:ing)?|bill)\s+(period|dates?|days|from|cycle)\b|\bservice\s+(from|dates?|period)\b|\bfor service\b|\bperiod\b|\bper[ií]odo\b|\bpériode\b|\bfacturaci[oó]n\b/iu;
const OTHER_SERVICE = /\b(gas|water|sewer|trash|therms?|ccf|gallons?|gal)\b/i;
const NOT_PERIOD = /\bdue\b|\bpay(ment)?\b|\bissued?\b|\bstatement date\b/i;
const DAYS = /\(?\b(\d{1,3})\s*(?:billing\s+|service\s+)?days?\b\)?|\bdays(?:\s+(?:in|of)\s+(?:the\s+)?(?:billing\s+)?(?:period|cycle))?\s*:?\s*(\d{1,3})\b/i;
// Read dates by their label, or a meter table's "From" / "To" columns.
// The words for the earlier and the later read are families ("prior", "opening", "beginning" …);
// a read date with no such word ("Read Date: 12/04/2025") is the current read when a previous one is printed.
const EARLIER = String.raw`previous|prior|last|start|from|opening|beginning|begin|old|earlier`;
const LATER = String.raw`current|present|this|end|ending|latest|to|closing|new|recent`;
const PREVIOUS_READ = new RegExp(String.raw`\b(${EARLIER})\s+(meter\s+)?read(ing)?(\s+date)?\b|\b(previous|prior)\s+date\b|^(from|start|start\s+date|period\s+start|begin)$|^(previous|prior|last)\s*:`, "i");
const CURRENT_READ = new RegExp(
  String.raw`\b(${LATER})\s+(meter\s+)?read(ing)?(\s+date)?\b|\bcurrent\s+date\b|^(to|end|end\s+date|period\s+end|through)$|^(present|current)\s*:|^(meter\s+)?(read(ing)?\s+date|date\s+read)\b`,
  "i",
);

function printedDays(text: string): number | null {
  const m = text.match(DAYS);
  const n = m ? Number(m[1] ?? m[2]) : NaN;
  return n >= 1 && n <= 120 ? n : null;
}

function daysFit(start: string, end: string, days: number | null): boolean {
  if (days === null) return false;
  const span = dayNumber(end) - dayNumber(start);
  return days === span || days === span + 1;
}

/** The cell of `line` that holds character `at` of its text (cells are joined by two spaces). */
function cellAt(line: Line, at: number): Line["cells"][number] | undefined {
  let start = 0;
  for (const c of line.cells) {
    if (at < start + c.text.length) return c;
    start += c.text.length + 2;
  }
  return undefined;
}

/**
 * Services side by side in columns ("Natural gas" | "Electric", each with its own "Service …"
 * line): the heading right above the range's cell names its service when the line does not.
 */
function otherServiceColumn(line: Line, prev: Line | undefined, at: number): boolean {
  const cell = cellAt(line, at);
  if (!cell || !prev || prev.page !== line.page) return false;
  const heading = prev.cells.find((h) => h.x < cell.xEnd && h.xEnd > cell.x);
  return heading !== undefined && OTHER_SERVICE.test(heading.text) && !/electric/i.test(heading.text);
}

function rangesOnLine(line: Line, prev: Line | undefined): Candidate[] {
  const dates = findDates(line.text);
  const out: Candidate[] = [];
  for (let i = 0; i + 1 < dates.length; i++) {
    const [a, b] = [dates[i], dates[i + 1]];
    if (!BETWEEN.test(line.text.slice(a.end, b.index)) || b.iso <= a.iso || dayNumber(b.iso) - dayNumber(a.iso) > 100) continue;
    const before = line.text.slice(0, a.index);
    const labelled = PERIOD_LABEL.test(before) || (before.trim() === "" && prev !== undefined && PERIOD_LABEL.test(prev.text) && !findDates(prev.text).length);
    const days = printedDays(line.text.slice(b.end)) ?? printedDays(before);
    let score = labelled ? 3 : 1;
    if (NOT_PERIOD.test(before)) score -= 2;
    // A bill for several services: the electric period, not the gas or water one.
    if ((OTHER_SERVICE.test(line.text) && !/electric/i.test(line.text)) || otherServiceColumn(line, prev, a.index)) score -= 2;
    if (daysFit(a.iso, b.iso, days)) score += 1;
    out.push({ start: a.iso, end: b.iso, line, score, days });
    i++;
  }
  return out;
}

/** A date for a read-date label: after it in its own cell, in the next cell, or in the cell below it. */
function dateNear(lines: Line[], at: number, label: RegExp): { date: FoundDate; line: Line } | null {
  const line = lines[at];
  const cells = line.cells;
  for (let c = 0; c < cells.length; c++) {
    const m = cells[c].text.match(label);
    if (!m) continue;
    const inCell = findDates(cells[c].text.slice((m.index ?? 0) + m[0].length));
    if (inCell.length) return { date: inCell[0], line };
    const next = cells[c + 1] ? findDates(cells[c + 1].text) : [];
    if (next.length && !label.test(cells[c + 1].text)) return { date: next[0], line };
    // Up to four lines down: a heading wrapped over two lines ("Previous read" / "date") and a
    // meter number wrapped above its row ("W-" / "31177") both push the row down.
    for (let k = at + 1; k < Math.min(lines.length, at + 5) && lines[k].page === line.page; k++) {
      const below = lines[k].cells.find((x) => Math.abs(center(x) - center(cells[c])) < Math.max(40, (cells[c].xEnd - cells[c].x) / 2 + 10));
      const found = below ? findDates(below.text) : [];
      if (found.length) return { date: found[0], line: lines[k] };
    }
  }
  return null;
}

function readDates(lines: Line[]): Candidate[] {
  const out: Candidate[] = [];
  for (let i = 0; i < lines.length; i++) {
    if (!lines[i].cells.some((c) => PREVIOUS_READ.test(c.text))) continue;
    const from = dateNear(lines, i, PREVIOUS_READ);
    if (!from) continue;
    for (let j = i; j < Math.min(lines.length, i + 4); j++) {
      if (!lines[j].cells.some((c) => CURRENT_READ.test(c.text))) continue;
      const to = dateNear(lines, j, CURRENT_READ);
      if (!to || to.date.iso <= from.date.iso) continue;
      const days = printedDays(lines[i].text) ?? printedDays(to.line.text);
      out.push({
        start: from.date.iso,
        end: to.date.iso,
        line: to.line,
        score: 3 + (daysFit(from.date.iso, to.date.iso, days) ? 1 : 0),
        days,
      });
      break;
    }
  }
  return out;
}

/** The current period: the best-labelled range, the newest one on a tie (from lines without the usage history). */
const NO_YEAR_RANGE = new RegExp(String.raw`\b(?<m1>[A-Za-z]{3,9})\.? (?<d1>\d{1,2})\s*(?:-|–|—|to|through|thru)\s*(?<m2>[A-Za-z]{3,9})\.? (?<d2>\d{1,2})\b(?!\s*,?\s*\d{4})`, "i");

/**
 * A labelled period printed without a year ("SERVICE SEP 24 – OCT 23 (29 DAYS)"): the year is the
 * one that puts its end on or before the bill's latest full date (the bill date), the start a
 * year earlier when its month comes later (over New Year). Only when no dated period is printed.
 */
function yearlessPeriod(lines: Line[]): Candidate | null {
  const latest = lines.flatMap((l) => findDates(l.text).map((d) => d.iso)).sort().at(-1);
  if (!latest) return null;
  for (const line of lines) {
    const m = PERIOD_LABEL.test(line.text) || /\bservice\b/i.test(line.text) ? line.text.match(NO_YEAR_RANGE) : null;
    if (!m?.groups || NOT_PERIOD.test(line.text.slice(0, m.index))) continue;
    const [m1, m2] = [monthIndex(m.groups.m1), monthIndex(m.groups.m2)];
    if (m1 < 0 || m2 < 0) continue;
    const y = Number(latest.slice(0, 4));
    const endYear = `${y}-${String(m2 + 1).padStart(2, "0")}-${m.groups.d2.padStart(2, "0")}` <= latest ? y : y - 1;
    const start = `${m1 > m2 ? endYear - 1 : endYear}-${String(m1 + 1).padStart(2, "0")}-${m.groups.d1.padStart(2, "0")}`;
    const end = `${endYear}-${String(m2 + 1).padStart(2, "0")}-${m.groups.d2.padStart(2, "0")}`;
    if (dayNumber(end) - dayNumber(start) > 10 && dayNumber(end) - dayNumber(start) < 70) return { start, end, line, score: 2, days: printedDays(line.text) };
  }
  return null;
}

/**
 * A period in a paragraph that wraps inside its column ("Service from September 9th, 2026 to
 * October 8th," / "2026 — 29 days"): a labelled cell joined with the cell that starts at its left
 * edge on one of the next lines.
 */
function wrappedRanges(lines: Line[]): Candidate[] {
  return lines.flatMap((line, i) =>
    line.cells.flatMap((cell) => {
      if (!PERIOD_LABEL.test(cell.text)) return [];
      const next = lines.slice(i + 1, i + 4).find((l) => l.page === line.page && l.cells.some((c) => Math.abs(c.x - cell.x) < 4));
      const cont = next?.cells.find((c) => Math.abs(c.x - cell.x) < 4);
      if (!next || !cont) return [];
      const text = `${cell.text} ${cont.text}`;
      return rangesOnLine({ ...line, cells: [{ ...cell, text }], text }, undefined).map((c) => ({ ...c, score: c.score - 1 }));
    }),
  );
}

export function readPeriod(lines: Line[]): BillReading["period"] {
  const candidates = [...lines.flatMap((l, i) => rangesOnLine(l, lines[i - 1])), ...readDates(lines)];
  if (!candidates.length) candidates.push(...wrappedRanges(lines));
  const yearless = candidates.length ? null : yearlessPeriod(lines);
  if (yearless) candidates.push(yearless);
  if (!candidates.length) return null;
  candidates.sort((a, b) => b.score - a.score || (b.end > a.end ? 1 : b.end < a.end ? -1 : 0));
  const best = candidates[0];
  const rivals = candidates.filter((c) => c.score === best.score && (c.start !== best.start || c.end !== best.end));
  const confidence: Confidence = best.score >= 3 && !rivals.length ? "high" : best.score >= 2 ? "medium" : "low";
  const where = whereOf(best.line);
  const days = best.days ?? dayNumber(best.end) - dayNumber(best.start);
  return {
    start: { value: best.start, where, confidence },
    end: { value: best.end, where, confidence },
    days,
  };
}
