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

/** `slopes`: each page's measured turn (dy per dx), so a later reading can turn the picture upright first. */
export type OcrPages = { pages: BillPage[]; words: number; confidentWords: number; slopes: number[] };
type OcrPage = { page: BillPage; words: number; confidentWords: number; slope: number };

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

/**
 * Upright from the EXIF orientation, grey, contrast stretched, small photos scaled up (tesseract
 * wants letters ~30 px high); turned back by `slope` (a page's measured turn) when given: on a
 * turned page a table's figures sit diagonally below their labels and sparse reading joins them.
 */
async function prepareImage(bytes: Uint8Array, slope = 0): Promise<Buffer> {
  const { default: sharp } = await import("sharp");
  const image = sharp(bytes, { limitInputPixels: 40_000_000, failOn: "error" }).rotate();
  const { width = 0 } = await image.clone().metadata();
  const upscale = width > 0 && width < TARGET_WIDTH_PX * 0.8;
  const grey = (upscale ? image.resize({ width: TARGET_WIDTH_PX }) : image).greyscale().normalise();
  if (Math.abs(slope) < MIN_DESKEW_SLOPE) return grey.png().toBuffer();
  return sharp(await grey.png().toBuffer())
    .rotate((-Math.atan(slope) * 180) / Math.PI, { background: "#ffffff" })
    .png()
    .toBuffer();
}
/** Turns under about 0.3° are left alone (our choice: a row then drifts under a third of a line across the page). */
const MIN_DESKEW_SLOPE = 0.005;

type Word = { block: number; par: number; line: number; left: number; top: number; width: number; height: number; conf: number; text: string };

function tsvWords(tsv: string): Word[] {
  const words: Word[] = [];
  for (const row of tsv.split("\n").slice(1)) {
    const f = row.split("\t");
    if (f.length < 12 || f[0] !== "5" || f[11].trim() === "") continue;
    const [block, par, line, , left, top, width, height, conf] = f.slice(2, 11).map(Number);
    words.push({ block, par, line, left, top, width, height, conf, text: f[11].trim() });
  }
  return withoutSpecks(words);
}

/**
 * Marks that are not words: specks read as ";", ":" or "|", and a bar's edge or a rule read as
 * "|", "l", "dl" in a box far taller than the page's letters. Left in, they join a chart's month
 * labels into one cell and, being tall, pull the lines around them into one. Dashes, "$", "&"
 * and "%" stay (a period's "-", amounts).
 */
