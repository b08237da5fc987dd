// Dates as bills print them: 10/28/2025, 10/28/25, 10-28-2025, 2025-10-28, Oct 28, 2025, October 28 2025,
// 28 Oct 2025, 28-OCT-25. US order (month first) for numeric dates: these are US bills.

const MONTH_NAMES = ["jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"];

/** A month name or its abbreviation ("Sept." too); -1 when it is not one. */
export function monthIndex(word: string): number {
  const w = word.toLowerCase().replace(/\.$/, "");
  if (w.length < 3) return -1;
  const i = MONTH_NAMES.indexOf(w.slice(0, 3));
  if (i < 0) return -1;
  const full = ["january", "february", "march", "april", "may", "june", "july", "august", "september", "october", "november", "december"][i];
  return full.startsWith(w) || (i === 8 && w === "sept") ? i : -1;
}

const MON = String.raw`[A-Za-z]{3,9}\.?`;
const DATE_FORMS = [
  String.raw`(?<n1>\d{1,2})/(?<n2>\d{1,2})/(?<n3>\d{4}|\d{2})(?!\d)`,
  String.raw`(?<i1>\d{4})-(?<i2>\d{2})-(?<i3>\d{2})`,
  String.raw`(?<h1>\d{1,2})-(?<h2>\d{1,2})-(?<h3>\d{4})`,
  String.raw`(?<w1>${MON}) (?<w2>\d{1,2}),? (?<w3>\d{4})`,
  String.raw`(?<d1>\d{1,2})[ -](?<d2>${MON})[ -](?<d3>\d{4}|\d{2})(?!\d)`,
];
/** One date in any form; named groups tell which. */
const DATE_SOURCE = `(?:${DATE_FORMS.join("|")})`;

const year = (s: string) => (s.length === 2 ? 2000 + Number(s) : Number(s));

function isoDate(y: number, m: number, d: number): string | null {
  const t = new Date(Date.UTC(y, m - 1, d));
  if (t.getUTCFullYear() !== y || t.getUTCMonth() !== m - 1 || t.getUTCDate() !== d || y < 2000 || y > 2100) return null;
  return t.toISOString().slice(0, 10);
}

/** The ISO date a match of DATE_SOURCE stands for, or null when it is no real date. */
function dateFromGroups(g: Record<string, string | undefined>): string | null {
  if (g.n1) return isoDate(year(g.n3!), Number(g.n1), Number(g.n2));
  if (g.i1) return isoDate(Number(g.i1), Number(g.i2), Number(g.i3));
  if (g.h1) return isoDate(Number(g.h3), Number(g.h1), Number(g.h2));
  if (g.w1) {
    const m = monthIndex(g.w1);
    return m < 0 ? null : isoDate(Number(g.w3), m + 1, Number(g.w2));
  }
  if (g.d2) {
    const m = monthIndex(g.d2);
    return m < 0 ? null : isoDate(year(g.d3!), m + 1, Number(g.d1));
  }
  return null;
}

export type FoundDate = { iso: string; index: number; end: number };

/** Every date in a piece of text, left to right. */
export function findDates(text: string): FoundDate[] {
  const out: FoundDate[] = [];
  for (const m of text.matchAll(new RegExp(DATE_SOURCE, "g"))) {
    const iso = dateFromGroups(m.groups ?? {});
    if (iso) out.push({ iso, index: m.index ?? 0, end: (m.index ?? 0) + m[0].length });
  }
  return out;
}

export const dayNumber = (iso: string) => Date.UTC(Number(iso.slice(0, 4)), Number(iso.slice(5, 7)) - 1, Number(iso.slice(8, 10))) / 86_400_000;

export function addDays(iso: string, days: number): string {
  return new Date((dayNumber(iso) + days) * 86_400_000).toISOString().slice(0, 10);
}

/** The same day of the month `months` later (or earlier), clamped to the month's last day. */
export function addMonths(iso: string, months: number): string {
  const y = Number(iso.slice(0, 4));
  const m = Number(iso.slice(5, 7)) - 1 + months;
  const d = Number(iso.slice(8, 10));
  const last = new Date(Date.UTC(y, m + 1, 0)).getUTCDate();
  return new Date(Date.UTC(y, m, Math.min(d, last))).toISOString().slice(0, 10);
}

/** "YYYY-MM" of the month holding most of a period's days (its midpoint). */
export function periodMonth(start: string, end: string): string {
  return addDays(start, Math.floor((dayNumber(end) - dayNumber(start)) / 2)).slice(0, 7);
}
