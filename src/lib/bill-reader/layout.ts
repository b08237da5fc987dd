// A bill page as positioned text: the pieces a PDF's text layer (or OCR) gives, grouped into
// lines and the lines into cells, so a table's columns and a chart's labels keep their place.

/** One piece of text on a page; x, y in points from the bottom left (PDF user space), y the baseline. */
export type TextItem = {
  str: string;
  x: number;
  y: number;
  w: number;
  h: number;
};
export type BillPage = { items: TextItem[] };

/** A run of text with no wide gap inside: a table cell, a label, a value. */
export type Cell = { text: string; x: number; xEnd: number };
export type Line = {
  /** 1-based page and line on that page, as shown to the rep ("page 2, line 14"). */
  page: number;
  line: number;
  y: number;
  h: number;
  cells: Cell[];
  /** The cells joined by two spaces (a column gap). */
  text: string;
};

export const center = (c: Cell) => (c.x + c.xEnd) / 2;

/** Items whose baselines differ by less than this share of the text height sit on one line (our choice). */
const SAME_LINE = 0.45;
/** A gap wider than this share of the text height starts a new cell (a word space is about 0.28). */
const CELL_GAP = 0.9;

/** A piece laid out with runs of spaces ("Previous: 10/03/2025    Present: 11/02/2025") is several cells. */
function splitOnSpaces(it: TextItem): TextItem[] {
  const perChar = it.str.length ? it.w / it.str.length : 0;
  return [...it.str.matchAll(/\S+(?: \S+)*/g)].map((m) => ({ ...it, str: m[0], x: it.x + (m.index ?? 0) * perChar, w: m[0].length * perChar }));
}

function toCells(items: TextItem[]): Cell[] {
  const cells: Cell[] = [];
  let last: TextItem | null = null;
  for (const it of items.flatMap(splitOnSpaces).sort((a, b) => a.x - b.x)) {
    const text = it.str.replace(/\s+/g, " ");
    const cell = cells.at(-1);
    const gap = last ? it.x - (last.x + last.w) : Infinity;
    if (cell && last && gap < Math.max(it.h, last.h) * CELL_GAP) {
      const space = gap > Math.max(it.h, 1) * 0.12 && !cell.text.endsWith(" ") && !text.startsWith(" ") ? " " : "";
      cell.text += space + text;
      cell.xEnd = Math.max(cell.xEnd, it.x + it.w);
    } else {
      cells.push({ text, x: it.x, xEnd: it.x + it.w });
    }
    last = it;
  }
  return cells.map((c) => ({ ...c, text: c.text.trim() })).filter((c) => c.text !== "");
}

/** The page's lines, top to bottom, each with its cells left to right. */
export function pageLines(page: BillPage, pageNumber: number): Line[] {
  const items = page.items.filter((i) => i.str.trim() !== "").sort((a, b) => b.y - a.y || a.x - b.x);
  const groups: TextItem[][] = [];
  for (const it of items) {
    const g = groups.at(-1);
    if (g && Math.abs(g[0].y - it.y) < Math.max(g[0].h, it.h, 1) * SAME_LINE) g.push(it);
    else groups.push([it]);
  }
  return groups.map((g, i) => {
    const cells = toCells(g);
    return {
      page: pageNumber,
      line: i + 1,
      y: g[0].y,
      h: Math.max(...g.map((t) => t.h)),
      cells,
      text: cells.map((c) => c.text).join("  "),
    };
  });
}

/** Every page's lines in reading order. */
export function billLines(pages: readonly BillPage[]): Line[] {
  return pages.flatMap((p, i) => pageLines(p, i + 1));
}

/**
 * Plain text as pages (form feeds between pages): each line a row, runs of two or more spaces
 * a column gap, one character 6 points wide. For text without positions (typed tests, OCR text).
 */
export function pagesFromText(text: string): BillPage[] {
  return text.split("\f").map((pageText) => ({
    items: pageText.split(/\r?\n/).flatMap((row, i) =>
      [...row.matchAll(/\S+(?: \S+)*/g)].map((m) => ({
        str: m[0],
        x: (m.index ?? 0) * 6,
        y: 10_000 - i * 14,
        w: m[0].length * 6,
        h: 10,
      })),
    ),
  }));
}
