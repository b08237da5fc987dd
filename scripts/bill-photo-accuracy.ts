/**
 * Measures OCR on bills as photos: each bill's first page rendered by pdftoppm at DPI (default
 * 200, about a phone photo of a letter page), turned, blurred and darkened or lit unevenly with
 * sharp, then read as the app reads a photo. Counts the current-bill fields and history months
 * (a history printed on page 2 is not in a photo of page 1 and counts as missed) and the time
 * each photo takes: on the clock, and tesseract's CPU time (the same on a busy machine). With --every-page each page is photographed and the photos are read together
 * as one image-only PDF (what a phone's document scanner saves), so page 2 counts too.
 *
 *   npx tsx scripts/bill-photo-accuracy.ts [--dpi 200] [--angle 1.2] [--blur 1] [--shade 0]
 *     [--brightness 0.85] [--every-page] [DIR …]          (several seconds a bill)
 *
 * DIRs default to the corpus and held-out set 3.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import { PDFDocument } from "pdf-lib";
import sharp from "sharp";
import { billJson, type BillJson } from "../src/lib/bill-reader";
import { readBillByOcr } from "../src/lib/bill-reader/ocr-pages";

const { values: o, positionals } = parseArgs({
  allowPositionals: true,
  options: {
    dpi: { type: "string", default: "200" },
    angle: { type: "string", default: "1.2" },
    blur: { type: "string", default: "1" },
    shade: { type: "string", default: "0" },
    brightness: { type: "string", default: "0.85" },
    "every-page": { type: "boolean", default: false },
  },
});
const dirs = positionals.length ? positionals : ["tests/fixtures/bills", "tests/fixtures/bills/held-out"];
const tmp = mkdtempSync(path.join(tmpdir(), "bill-photo-accuracy-"));

/** A light that falls off from the top left corner to the bottom right (multiplied onto the page). */
function shadeSvg(width: number, height: number, shade: number): Buffer {
  const dark = Math.round(255 * (1 - shade));
  return Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="1">` +
      `<stop offset="0" stop-color="rgb(255,250,240)"/><stop offset="1" stop-color="rgb(${dark},${dark},${dark})"/></linearGradient></defs>` +
      `<rect width="100%" height="100%" fill="url(#g)"/></svg>`,
  );
}

async function photo(png: string): Promise<Buffer> {
  const { width = 0, height = 0 } = await sharp(png).metadata();
  const lit = Number(o.shade) > 0 ? await sharp(png).composite([{ input: shadeSvg(width, height, Number(o.shade)), blend: "multiply" }]).png().toBuffer() : png;
  return sharp(lit).rotate(Number(o.angle), { background: "#6b6660" }).blur(Number(o.blur)).modulate({ brightness: Number(o.brightness) }).jpeg({ quality: 82 }).toBuffer();
}

/** The bill as the app would get it: a photo of page 1, or every page's photo in one image-only PDF. */
async function picture(pdf: string, name: string): Promise<{ bytes: Uint8Array; kind: "image" | "pdf" }> {
  const last = o["every-page"] ? "4" : "1";
  execFileSync("pdftoppm", ["-r", o.dpi, "-png", "-f", "1", "-l", last, pdf, path.join(tmp, name)]);
  const pages = readdirSync(tmp).filter((f) => f.startsWith(`${name}-`) && f.endsWith(".png")).sort();
  const photos = await Promise.all(pages.map((p) => photo(path.join(tmp, p))));
  if (!o["every-page"]) return { bytes: new Uint8Array(photos[0]), kind: "image" };
  const doc = await PDFDocument.create();
  for (const jpeg of photos) {
    const image = await doc.embedJpg(jpeg);
    doc.addPage([612, 792]).drawImage(image, { x: 0, y: 0, width: 612, height: 792 });
  }
  return { bytes: await doc.save(), kind: "pdf" };
}

/** CPU seconds used by this process's finished children (tesseract, pdftoppm): /proc/self/stat cutime + cstime, in clock ticks of 1/100 s. */
function childCpuSeconds(): number {
  const fields = readFileSync("/proc/self/stat", "utf8").split(") ")[1].split(" ");
  return (Number(fields[13]) + Number(fields[14])) / 100;
}

let [fields, fieldsRight, months, monthsRight, ms, bills, cpu] = [0, 0, 0, 0, 0, 0, 0];
try {
  for (const dir of dirs) {
    for (const f of readdirSync(dir).filter((n) => n.endsWith(".pdf"))) {
      const name = f.slice(0, -4);
      const { bytes, kind } = await picture(path.join(dir, f), name);
      const expected = JSON.parse(readFileSync(path.join(dir, `${name}.json`), "utf8")) as BillJson;
      const [started, cpuBefore] = [performance.now(), childCpuSeconds()];
      const got = billJson((await readBillByOcr(bytes, kind)).reading, "ocr");
      const [took, cpuTook] = [performance.now() - started, childCpuSeconds() - cpuBefore];
      cpu += cpuTook;
      const misses = (["start", "end", "kwh", "amountDueCents"] as const).filter((k) => got.current[k] !== expected.current[k]);
      const read = new Map(got.history.map((h) => [h.month, h.kwh]));
      const hits = expected.history.filter((h) => read.get(h.month) === h.kwh).length;
      [fields, fieldsRight, months, monthsRight, ms, bills] = [fields + 4, fieldsRight + 4 - misses.length, months + expected.history.length, monthsRight + hits, ms + took, bills + 1];
      console.log(`${path.relative("tests/fixtures/bills", path.join(dir, name))}: fields ${4 - misses.length}/4${misses.length ? ` (missed ${misses.join(", ")})` : ""}, history ${hits}/${expected.history.length}, ${(took / 1000).toFixed(1)} s (OCR CPU ${cpuTook.toFixed(1)} s)`);
    }
  }
  console.log(`current-bill fields ${fieldsRight}/${fields}, history months ${monthsRight}/${months}, all ${fieldsRight + monthsRight}/${fields + months} (${(((fieldsRight + monthsRight) / (fields + months)) * 100).toFixed(1)} %), ${(ms / bills / 1000).toFixed(1)} s a bill, OCR CPU ${(cpu / bills).toFixed(1)} s a bill`);
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
