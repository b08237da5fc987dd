// The usage history most bills print: a table with a row per month (month, days, kWh …), a
// table with the months across, or the value labels of a bar chart, 12 or 13 months, on any
// page. Years the bill does not print are worked out from the current period.
import { dayNumber, findDates, monthIndex, periodMonth } from "./dates";
import { center, type Cell, type Line } from "./layout";
import { NUMBER, toNumber, whereOf, type BillHistory, type Confidence, type HistoryMonth } from "./types";

/** A month label: "Nov", "NOVEMBER", "Nov 2025", "Nov '25", "Nov-25", "11/2025", "2025-11". `noisy` when OCR noise had to be read past. */
type MonthLabel = { month: number; year: number | null; noisy?: boolean };
type Row = {
  label: MonthLabel | { start: string; end: string };
  kwh: number;
  days: number | null;
  line: Line;
  cells: Cell[];
  /** No heading placed the figures: the kWh was picked from several by their size. */
  guessed?: boolean;
};

function cleanMonthLabel(t: string): MonthLabel | null {
  // Also other languages' names and bilingual pairs ("dic 2025", "Ene/Jan '26"): monthIndex knows them.
  let m = t.match(/^(\p{L}{3,10}\.?(?:\s?\/\s?\p{L}{3,10}\.?)?)(?:[\s'’-]*('?\d{4}|'?\d{2}))?$/u);
  if (m) {
    const month = monthIndex(m[1]);
    if (month < 0) return null;
    const y = m[2]?.replace("'", "");
    return {
      month,
      year: y ? (y.length === 2 ? 2000 + Number(y) : Number(y)) : null,
    };
  }
  // A read date labels its bill's month ("11/21/25" in a history keyed by read dates).
  const dates = findDates(t);
  if (dates.length === 1 && dates[0].index === 0 && dates[0].end === t.length) return { month: Number(dates[0].iso.slice(5, 7)) - 1, year: Number(dates[0].iso.slice(0, 4)) };
  m = t.match(/^(\d{1,2})\/(\d{4})$/);
  if (m) return Number(m[1]) >= 1 && Number(m[1]) <= 12 ? { month: Number(m[1]) - 1, year: Number(m[2]) } : null;
  m = t.match(/^(\d{4})-(\d{2})$/);
  if (m) return Number(m[2]) >= 1 && Number(m[2]) <= 12 ? { month: Number(m[2]) - 1, year: Number(m[1]) } : null;
  return null;
}

/**
 * OCR noise around a month label: other quote marks ("Dec ‘24"), stray punctuation or one stray
 * character ("Mar ;", "May'25 9"), a slash read as 7, 1, l or | or lost ("1072024" for 10/2024).
 * Such labels are marked noisy: the history keeps them only when the months still run on.
 */
function noisyMonthLabel(text: string): MonthLabel | null {
  const t = text
    .replace(/[‘`´]/g, "'")
    .replace(/^[^A-Za-z\d']+|[^A-Za-z\d]+$/g, "")
    .replace(/^(\S{3,}) \S$/, "$1");
  // A month name OCR broke with a space ("J anuary 2025", "Sep tember").
  const clean = cleanMonthLabel(t) ?? cleanMonthLabel(t.replace(/^(\p{L}{1,4}) (\p{L}{2,})/u, "$1$2"));
  if (clean) return { ...clean, noisy: true };
  // Slash lost ("112025": 11/2025) before slash misread ("172025": 1/2025).
  const m = t.match(/^(0[1-9]|1[0-2])(20\d{2})$/) ?? t.match(/^(\d{1,2}?)[71lI|\\/](20\d{2})$/);
  return m && Number(m[1]) >= 1 && Number(m[1]) <= 12 ? { month: Number(m[1]) - 1, year: Number(m[2]), noisy: true } : null;
}

function monthLabel(text: string): MonthLabel | null {
  const t = text.trim();
  return cleanMonthLabel(t) ?? noisyMonthLabel(t);
}

const NUM_CELL = new RegExp(String.raw`^(${NUMBER})(\s*kwh)?$`, "i");
/**
 * OCR reads 0 as O and 1 as l, I or |: fixed only inside a figure that has real digits ("1,O36",
 * "l,142"); and a thousands comma as a point ("1.148"): a month's kWh never has three decimals.
 */
const digitsOf = (text: string) => (/\d/.test(text) && /^[\dOolI|,.]+(\s*kwh)?$/i.test(text) ? text.replace(/[Oo]/g, "0").replace(/[lI|]/g, "1").replace(/^(\d{1,3})\.(\d{3})\b/, "$1,$2") : text);
const number = (c: Cell | undefined) => {
  const m = c ? digitsOf(c.text).match(NUM_CELL) : null;
  return m ? toNumber(m[1]) : null;
};
/** "net": a net-metering column or row (used when it is the only kWh the history prints). */
type Kind = "kwh" | "days" | "net" | "other";
function oneHeaderKind(t: string): Kind {
  // Net metering: the month's use is what came from the grid, not what went to it or the net.
  if (/received|exported|to\s+(the\s+)?grid|sent|returned|generat|excess/.test(t)) return "other";
  if (/\bnet\b/.test(t)) return "net";
  if (/delivered|imported|from\s+(the\s+)?grid|purchased/.test(t)) return "kwh";
  if (/avg|average|per\s+day|daily|temp|cost|\$|amount|charge|bill\b|degree|°|promedio|costo|cargo|importe|factura/.test(t)) return "other";
  if (/kwh|usage|use\b|used|consumption|energy|consumo|uso\b|energ[ií]a|consommation/.test(t)) return "kwh";
  if (/days?\b|d[ií]as\b|jours\b/.test(t)) return "days";
  return "other";
}
/** A column heading's kind; a bilingual one ("Días / Days", "Consumo / Usage") by either half. */
function headerKind(text: string): Kind {
  const t = text.toLowerCase();
  if (/(kwh|use|usage|consumo)\s*\/\s*(day|d[ií]a)/.test(t)) return "other";
  const kinds = t.split(/\s*\/\s*/).map(oneHeaderKind);
  return kinds.find((k) => k !== "other") ?? "other";
}
const nearest = (cells: Cell[], x: number, half: number) =>
  cells.reduce<Cell | null>((best, c) => (Math.abs(center(c) - x) < half && (!best || Math.abs(center(c) - x) < Math.abs(center(best) - x)) ? c : best), null);

// ── Rows: one month per line ────────────────────────────────────────────────────────────────

/**
 * Each figure's column heading: figures and headings are paired in their left-to-right order, at
 * the least total distance between centres, a figure may have no heading (OCR lost it: it costs
 * half a column) and no pair may be more than a column apart. A right-aligned figure can sit
 * nearer the next column's centred heading than its own; order keeps it in its column, and a lost
 * heading or figure does not shift the others.
 */
function pairWithHeadings(figures: Cell[], headings: Cell[]): (Cell | null)[] {
  const hc = headings.map(center);
  const gaps = hc.slice(1).map((c, i) => c - hc[i]).sort((a, b) => a - b);
  const column = gaps.length ? gaps[Math.floor(gaps.length / 2)] : 60;
  const skip = Math.max(20, column / 2);
  const [n, m] = [figures.length, headings.length];
  // best[i][j]: the least cost of placing the first i figures against the first j headings.
  const best = Array.from({ length: n + 1 }, () => new Array<number>(m + 1).fill(Infinity));
  const how = Array.from({ length: n + 1 }, () => new Array<"pair" | "figure" | "heading">(m + 1));
  best[0][0] = 0;
  for (let i = 0; i <= n; i++)
    for (let j = 0; j <= m; j++) {
      if (i === 0 && j === 0) continue;
      const d = i && j ? Math.abs(center(figures[i - 1]) - hc[j - 1]) : Infinity;
      const options: [number, "pair" | "figure" | "heading"][] = [
        [i && j && d <= column ? best[i - 1][j - 1] + d : Infinity, "pair"],
        [i ? best[i - 1][j] + skip : Infinity, "figure"],
        [j ? best[i][j - 1] : Infinity, "heading"],
      ];
      [best[i][j], how[i][j]] = options.reduce((a, b) => (b[0] < a[0] ? b : a));
    }
  const out: (Cell | null)[] = new Array(n).fill(null);
  for (let [i, j] = [n, m]; i > 0 || j > 0; ) {
    const step = how[i][j];
    if (step === "pair") out[--i] = headings[--j];
    else if (step === "figure") i--;
    else j--;
  }
  return out;
}

/** A row starting at cell `at`: a month label (or a date range at the line's start) and the figures right of it. */
function rowOf(line: Line, at: number, header: Line | null): Row | null {
  const first = line.cells[at];
  let label: Row["label"] | null = monthLabel(first.text);
  const next = line.cells.findIndex((c, k) => k > at && monthLabel(c.text));
  let rest = line.cells.slice(at + 1, next < 0 ? undefined : next);
  if (!label) {
    const dates = findDates(line.text);
    if (at !== 0 || dates.length < 2 || dates[0].index !== 0 || !/^\s*(-|–|—|to|through|thru)\s*$/i.test(line.text.slice(dates[0].end, dates[1].index))) return null;
    label = { start: dates[0].iso, end: dates[1].iso };
    rest = line.cells.filter((c) => c.x > first.x && !findDates(c.text).length);
  }
  if (!rest.length) return null;
  let kwh: number | null = null;
  let days: number | null = null;
  let net: number | null = null;
  if (header) {
    const own = nearest(header.cells, center(first), 80);
    const headings = pairWithHeadings(rest, own ? header.cells.filter((h) => h.x > own.x) : header.cells);
    for (const [k, c] of rest.entries()) {
      const h = headings[k];
      const kind = h ? headerKind(h.text) : "other";
      if (kind === "kwh" && kwh === null) kwh = number(c);
      if (kind === "days" && days === null) days = number(c);
      if (kind === "net" && net === null) net = number(c);
    }
  }
  kwh ??= net;
  let guessed = false;
  if (kwh === null) {
    const tagged = rest.find((c) => /kwh$/i.test(c.text) && number(c) !== null);
    const nums = rest.filter((c) => !c.text.includes("$") && number(c) !== null && !/\./.test(c.text));
    if (tagged) kwh = number(tagged);
    else if (nums.length >= 2 && number(nums[0])! >= 20 && number(nums[0])! <= 40) [days, kwh] = [number(nums[0]), number(nums[1])];
    else if (nums.length) kwh = number(nums[0]);
    guessed = !tagged && nums.length >= 2;
  }
  return kwh === null ? null : { label, kwh, days, line, cells: [first, ...rest], guessed };
}

function headerAbove(lines: Line[], i: number): Line | null {
  for (let k = i - 1; k >= Math.max(0, i - 3) && lines[k].page === lines[i].page; k--) {
    if (lines[k].cells.length >= 2 && lines[k].cells.some((c) => headerKind(c.text) === "kwh")) return lines[k];
  }
  return null;
}

type Block = {
  x: number;
  page: number;
  last: number;
  first: number;
  ats: number[];
  lines: Line[];
};

/** Runs of at least six month rows, each run in its own column (a table may sit beside other text). */
function tableRows(lines: Line[]): { rows: Row[]; header: Line | null }[] {
  const blocks: Block[] = [];
  lines.forEach((line, i) => {
    line.cells.forEach((cell, at) => {
      if (!rowOf(line, at, null)) return;
      // The next row of a table: close below, or further when the lines between are beside the
      // table (charges that wrap), none of them reaching into the table's columns.
      // The row's own extent: its month and the figures that follow it (text further right is beside it).
      const run = line.cells.slice(at + 1).findIndex((c) => number(c) === null);
      const xEnd = line.cells[run < 0 ? line.cells.length - 1 : at + run].xEnd;
      const beside = (from: number) => lines.slice(from + 1, i).every((l) => l.cells.every((c) => c.xEnd < cell.x - 4 || c.x > xEnd + 4));
      const near = (b: Block) => i - b.last <= 2 || (i - b.last <= 6 && beside(b.last));
      const open = blocks.find((b) => b.page === line.page && near(b) && Math.abs(b.x - cell.x) < 8);
      if (open) [open.last, open.ats, open.lines] = [i, [...open.ats, at], [...open.lines, line]];
      else
        blocks.push({
          x: cell.x,
          page: line.page,
          last: i,
          first: i,
          ats: [at],
          lines: [line],
        });
    });
  });
  return blocks
    .filter((b) => b.lines.length >= 6)
    .map((b) => {
      const header = headerAbove(lines, b.first);
      return {
        rows: b.lines.map((l, k) => rowOf(l, b.ats[k], header)).filter((r): r is Row => r !== null),
        header,
      };
    });
}

// ── Months across: a row of month labels, with labelled rows below or chart labels above ──

type Across = {
  months: MonthLabel[];
  cells: Cell[];
  kwh: (number | null)[];
  days: (number | null)[];
  lines: Line[];
  chart: boolean;
  /** The kWh row has no label of its own (figures right under the months). */
  unlabelled?: boolean;
};

const INITIALS = "JFMAMJJASOND";

/**
 * Where each month label sits in a row of evenly spaced columns: its slot (0, 1, 2 …), counted
 * in the row's usual spacing. Null when the labels are not evenly spaced (not one row of months).
 */
function slotsOf(cells: Cell[]): number[] | null {
  const centers = cells.map(center);
  const gaps = centers.slice(1).map((c, i) => c - centers[i]).sort((a, b) => a - b);
  const step = gaps[Math.floor(gaps.length / 2)];
  if (!(step > 0)) return null;
  const slots = centers.map((c) => Math.round((c - centers[0]) / step));
  const even = centers.every((c, i) => Math.abs((c - centers[0]) / step - slots[i]) <= 0.25 && (i === 0 || slots[i] > slots[i - 1]));
  return even && slots.at(-1)! < 13 ? slots : null;
}

/**
 * A month row with one or two labels OCR lost or misread between the others ("D J F … S (+) N",
 * "Feb … Nov" without "Mar"): each empty column between labels gets the month its place says,
 * marked noisy (the history keeps it only when the months run on). Labels must be evenly spaced.
 */
function withLostMonths(cells: Cell[], labels: (MonthLabel | null)[], first: number | null): { cells: Cell[]; labels: MonthLabel[] } | null {
  const slots = slotsOf(cells);
  if (!slots || first === null || slots.at(-1)! + 1 - cells.length > 2) return null;
  const step = slots.at(-1)! ? (center(cells.at(-1)!) - center(cells[0])) / slots.at(-1)! : 0;
  const width = cells[0].xEnd - cells[0].x;
  const out = { cells: [] as Cell[], labels: [] as MonthLabel[] };
  for (let s = 0; s <= slots.at(-1)!; s++) {
    const k = slots.indexOf(s);
    const at = center(cells[0]) + s * step;
    out.cells.push(k >= 0 ? cells[k] : { text: "", x: at - width / 2, xEnd: at + width / 2 });
    out.labels.push(k >= 0 && labels[k] ? labels[k] : { month: (first + s) % 12, year: null, noisy: true });
  }
  return out;
}

/** Months printed as one letter each (J F M A …): the one place in the year where the letters fit, if only one does. */
function initialLabels(cells: Cell[]): { cells: Cell[]; labels: MonthLabel[] } | null {
  const slots = slotsOf(cells);
  if (!slots || cells.length < 6) return null;
  const letters = cells.map((c) => c.text.toUpperCase());
  const fits = [...Array(12).keys()].filter((r) => letters.every((ch, i) => INITIALS[(r + slots[i]) % 12] === ch));
  if (fits.length !== 1) return null;
  const labels = slots.map((s) => ({ month: (fits[0] + s) % 12, year: null }));
  return slots.at(-1)! + 1 === cells.length ? { cells, labels } : withLostMonths(cells, labels, fits[0]);
}

/**
 * OCR joins neighbouring month labels into one cell ("Mar ;Apr", "OcT :NOV", "10/2024 = 11/2024—S"):
 * such a cell becomes one cell per month, placed by its characters. Only when every word of two
 * or more characters in it is a month name or a month/year (one-character specks are dropped).
 */
function splitJoinedMonths(cell: Cell): Cell[] {
  const words = [...cell.text.matchAll(/[^\s;:,|=~—–]+/g)].filter((w) => w[0].length >= 2);
  const month = (w: string) => (/^\p{L}{3,10}\.?$/u.test(w) && monthIndex(w) >= 0) || /^\d{1,2}\/20\d{2}$/.test(w);
  if (words.length < 2 || !words.every((w) => month(w[0]))) return [cell];
  const perChar = (cell.xEnd - cell.x) / cell.text.length;
  return words.map((w) => ({ text: w[0], x: cell.x + (w.index ?? 0) * perChar, xEnd: cell.x + ((w.index ?? 0) + w[0].length) * perChar }));
}

/** Named months in a row; an empty column between two that run on gets its month when the row runs month after month. */
function namedMonths(cells: Cell[], labels: MonthLabel[]): { cells: Cell[]; labels: MonthLabel[] } {
  const slots = slotsOf(cells);
  if (!slots || slots.at(-1)! + 1 === cells.length) return { cells, labels };
  const first = labels[0].month;
  const runsOn = labels.every((l, i) => l.month === (first + slots[i]) % 12);
  return (runsOn && withLostMonths(cells, labels, first)) || { cells, labels };
}

function monthCells(line: Line): { cells: Cell[]; labels: MonthLabel[] } | null {
  const split = line.cells.flatMap(splitJoinedMonths);
  if (split.length > line.cells.length) line = { ...line, cells: split };
  const cells = line.cells.filter((c) => monthLabel(c.text));
  if (cells.length >= 6 && cells.length >= line.cells.length - 1) return namedMonths(cells, cells.map((c) => monthLabel(c.text)!));
  const letters = line.cells.filter((c) => /^[JFMASOND]$/i.test(c.text));
  return letters.length >= line.cells.length - 1 ? initialLabels(letters) : null;
}

/**
 * Figures with no row label right under a row of months (a history printed as 7 + 6 months, each
 * row of months with its figures below): the first such line is the kWh, unless its figures are
 * all 20–40 and another follows (days, then kWh). Only lines before the next row of months count,
 * so each row of figures pairs with the months directly above it.
 */
function unlabelledRowsBelow(lines: Line[], i: number, block: Across, valuesOf: (l: Line) => (number | null)[]): boolean {
  const rows: (number | null)[][] = [];
  for (let k = i + 1; k < Math.min(lines.length, i + 3) && lines[k].page === lines[i].page && !monthCells(lines[k]); k++) {
    const l = lines[k];
    const values = valuesOf(l);
    if (!l.cells.every((c) => number(c) !== null) || lines[k - 1].y - l.y > l.h * 3 || values.filter((v) => v !== null).length < block.cells.length * 0.6) break;
    rows.push(values);
    block.lines.push(l);
  }
  if (!rows.length) return false;
  const daysLike = (r: (number | null)[]) => r.every((v) => v === null || (v >= 20 && v <= 40));
  if (rows.length > 1 && daysLike(rows[0])) [block.days, block.kwh] = [rows[0], rows[1]];
  else block.kwh = rows[0];
  block.unlabelled = true;
  return true;
}

/** A year on its own: "'25" (a bare two-digit figure is a day count, not a year) or "2025". */
const YEAR_TOKEN = /^(?:['’‘](\d{2})|(20\d{2}))$/;
const yearOf = (t: string) => {
  const m = t.trim().match(YEAR_TOKEN);
  return m ? (m[1] ? 2000 + Number(m[1]) : Number(m[2])) : null;
};

/** A row of years right under the months ("'25 '25 '26 …"): each month takes its year; the scan goes on below it. */
function withYearRow(lines: Line[], i: number, block: Across, half: number): number {
  const next = lines[i + 1];
  if (!next || next.page !== lines[i].page || !next.cells.every((c) => yearOf(c.text) !== null)) return i + 1;
  const years = block.cells.map((m) => nearest(next.cells, center(m), half)).map((c) => (c ? yearOf(c.text) : null));
  if (years.filter((y) => y !== null).length < block.cells.length * 0.6) return i + 1;
  block.months = block.months.map((l, j) => (years[j] !== null ? { ...l, year: years[j] } : l));
  block.lines.push(next);
  return i + 2;
}

/** A row label printed over two lines around its figures ("Electric" above, "kWh" below): the words left of the months on the lines next to it that hold no figures. */
function splitLabel(lines: Line[], k: number, left: number): string | null {
  const words = [lines[k - 1], lines[k + 1]]
    .filter((l) => l && l.page === lines[k].page && l.cells.every((c) => number(c) === null))
    .flatMap((l) => l.cells.filter((c) => center(c) < left).map((c) => c.text));
  return words.length ? words.join(" ") : null;
}

/**
 * A year × month grid: the months across once, then a row per year ("2025  —  —  …  802  640")
 * with a dash where the bill has no month. Each figure is the month of its column in its row's year.
 */
function yearGrid(lines: Line[], i: number, block: Across, half: number): Across | null {
  const out: Across = { ...block, months: [], cells: [], kwh: [], days: [], lines: [lines[i]] };
  for (let k = i + 1; k < Math.min(lines.length, i + 4) && lines[k].page === lines[i].page; k++) {
    const label = lines[k].cells[0];
    const year = label && center(label) < center(block.cells[0]) - half && /^20\d{2}$/.test(label.text.trim()) ? Number(label.text.trim()) : null;
    if (year === null) break;
    block.cells.forEach((m, j) => {
      const v = number(nearest(lines[k].cells.slice(1), center(m), half) ?? undefined);
      if (v === null) return;
      out.months.push({ month: block.months[j].month, year });
      out.cells.push(m);
      out.kwh.push(v);
      out.days.push(null);
    });
    out.lines.push(lines[k]);
  }
  return out.lines.length >= 2 && out.kwh.length >= 6 ? out : null;
}

function acrossBlock(lines: Line[], i: number, { cells, labels }: { cells: Cell[]; labels: MonthLabel[] }): Across {
  const line = lines[i];
  const spacing = (center(cells.at(-1)!) - center(cells[0])) / (cells.length - 1);
  const half = spacing / 2;
  const block: Across = {
    months: labels,
    cells,
    kwh: cells.map(() => null),
    days: cells.map(() => null),
    lines: [line],
    chart: false,
  };
  const valuesOf = (l: Line) => cells.map((m) => number(nearest(l.cells, center(m), half) ?? undefined));
  let net: { values: (number | null)[]; line: Line } | null = null;
  const grid = yearGrid(lines, i, block, half);
  if (grid) return grid;
  const from = withYearRow(lines, i, block, half);
  for (let k = from; k < Math.min(lines.length, from + 6) && lines[k].page === line.page && !monthCells(lines[k]); k++) {
    const labelCell = lines[k].cells.find((c) => center(c) < center(cells[0]) - half);
    const values = valuesOf(lines[k]);
    if (values.filter((v) => v !== null).length < cells.length * 0.6) continue;
    const label = labelCell?.text ?? splitLabel(lines, k, center(cells[0]) - half);
    if (!label) continue;
    const kind = headerKind(label);
    if (kind === "kwh" && block.kwh.every((v) => v === null)) [block.kwh, block.lines] = [values, [...block.lines, lines[k]]];
    if (kind === "days" && block.days.every((v) => v === null)) [block.days, block.lines] = [values, [...block.lines, lines[k]]];
    if (kind === "net" && !net) net = { values, line: lines[k] };
  }
  // A history that prints only net kWh: the net is what it gives.
  if (net && block.kwh.every((v) => v === null)) [block.kwh, block.lines] = [net.values, [...block.lines, net.line]];
  if (block.kwh.some((v) => v !== null)) return block;
  if (unlabelledRowsBelow(lines, i, block, valuesOf)) return block;
  // A bar chart: each month's value is the nearest number above its label, in its column.
  block.chart = true;
  const valuesInColumn = (l: Line) => cells.map((m) => number(nearest(l.cells, center(m), half * 0.6) ?? undefined));
  // Up the chart until its title: a line with words ends it.
  for (let k = i - 1; k >= 0 && lines[k].page === line.page && lines[k].y - line.y < 320 && lines[k].cells.every((c) => number(c) !== null) && !monthCells(lines[k]); k--) {
    const values = valuesInColumn(lines[k]);
    values.forEach((v, j) => {
      if (v !== null && block.kwh[j] === null) block.kwh[j] = v;
    });
    if (values.some((v) => v !== null)) block.lines.push(lines[k]);
  }
  return block;
}

// ── Years ───────────────────────────────────────────────────────────────────────────────────

/**
 * Gives every label a year: printed ones count; the others follow the order of the labels,
 * the newest falling at or before the current period's month (or the bill's latest date).
 */
function withYears(labels: MonthLabel[], anchorMonth: string | null): string[] | null {
  const n = labels.length;
  const asc = labels.slice(1).filter((l, i) => (l.month - labels[i].month + 12) % 12 === 1).length >= labels.slice(1).filter((l, i) => (labels[i].month - l.month + 12) % 12 === 1).length;
  const order = asc ? labels : [...labels].reverse();
  const years: (number | null)[] = order.map((l) => l.year);
  let last = years.findLastIndex((y) => y !== null);
  if (last < 0) {
    if (!anchorMonth) return null;
    const [ay, am] = [Number(anchorMonth.slice(0, 4)), Number(anchorMonth.slice(5, 7)) - 1];
    years[n - 1] = order[n - 1].month <= am ? ay : ay - 1;
    last = n - 1;
  }
  for (let k = last - 1; k >= 0; k--) if (years[k] === null) years[k] = years[k + 1]! - (order[k].month >= order[k + 1].month ? 1 : 0);
  for (let k = last + 1; k < n; k++) if (years[k] === null) years[k] = years[k - 1]! + (order[k].month <= order[k - 1].month ? 1 : 0);
  const out = order.map((l, k) => `${years[k]}-${String(l.month + 1).padStart(2, "0")}`);
  return asc ? out : out.reverse();
}

/** The history, and the cells it was read from (the other readers do not look at them). */
export type HistoryRead = {
  history: BillHistory | null;
  cells: Set<Cell>;
  warnings: string[];
};

const NOISY = "its label was read past OCR noise";
const NO_YEAR = "no year is printed, so its year is a guess";

const monthNumber = (ym: string) => Number(ym.slice(0, 4)) * 12 + Number(ym.slice(5, 7));

/** Months that run on one after another, oldest first. */
const consecutive = (months: string[]) => months.every((m, i) => i === 0 || monthNumber(m) - monthNumber(months[i - 1]) === 1);

/**
 * A month whose figure is far from the others (under a third of their median or over three
 * times it, our choice) or looks like a day count (20–40 in a history of hundreds) is marked low:
 * the likeliest misreadings (a days or average column, a lost digit, a neighbour's label).
 */
function withOutlierCheck(months: HistoryMonth[]): (m: HistoryMonth) => HistoryMonth {
  const sorted = months.map((m) => m.kwh).sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)] ?? 0;
  return (m) => {
    if (months.length < 4 || m.confidence === "low") return m;
    if (median >= 150 && m.kwh >= 20 && m.kwh <= 40) return { ...m, confidence: "low", note: "its figure looks like a day count" };
    if (m.kwh < median / 3 || m.kwh > median * 3) return { ...m, confidence: "low", note: "its figure is far from the other months'" };
    return m;
  };
}

function finish(entries: HistoryMonth[], layout: BillHistory["layout"], confidence: Confidence, cells: Set<Cell>, warnings: string[], noisy: Set<HistoryMonth> = new Set()): HistoryRead {
  const byMonth = new Map<string, HistoryMonth>();
  for (const e of entries) if (!byMonth.has(e.month)) byMonth.set(e.month, e);
  let months = [...byMonth.values()].sort((a, b) => a.month.localeCompare(b.month));
  // A label read past OCR noise counts only if the history still runs month after month with it.
  if (noisy.size && !consecutive(months.map((e) => e.month))) months = months.filter((e) => !noisy.has(e));
  if (months.length < 12) warnings.push(`The bill's usage history has ${months.length} months; the rest of the year will be estimated.`);
  months = months.map(withOutlierCheck(months));
  const unsure = months.filter((m) => m.confidence !== "high");
  if (unsure.length && unsure.length < months.length) warnings.push(`The reader is not sure of ${unsure.length} of the history's months (${unsure.map((m) => m.month).join(", ")}): compare them with the bill.`);
  return { history: { months, layout, confidence }, cells, warnings };
}

type Table = { rows: Row[]; header: Line | null };
const labelMonths = (t: Table) => t.rows.flatMap((r) => ("month" in r.label ? [r.label.month] : []));

/**
 * The first table's rows, and the tables that continue it: a history printed in two blocks side by
 * side or one under the other (7 + 6 months), joined when the months run on across the join, in
 * the first block's order (oldest or newest first).
 */
function joinedTables(tables: Table[]): Table[] {
  const out = tables.slice(0, 1);
  for (const t of tables.slice(1)) {
    const [prev, next] = [labelMonths(out.at(-1)!), labelMonths(t)];
    if (prev.length < 2 || !next.length) break;
    const step = (prev[1] - prev[0] + 12) % 12;
    if ((step === 1 || step === 11) && (next[0] - prev.at(-1)! + 12) % 12 === step) out.push(t);
  }
  return out;
}

export function readHistory(lines: Line[], anchorMonth: string | null): HistoryRead {
  const warnings: string[] = [];
  const noYear = "The usage history prints no years and the bill no period: the months' years are a guess.";
  const tables = joinedTables(tableRows(lines));
  if (tables.length) {
    const block = tables.flatMap((t) => t.rows);
    const labels = block.map((r) => ("month" in r.label ? r.label : null));
    const printed = labels.every((l) => l === null)
      ? null
      : withYears(
          labels.map((l) => l ?? { month: 0, year: 0 }),
          anchorMonth,
        );
    if (labels.some((l) => l !== null) && !printed) warnings.push(noYear);
    const headed = new Set(tables.filter((t) => t.header).flatMap((t) => t.rows));
    const entries = block.map((r, k): HistoryMonth | null => {
      const range = "start" in r.label ? r.label : null;
      const month = range ? periodMonth(range.start, range.end) : printed?.[k];
      if (!month) return null;
      const days = r.days ?? (range ? dayNumber(range.end) - dayNumber(range.start) : null);
      const [confidence, note] = labels[k]?.noisy ? (["low", NOISY] as const) : labels[k] && !printed ? (["medium", NO_YEAR] as const) : r.guessed && !headed.has(r) ? (["medium", "no column heading says which figure is the kWh"] as const) : (["high", undefined] as const);
      return { month, kwh: r.kwh, days, start: range?.start ?? null, end: range?.end ?? null, where: whereOf(r.line), confidence, note };
    });
    return finish(
      entries.filter((e) => e !== null),
      "table",
      tables.every((t) => t.header) ? "high" : "medium",
      new Set(block.flatMap((r) => r.cells)),
      warnings,
      new Set(entries.filter((e, k): e is HistoryMonth => e !== null && labels[k]?.noisy === true)),
    );
  }
  const blocks: Across[] = [];
  lines.forEach((l, i) => {
    const cells = monthCells(l);
    if (cells) blocks.push(acrossBlock(lines, i, cells));
  });
  const acrossTables = blocks.filter((b) => !b.chart);
  const charts = blocks.filter((b) => b.kwh.filter((v) => v !== null).length >= b.months.length * 0.6);
  // A chart in two rows of months: the second joins when its months run on from the first's.
  const use = acrossTables.length ? acrossTables : charts.filter((b, j) => j === 0 || (b.months[0].month - charts[j - 1].months.at(-1)!.month + 12) % 12 === 1);
  if (!use.length) return { history: null, cells: new Set(), warnings };
  const labels = use.flatMap((b) => b.months);
  const years = withYears(labels, anchorMonth);
  if (!years) warnings.push(noYear);
  let k = 0;
  const entries: HistoryMonth[] = [];
  const noisy = new Set<HistoryMonth>();
  for (const b of use) {
    b.months.forEach((label, j) => {
      const month = years?.[k];
      k++;
      const kwh = b.kwh[j];
      if (kwh === null || !month) return;
      // Per month: what makes this month's figure doubtful (the layout's own doubt is the history's confidence).
      const [confidence, note] = label.noisy ? (["low", NOISY] as const) : !years ? (["medium", NO_YEAR] as const) : (["high", undefined] as const);
      const entry: HistoryMonth = { month, kwh, days: b.days[j], start: null, end: null, where: whereOf(b.lines[1] ?? b.lines[0]), confidence, note };
      entries.push(entry);
      if (label.noisy) noisy.add(entry);
    });
  }
  return finish(entries, use[0].chart ? "chart" : "months-across", use[0].chart ? "medium" : "high", new Set(use.flatMap((b) => b.lines.flatMap((l) => l.cells))), warnings, noisy);
}
