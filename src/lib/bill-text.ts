// Suggests billing periods, kWh and amounts from the text of a utility bill PDF. A heuristic
// for the rep to confirm, never saved on its own: utilities lay bills out in many ways, so
// every suggestion is shown beside the text it came from.

export type BillSuggestion = {
  periodStart: string; // YYYY-MM-DD
  periodEnd: string;
  kwh: number | null;
  costCents: number | null;
  /** The piece of text the numbers were read from, shown to the rep. */
  excerpt: string;
};

const MONTHS = ["jan", "feb", "mar", "apr", "may", "jun", "jul", "aug", "sep", "oct", "nov", "dec"];

const NUMERIC_DATE = String.raw`(\d{1,2})/(\d{1,2})/(\d{2,4})`;
const ISO_DATE = String.raw`(\d{4})-(\d{2})-(\d{2})`;
const NAMED_DATE = String.raw`([A-Za-z]{3,9})\.? (\d{1,2}),? (\d{4})`;
const DATE = `(?:${NUMERIC_DATE}|${ISO_DATE}|${NAMED_DATE})`;
const RANGE = new RegExp(`${DATE}\\s*(?:-|–|—|to|through|thru)\\s*${DATE}`, "gi");
const KWH = /(?<![\d,.])(\d{1,3}(?:,\d{3})+(?:\.\d+)?|\d+(?:\.\d+)?)\s*kwh/i;
const AMOUNT = /(?:amount due|total due|total amount|new charges|current charges|total)[^$\d]{0,40}\$?\s*(\d{1,3}(?:,\d{3})*(?:\.\d{2})|\d+\.\d{2})/i;

function toIso(parts: (string | undefined)[]): string | null {
  // parts: 9 captures of DATE → numeric (m, d, y) | iso (y, m, d) | named (month, d, y)
  const [nm, nd, ny, iy, im, id, wm, wd, wy] = parts;
  let y: number, m: number, d: number;
  if (nm !== undefined) {
    y = Number(ny);
    if (y < 100) y += 2000;
    m = Number(nm);
    d = Number(nd);
  } else if (iy !== undefined) {
    y = Number(iy);
    m = Number(im);
    d = Number(id);
  } else if (wm !== undefined) {
    const idx = MONTHS.indexOf(wm.slice(0, 3).toLowerCase());
    if (idx < 0) return null;
    y = Number(wy);
    m = idx + 1;
    d = Number(wd);
  } else return null;
  const t = new Date(Date.UTC(y, m - 1, d));
  if (t.getUTCFullYear() !== y || t.getUTCMonth() !== m - 1 || t.getUTCDate() !== d || y < 2000 || y > 2100) return null;
  return t.toISOString().slice(0, 10);
}

const number = (s: string) => Number(s.replaceAll(",", ""));

/** Every billing period found in the text, with the kWh and amount that follow it. */
export function suggestBillsFromText(text: string): BillSuggestion[] {
  const flat = text.replace(/\s+/g, " ");
  const found: BillSuggestion[] = [];
  const matches = [...flat.matchAll(RANGE)];
  matches.forEach((match, i) => {
    const start = toIso(match.slice(1, 10));
    const end = toIso(match.slice(10, 19));
    if (!start || !end || end <= start) return;
    // Look for the figures between this period and the next one (at most 400 characters).
    const from = (match.index ?? 0) + match[0].length;
    const until = Math.min(matches[i + 1]?.index ?? flat.length, from + 400);
    const window = flat.slice(from, until);
    const kwh = window.match(KWH);
    const amount = window.match(AMOUNT);
    if (found.some((f) => f.periodStart === start && f.periodEnd === end)) return;
    found.push({
      periodStart: start,
      periodEnd: end,
      kwh: kwh ? number(kwh[1]) : null,
      costCents: amount ? Math.round(number(amount[1]) * 100) : null,
      excerpt: flat.slice(match.index ?? 0, Math.min(until, from + 160)).trim(),
    });
  });
  return found;
}