function withoutSpecks(words: Word[]): Word[] {
  const heights = words.map((w) => w.height).sort((a, b) => a - b);
  const typical = heights[Math.floor(heights.length / 2)] ?? 0;
  const speck = (w: Word) => !/[\p{L}\p{N}$&%\-–—]/u.test(w.text);
  const stroke = (w: Word) => w.height > typical * 2.5 && (w.text.length <= 2 || /^[|lI1!()[\]{}]+$/.test(w.text));
  return words.filter((w) => !speck(w) && !stroke(w));
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

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

type Band = { words: Word[]; top: number; bottom: number };

/**
 * tesseract's lines regrouped by where their words sit: lines whose (deskewed) boxes overlap by
 * at least half the shorter one's height are one printed row. Sparse reading (psm 11) returns a
 * chart's month labels as separate lines, and a label with a descender ("Jan") sits a little
 * lower than its neighbours; apart, the reader would see two rows of months.
 */
function rows(lines: Word[][], slope: number): Band[] {
  const bands = lines
    .map((ws) => ({ words: ws, top: median(ws.map((w) => w.top - slope * (w.left + w.width / 2))), bottom: median(ws.map((w) => w.top + w.height - slope * (w.left + w.width / 2))) }))
    .sort((a, b) => a.top + a.bottom - (b.top + b.bottom));
  const out: Band[] = [];
  for (const band of bands) {
    const last = out.at(-1);
    const overlap = last ? Math.min(last.bottom, band.bottom) - Math.max(last.top, band.top) : 0;
    if (last && overlap >= 0.5 * Math.min(last.bottom - last.top, band.bottom - band.top)) {
      last.words.push(...band.words);
      [last.top, last.bottom] = [Math.min(last.top, band.top), Math.max(last.bottom, band.bottom)];
    } else out.push({ ...band, words: [...band.words] });
  }
  return out;
}

/** tesseract's word boxes as the reader's text items: a word per item, every word of a row on the row's (deskewed) baseline. */
export function tsvToPage(tsv: string, imageHeightPx: number, imageWidthPx: number): OcrPage {
  const words = tsvWords(tsv);
  const byLine = new Map<string, Word[]>();
  for (const w of words) {
    const key = `${w.block}.${w.par}.${w.line}`;
    byLine.set(key, [...(byLine.get(key) ?? []), w]);
  }
  const slope = pageSlope([...byLine.values()]);
  const scale = PAGE_WIDTH_PT / imageWidthPx;
  const items: TextItem[] = [];
  for (const { words: ws } of rows([...byLine.values()], slope)) {
    const h = median(ws.map((w) => w.height));
    // The row's baseline: the median bottom of its words (words with descenders are the fewer).
    const base = median(ws.map((w) => w.top + w.height - slope * (w.left + w.width / 2)));
    for (const w of ws) {
      items.push({ str: w.text, x: w.left * scale, y: (imageHeightPx - base) * scale, w: w.width * scale, h: h * scale * 0.8 });
    }
  }
  return { page: { items }, words: words.length, confidentWords: words.filter((w) => w.conf >= CONFIDENT_WORD).length, slope };
}

/**
 * Page segmentation: 3 lets tesseract find the page's blocks and columns (its default); 11 looks
 * for every piece of text wherever it is (sparse text), which keeps a bar chart's small value and
 * month labels that 3 takes for part of a picture; 6 reads the page as one block, which keeps
 * table rows that 3 drops next to a dark corner of a photo.
 */
export type Psm = 3 | 6 | 11;

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

function collect(results: OcrPage[]): OcrPages {
  return {
    slopes: results.map((r) => r.slope),
    pages: results.map((r) => r.page),
    words: results.reduce((s, r) => s + r.words, 0),
    confidentWords: results.reduce((s, r) => s + r.confidentWords, 0),
  };
}

/** A JPEG or PNG photo of a bill page, read by OCR. */
export type OcrOptions = { timeoutMs?: number; psm?: Psm; slopes?: number[] };

export async function ocrImage(bytes: Uint8Array, opts: OcrOptions = {}): Promise<OcrPages> {
  return ocrImages([bytes], opts);
}

/** At most this many photos make one bill (a page each), as for a scanned PDF's pages (our choice). */
export const MAX_BILL_PHOTOS = MAX_SCANNED_PAGES;

/** Photos of a bill's pages, in page order, read by OCR as one document (page 1, page 2 …). */
export async function ocrImages(images: Uint8Array[], opts: OcrOptions = {}): Promise<OcrPages> {
  const timeoutMs = opts.timeoutMs ?? OCR_PAGE_TIME_LIMIT_MS;
  return withTempDir(async (dir) => {
    const results = [];
    for (const [i, bytes] of images.slice(0, MAX_BILL_PHOTOS).entries()) {
      const png = await prepareImage(bytes, opts.slopes?.[i]);
      results.push(await ocrPng(png, dir, `page-${i + 1}.png`, images.length > 1 ? `photo ${i + 1}` : "the photo", timeoutMs, opts.psm ?? 3));
    }
    return collect(results);
  });
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
      const png = await prepareImage(await readFile(path.join(dir, name)), opts.slopes?.[i]);
      results.push(await ocrPng(png, dir, `ocr-${name}`, `page ${i + 1} of the scanned PDF`, timeoutMs, opts.psm ?? 3));
    }
    return collect(results);
  });
}

