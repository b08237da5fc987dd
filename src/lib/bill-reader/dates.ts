// Dates as bills print them: 10/28/2025, 10/28/25, 10-28-2025, 2025-10-28, Oct 28, 2025, October 28 2025,
// 28 Oct 2025, 28-OCT-25. US order (month first) for numeric dates: these are US bills.

const MONTH_NAMES = ["jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"];
const FULL_NAMES = ["january", "february", "march", "april", "may", "june", "july", "august", "september", "october", "november", "december"];
/**
 * Month names of the other languages bilingual US bills print (Spanish most, French and
 * Portuguese sometimes): full names; any prefix of 3+ letters of one counts, as in English.
 * "set" and "out" (Portuguese) are left out: they are English words.
 */
const OTHER_NAMES: string[][] = [
  ["enero", "janvier", "janeiro"],
  ["febrero", "février", "fevrier", "fevereiro"],
  ["marzo", "mars", "março", "marco"],
  ["abril", "avril"],
  ["mayo", "mai", "maio"],
  ["junio", "juin", "junho"],
  ["julio", "juillet", "julho"],
  ["agosto", "août", "aout"],
  ["septiembre", "setiembre", "septembre", "setembro"],
  ["octubre", "octobre", "outubro"],
  ["noviembre", "novembre", "novembro"],
  ["diciembre", "décembre", "decembre", "dezembro"],
];

function singleMonth(w: string): number {
  if (w.length < 3) return -1;
  const i = MONTH_NAMES.indexOf(w.slice(0, 3));
  if (i >= 0 && (FULL_NAMES[i].startsWith(w) || (i === 8 && w === "sept"))) return i;
  // "mai" is a whole word, not a prefix of 3 of a longer name.
  const j = OTHER_NAMES.findIndex((names) => names.some((n) => n === w || (w.length >= 3 && n.startsWith(w) && n !== "mai" && w !== "set" && w !== "out")));
  return j;
}

/**
 * A month name or its abbreviation ("Sept." too), in English or as bilingual bills print it
 * ("dic", "enero", "Ene/Jan", "Jan / Ene"); -1 when it is not one. Two names joined by a slash
 * must name the same month.
 */
export function monthIndex(word: string): number {
  const parts = word
    .toLowerCase()
    .split(/\s*\/\s*/)
    .map((p) => p.replace(/\.$/, ""));
  if (parts.length > 2) return -1;
  const found = parts.map(singleMonth);
  return found.every((i) => i >= 0 && i === found[0]) ? found[0] : -1;
}

/** A month word, also accented ("déc", "août") or two joined by a slash ("Ene/Jan"). */
const MON = String.raw`\p{L}{3,10}\.?(?:\s?/\s?\p{L}{3,10}\.?)?`;
const DATE_FORMS = [
  String.raw`(?<n1>\d{1,2})/(?<n2>\d{1,2})/(?<n3>\d{4}|\d{2})(?!\d)`,
  String.raw`(?<i1>\d{4})-(?<i2>\d{2})-(?<i3>\d{2})`,
  String.raw`(?<h1>\d{1,2})-(?<h2>\d{1,2})-(?<h3>\d{4})`,
  // Ordinal days too: "September 9th, 2026", "2nd Nov 2026".
  String.raw`(?<w1>${MON}) (?<w2>\d{1,2})(?:st|nd|rd|th)?,? (?<w3>\d{4})`,
  String.raw`(?<d1>\d{1,2})(?:st|nd|rd|th)?[ -](?<d2>${MON})[ -](?<d3>\d{4}|\d{2})(?!\d)`,
  // Spanish and Portuguese write "7 de octubre de 2026".
  String.raw`(?<s1>\d{1,2}) de (?<s2>${MON}) (?:de|del) (?<s3>\d{4})`,
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
  if (g.s2) {
    const m = monthIndex(g.s2);
    return m < 0 ? null : isoDate(Number(g.s3), m + 1, Number(g.s1));
  }
  if (g.d2) {
    const m = monthIndex(g.d2);
    return m < 0 ? null : isoDate(year(g.d3!), m + 1, Number(g.d1));
  }
  return null;
}

export type FoundDate = { iso: string; index: number; end: number };

const RANGE_DASH = String.raw`\s*(?:-|–|—|to|through|thru)\s*`;
/**
 * A range that prints its year once, at the end: "Nov 3 - Dec 2, 2025", "3 Nov – 2 Dec 2025".
 * The first date takes the end's year, or the year before when its month comes later (a range
 * over New Year: "Dec 18 - Jan 17, 2026").
 */
const YEAR_ONCE = [
  new RegExp(String.raw`(?<m1>${MON}) (?<d1>\d{1,2})(?<dash>${RANGE_DASH})(?<m2>${MON}) (?<d2>\d{1,2}),? (?<y>\d{4})`, "gu"),
  new RegExp(String.raw`(?<d1>\d{1,2}) (?<m1>${MON})(?<dash>${RANGE_DASH})(?<d2>\d{1,2}) (?<m2>${MON}),? (?<y>\d{4})`, "gu"),
];

function yearOnceRanges(text: string): FoundDate[] {
  const out: FoundDate[] = [];
  for (const re of YEAR_ONCE) {
    for (const m of text.matchAll(re)) {
      const g = m.groups!;
      const [m1, m2, y] = [monthIndex(g.m1), monthIndex(g.m2), Number(g.y)];
      if (m1 < 0 || m2 < 0) continue;
      const start = isoDate(m1 > m2 ? y - 1 : y, m1 + 1, Number(g.d1));
      const end = isoDate(y, m2 + 1, Number(g.d2));
      if (!start || !end) continue;
      const at = m.index ?? 0;
      const firstEnd = at + m[0].indexOf(g.dash, g.m1.length + g.d1.length);
      out.push({ iso: start, index: at, end: firstEnd }, { iso: end, index: firstEnd + g.dash.length, end: at + m[0].length });
    }
  }
  return out;
}

/** Every date in a piece of text, left to right. */
export function findDates(text: string): FoundDate[] {
  const out = yearOnceRanges(text);
  const taken = (i: number) => out.some((d) => i >= d.index && i < d.end);
  for (const m of text.matchAll(new RegExp(DATE_SOURCE, "gu"))) {
    const iso = dateFromGroups(m.groups ?? {});
    if (iso && !taken(m.index ?? 0)) out.push({ iso, index: m.index ?? 0, end: (m.index ?? 0) + m[0].length });
  }
  return out.sort((a, b) => a.index - b.index);
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
