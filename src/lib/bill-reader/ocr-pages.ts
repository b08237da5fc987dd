// Photos and scans of bills as positioned text, through Debian's tesseract-ocr (a child process
// with a time limit), so the one bill reader serves text PDFs and OCR alike. Shared by the server
// (uploads) and the read-bill command; never imported by browser code.
import { execFile } from "node:child_process";
import { mkdtemp, readdir, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { readBill } from "./index";
import type { BillPage, TextItem } from "./layout";
import type { BillReading } from "./types";

/** Longest a page's OCR may take before it is stopped (our choice: a page takes about 4 s here). */
export const OCR_PAGE_TIME_LIMIT_MS = 30_000;
/** Scanned PDFs: at most this many pages are rendered and read (our choice, as for text PDFs). */
const MAX_SCANNED_PAGES = 4;
/** Pages are rendered and photos scaled to about this width: a letter page at 300 dpi, tesseract's sweet spot. */
const TARGET_WIDTH_PX = 2550;
/** OCR pixels become points so a page is about as wide as a letter page (612 pt), like a text PDF. */
const PAGE_WIDTH_PT = 612;
/** A word tesseract is at least this sure of (0-100) counts as read (our choice). */
export const CONFIDENT_WORD = 60;

export class OcrError extends Error {
  constructor(
    message: string,
    readonly code: "ocr_timeout" | "ocr_failed" | "ocr_missing",
  ) {
    super(message);
  }
}

export type OcrPages = { pages: BillPage[]; words: number; confidentWords: number };

function run(cmd: string, args: string[], what: string, timeoutMs: number): Promise<string> {
  return new Promise((resolve, reject) => {
    // One thread: the machine is shared, and tesseract's threads barely speed up one page (common practice).
    const env = { ...process.env, OMP_THREAD_LIMIT: "1" };
    execFile(cmd, args, { timeout: timeoutMs, killSignal: "SIGKILL", maxBuffer: 32 * 1024 * 1024, env }, (err, stdout, stderr) => {
      if (!err) return resolve(stdout);
      const e = err as NodeJS.ErrnoException & { killed?: boolean };
      if (e.code === "ENOENT") return reject(new OcrError(`${cmd} is not installed: run \`node scripts/bootstrap.mjs\` (it installs Debian's ${cmd === "pdftoppm" ? "poppler-utils" : "tesseract-ocr"}).`, "ocr_missing"));
      if (e.killed) return reject(new OcrError(`Reading ${what} took longer than ${(timeoutMs / 1000).toFixed(timeoutMs < 1000 ? 2 : 0)} s and was stopped (${cmd}'s time limit).`, "ocr_timeout"));
      reject(new OcrError(`${cmd} could not read ${what}: ${String(stderr).trim().split("\n").at(-1) ?? e.message}`, "ocr_failed"));
    });
  });
}

/** Upright from the EXIF orientation, grey, contrast stretched, small photos scaled up (tesseract wants letters ~30 px high). */
async function prepareImage(bytes: Uint8Array): Promise<Buffer> {
  const { default: sharp } = await import("sharp");
  const image = sharp(bytes, { limitInputPixels: 40_000_000, failOn: "error" }).rotate();
  const { width = 0 } = await image.clone().metadata();
  const upscale = width > 0 && width < TARGET_WIDTH_PX * 0.8;
  return (upscale ? image.resize({ width: TARGET_WIDTH_PX }) : image).greyscale().normalise().png().toBuffer();
}

type Word = { block: number; par: number; line: number; left: number; top: number; width: number; height: number; conf: number; text: string };

function tsvWords(tsv: string): Word[] {
  const words: Word[] = [];
  for (const row of tsv.split("\n").slice(1)) {
    const f = row.split("\t");
    if (f.length < 12 || f[0] !== "5" || f[11].trim() === "") continue;
    const [block, par, line, , left, top, width, height, conf] = f.slice(2, 11).map(Number);
    words.push({ block, par, line, left, top, width, height, conf, text: f[11].trim() });
  }
  return words;
}

/**
 * The page's slope (dy per dx) from tesseract's own lines: a photo held slightly askew puts one
 * printed row at different heights across the page, so the reader would split it.
 */
function pageSlope(lines: Word[][]): number {
  const slopes: number[] = [];
  for (const ws of lines) {
    if (ws.length < 3) continue;
    const a = ws[0], b = ws.at(-1)!;
    const dx = b.left + b.width / 2 - (a.left + a.width / 2);
    if (dx > 200) slopes.push((b.top + b.height - (a.top + a.height)) / dx);
  }
  slopes.sort((x, y) => x - y);
  return slopes.length >= 3 ? slopes[Math.floor(slopes.length / 2)] : 0;
}

/** tesseract's word boxes as the reader's text items: a word per item, every word of a line on the line's (deskewed) baseline. */
export function tsvToPage(tsv: string, imageHeightPx: number, imageWidthPx: number): { page: BillPage; words: number; confidentWords: number } {
  const words = tsvWords(tsv);
  const byLine = new Map<string, Word[]>();
  for (const w of words) {
    const key = `${w.block}.${w.par}.${w.line}`;
    byLine.set(key, [...(byLine.get(key) ?? []), w]);
  }
  const lines = [...byLine.values()];
  const slope = pageSlope(lines);
  const scale = PAGE_WIDTH_PT / imageWidthPx;
  const items: TextItem[] = [];
  for (const ws of lines) {
    const heights = ws.map((w) => w.height).sort((a, b) => a - b);
    const h = heights[Math.floor(heights.length / 2)];
    // The line's baseline: the lowest bottom of its words without descenders is near enough the median bottom.
    const bottoms = ws.map((w) => w.top + w.height - slope * (w.left + w.width / 2)).sort((a, b) => a - b);
    const base = bottoms[Math.floor(bottoms.length / 2)];
    for (const w of ws) {
      items.push({ str: w.text, x: w.left * scale, y: (imageHeightPx - base) * scale, w: w.width * scale, h: h * scale * 0.8 });
    }
  }
  return { page: { items }, words: words.length, confidentWords: words.filter((w) => w.conf >= CONFIDENT_WORD).length };
}

/**
 * Page segmentation: 3 lets tesseract find the page's blocks and columns (its default); 6 reads the
 * page as one block, which keeps table rows that 3 drops next to a dark corner of a photo.
 */
export type Psm = 3 | 6;

async function ocrPng(png: Buffer, dir: string, name: string, what: string, timeoutMs: number, psm: Psm) {
  const { default: sharp } = await import("sharp");
  const file = path.join(dir, name);
  await writeFile(file, png);
  const { width = 1, height = 1 } = await sharp(png).metadata();
  const tsv = await run("tesseract", [file, "-", "-l", "eng", "--psm", String(psm), "tsv"], what, timeoutMs);
  return tsvToPage(tsv, height, width);
}

async function withTempDir<T>(fn: (dir: string) => Promise<T>): Promise<T> {
  const dir = await mkdtemp(path.join(tmpdir(), "kw-ocr-"));
  try {
    return await fn(dir);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

function collect(results: { page: BillPage; words: number; confidentWords: number }[]): OcrPages {
  return {
    pages: results.map((r) => r.page),
    words: results.reduce((s, r) => s + r.words, 0),
    confidentWords: results.reduce((s, r) => s + r.confidentWords, 0),
  };
}

/** A JPEG or PNG photo of a bill page, read by OCR. */
export type OcrOptions = { timeoutMs?: number; psm?: Psm };

export async function ocrImage(bytes: Uint8Array, opts: OcrOptions = {}): Promise<OcrPages> {
  const png = await prepareImage(bytes);
  return withTempDir(async (dir) => collect([await ocrPng(png, dir, "page.png", "the photo", opts.timeoutMs ?? OCR_PAGE_TIME_LIMIT_MS, opts.psm ?? 3)]));
}

/**
 * A PDF whose pages are images (a scan): poppler's pdftoppm renders each page at 300 dpi in grey,
 * whatever the scanner's image encoding (JPEG, JBIG2, CCITT fax…), then each page is read by OCR.
 */
export async function ocrScannedPdf(bytes: Uint8Array, opts: OcrOptions = {}): Promise<OcrPages> {
  const timeoutMs = opts.timeoutMs ?? OCR_PAGE_TIME_LIMIT_MS;
  return withTempDir(async (dir) => {
    const pdf = path.join(dir, "scan.pdf");
    await writeFile(pdf, bytes);
    await run("pdftoppm", ["-r", "300", "-gray", "-png", "-f", "1", "-l", String(MAX_SCANNED_PAGES), pdf, path.join(dir, "page")], "the scanned PDF's pages", timeoutMs);
    const names = (await readdir(dir)).filter((n) => /^page-\d+\.png$/.test(n)).sort((a, b) => Number(a.match(/\d+/)![0]) - Number(b.match(/\d+/)![0]));
    const results = [];
    for (const [i, name] of names.entries()) {
      const png = await prepareImage(await readFile(path.join(dir, name)));
      results.push(await ocrPng(png, dir, `ocr-${name}`, `page ${i + 1} of the scanned PDF`, timeoutMs, opts.psm ?? 3));
    }
    return collect(results);
  });
}

/** How much of a bill a reading holds: the current fields and the history's months. */
function filled(r: BillReading): number {
  return [r.period, r.kwh, r.amountDue].filter(Boolean).length + (r.history?.months.length ?? 0);
}

/**
 * A photo or a scanned PDF read by OCR and then by the bill reader. When the first reading misses
 * a field or has under 12 months of history, the page is read again as one block (psm 6) and the
 * fuller reading is kept: a second run costs a few seconds, a missed field costs the rep typing.
 */
export async function readBillByOcr(bytes: Uint8Array, kind: "image" | "pdf", opts: { timeoutMs?: number } = {}): Promise<{ reading: BillReading; ocr: OcrPages }> {
  const ocrOf = (psm: Psm) => (kind === "pdf" ? ocrScannedPdf(bytes, { ...opts, psm }) : ocrImage(bytes, { ...opts, psm }));
  const first = await ocrOf(3);
  const reading = readBill(first.pages);
  const complete = reading.period && reading.kwh && reading.amountDue && (reading.history?.months.length ?? 0) >= 12;
  if (complete || first.confidentWords < MIN_CONFIDENT_WORDS) return { reading, ocr: first };
  const second = await ocrOf(6);
  const again = readBill(second.pages);
  return filled(again) > filled(reading) ? { reading: again, ocr: second } : { reading, ocr: first };
}

/** Fewer confident words than this on a bill: the photo is too blurred, dark or small to read (our choice). */
export const MIN_CONFIDENT_WORDS = 25;

/** Why the OCR text is too poor to use, or null when it is good enough for the reader. */
export function ocrTooPoor(ocr: OcrPages, fieldsFound: number): string | null {
  if (ocr.confidentWords < MIN_CONFIDENT_WORDS) {
    return `Only ${ocr.confidentWords} word${ocr.confidentWords === 1 ? "" : "s"} could be read with confidence (at least ${MIN_CONFIDENT_WORDS} are needed): the picture is too blurred, dark or small.`;
  }
  if (fieldsFound === 0) return "The text was read, but no billing period, kWh, amount due or usage history was found in it.";
  return null;
}