/** How much of a bill a reading holds: the current fields and the history's months. */
/** Fields found, each history month counted only when the reader is not unsure of it (a doubtful month is half a month). */
function filled(r: BillReading): number {
  const months = r.history?.months ?? [];
  return [r.period, r.kwh, r.amountDue].filter(Boolean).length + months.filter((m) => m.confidence === "high").length + months.filter((m) => m.confidence !== "high").length / 2;
}

/** Nothing missing and no history month in doubt: no further reading can do better. */
const complete = (r: BillReading) => Boolean(r.period && r.kwh && r.amountDue && (r.history?.months.length ?? 0) >= 12 && r.history?.months.every((m) => m.confidence === "high"));

/**
 * A photo or a scanned PDF read by OCR and then by the bill reader. When a reading misses a field
 * or has under 12 months of history, the page is read again, as sparse text (psm 11; turned
 * upright too when it is turned) and then as one block (psm 6), and the fullest reading is kept.
 * Sparse first: on a bar chart the one-block reading can make a full 12 months of wrong figures
 * (held-out set 4's chart photo), which would end the search. Each run costs a few seconds; a
 * missed field costs the rep typing.
 */
export async function readBillByOcr(input: Uint8Array | Uint8Array[], kind: "image" | "pdf", opts: { timeoutMs?: number } = {}): Promise<{ reading: BillReading; ocr: OcrPages }> {
  // Several photos (a bill's page 1, page 2 …) are one document: their pages are read together.
  const images = Array.isArray(input) ? input : [input];
  const ocrOf = (psm: Psm, slopes?: number[]) => (kind === "pdf" ? ocrScannedPdf(images[0], { ...opts, psm, slopes }) : ocrImages(images, { ...opts, psm, slopes }));
  const first = await ocrOf(3);
  let best = { reading: readBill(first.pages), ocr: first };
  // A picture with almost nothing readable and nothing found is not read again (it costs seconds and finds nothing).
  if (first.confidentWords < MIN_CONFIDENT_WORDS && filled(best.reading) === 0) return best;
  const turned = first.slopes.some((sl) => Math.abs(sl) >= MIN_DESKEW_SLOPE);
  // Sparse text as taken, then on the page turned upright (on a turned page sparse reading can
  // join a label with the figure diagonally below it; on a chart photo turning it back lost the
  // labels instead: both happen, so both are tried), then one block on the picture as taken.
  const passes: { psm: Psm; slopes?: number[] }[] = [{ psm: 11 }, ...(turned ? [{ psm: 11 as const, slopes: first.slopes }] : []), { psm: 6 }];
  for (const pass of passes) {
    if (complete(best.reading)) break;
    // A later reading stopped by its time limit (a busy machine) leaves the earlier one standing.
    const ocr = await ocrOf(pass.psm, pass.slopes).catch((err: unknown) => {
      if (err instanceof OcrError && err.code === "ocr_timeout") return null;
      throw err;
    });
    if (!ocr) break;
    const reading = readBill(ocr.pages);
    if (filled(reading) > filled(best.reading)) best = { reading, ocr };
  }
  return best;
}

/** Fewer confident words than this on a bill: the photo is too blurred, dark or small to read (our choice). */
export const MIN_CONFIDENT_WORDS = 25;

/** Why the OCR text is too poor to use, or null when it is good enough for the reader. */
export function ocrTooPoor(ocr: Pick<OcrPages, "confidentWords">, fieldsFound: number): string | null {
  if (ocr.confidentWords < MIN_CONFIDENT_WORDS) {
    return `Only ${ocr.confidentWords} word${ocr.confidentWords === 1 ? "" : "s"} could be read with confidence (at least ${MIN_CONFIDENT_WORDS} are needed): the picture is too blurred, dark or small.`;
  }
  if (fieldsFound === 0) return "The text was read, but no billing period, kWh, amount due or usage history was found in it.";
  return null;
}
