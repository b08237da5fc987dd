/**
 * Makes the OCR fixtures of the bill corpus from its own text PDFs: each chosen bill's first page
 * rendered by poppler's pdftoppm (150 dpi, like a phone photo of a letter page), then with sharp
 * turned slightly, blurred and lit unevenly (a brighter corner fading to a darker one), saved as a
 * JPEG; and one bill as an image-only PDF (the page image, no text layer: a scan). Each output gets
 * the source bill's expected JSON with "source":"ocr". And one photo set: each page of a two-page
 * bill photographed alone (tests/fixtures/bills/photo-sets/). Run: npx tsx scripts/make-bill-photos.ts
 */
import { execFileSync } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { PDFDocument } from "pdf-lib";
import sharp from "sharp";

const dir = path.resolve("tests/fixtures/bills");
const out = path.join(dir, "photos");

/** Which bill, how far it is turned (degrees), how blurred (sigma, px) and how uneven the light (0-1). */
const PHOTOS = [
  { bill: "larkhaven-classic", name: "larkhaven-classic-photo", angle: 1.5, blur: 1.1, shade: 0.45 },
  { bill: "cobble-creek-across", name: "cobble-creek-across-photo", angle: -2, blur: 1.3, shade: 0.35 },
];
const SCAN = { bill: "marrowstone-read-dates", name: "marrowstone-read-dates-scan" };
/** A photo set: each page of a two-page bill photographed on its own (photo-sets/NAME/page-N.jpg + expected.json). */
const PHOTO_SET = { bill: "birchfield-two-page", pages: 2, angle: [1.2, -1.6], blur: 0.8, shade: 0.3 };

function render(bill: string, dpi: number, tmp: string, pageNumber = 1): Buffer {
  const prefix = path.join(tmp, `${bill}-${pageNumber}`);
  execFileSync("pdftoppm", ["-r", String(dpi), "-png", "-f", String(pageNumber), "-l", String(pageNumber), "-singlefile", path.join(dir, `${bill}.pdf`), prefix]);
  return readFileSync(`${prefix}.png`);
}

/** A light that falls off from the top left corner to the bottom right (multiplied onto the page). */
function shadeSvg(width: number, height: number, shade: number): Buffer {
  const dark = Math.round(255 * (1 - shade));
  return Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="0" y1="0" x2="1" y2="1">` +
      `<stop offset="0" stop-color="rgb(255,250,240)"/><stop offset="1" stop-color="rgb(${dark},${dark},${Math.round(dark * 0.95)})"/></linearGradient></defs>` +
      `<rect width="100%" height="100%" fill="url(#g)"/></svg>`,
  );
}

async function photoOf(page: Buffer, p: { angle: number; blur: number; shade: number }): Promise<Buffer> {
  const { width = 0, height = 0 } = await sharp(page).metadata();
  const lit = await sharp(page).composite([{ input: shadeSvg(width, height, p.shade), blend: "multiply" }]).png().toBuffer();
  return sharp(lit).rotate(p.angle, { background: "#6b6660" }).blur(p.blur).jpeg({ quality: 82 }).toBuffer();
}

async function photo(p: (typeof PHOTOS)[number], tmp: string) {
  writeFileSync(path.join(out, `${p.name}.jpg`), await photoOf(render(p.bill, 150, tmp), p));
}

async function photoSet(tmp: string) {
  const setDir = path.join(dir, "photo-sets", PHOTO_SET.bill);
  mkdirSync(setDir, { recursive: true });
  for (let n = 1; n <= PHOTO_SET.pages; n++) {
    writeFileSync(path.join(setDir, `page-${n}.jpg`), await photoOf(render(PHOTO_SET.bill, 150, tmp, n), { ...PHOTO_SET, angle: PHOTO_SET.angle[n - 1] }));
  }
  const json = JSON.parse(readFileSync(path.join(dir, `${PHOTO_SET.bill}.json`), "utf8"));
  writeFileSync(path.join(setDir, "expected.json"), JSON.stringify({ ...json, source: "ocr" }, null, 2) + "\n");
}

async function scan(tmp: string) {
  const png = await sharp(render(SCAN.bill, 200, tmp)).greyscale().png().toBuffer();
  const doc = await PDFDocument.create();
  const image = await doc.embedPng(png);
  const pg = doc.addPage([612, 792]);
  pg.drawImage(image, { x: 0, y: 0, width: 612, height: 792 });
  writeFileSync(path.join(out, `${SCAN.name}.pdf`), await doc.save({ useObjectStreams: false }));
}

function expected(bill: string, name: string) {
  const json = JSON.parse(readFileSync(path.join(dir, `${bill}.json`), "utf8"));
  writeFileSync(path.join(out, `${name}.json`), JSON.stringify({ ...json, source: "ocr" }, null, 2) + "\n");
}

const tmp = mkdtempSync(path.join(tmpdir(), "bill-photos-"));
try {
  execFileSync("mkdir", ["-p", out]);
  for (const p of PHOTOS) {
    await photo(p, tmp);
    expected(p.bill, p.name);
  }
  await scan(tmp);
  expected(SCAN.bill, SCAN.name);
  await photoSet(tmp);
  console.log(`Wrote ${PHOTOS.length} photos and 1 scanned PDF to ${path.relative(process.cwd(), out)}`);
} finally {
  rmSync(tmp, { recursive: true, force: true });
}
