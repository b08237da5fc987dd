/**
 * The mechanics the held-out bill generators share (scripts/make-bill-set-5.ts, -6, -7): print
 * HTML bills to PDF with Debian's chromium through Playwright, rasterise a page with poppler's
 * pdftoppm, and turn that page into a phone photo with sharp (uneven light, turn, blur, JPEG).
 */
import { execFileSync } from "node:child_process";
import { readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { chromium, type Page } from "playwright";
import sharp from "sharp";
import type { Bill, Expected } from "./bill-set-5/bills";

/** Same launch flags as tests/playwright.config.ts: Debian's chromium, off the network. */
export async function withChromiumPage<T>(run: (page: Page) => Promise<T>): Promise<T> {
  const browser = await chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  try {
    return await run(await browser.newPage());
  } finally {
    await browser.close();
  }
}

export const writeExpected = (out: string, name: string, e: Expected) => writeFileSync(path.join(out, `${name}.json`), JSON.stringify(e, null, 2) + "\n");

/**
 * Prints each bill to OUT/NAME.pdf (page size from the bill's own `@page` rule, else Letter) and
 * writes its expected JSON; returns the expected readings by bill name.
 */
export async function printBills(out: string, bills: Bill[], html: (bill: Bill) => string, fixedDates = false): Promise<Map<string, Expected>> {
  const expectedOf = new Map<string, Expected>();
  await withChromiumPage(async (page) => {
    for (const bill of bills) {
      await page.setContent(html(bill), { waitUntil: "load" });
      const pdf = Buffer.from(await page.pdf({ format: "Letter", printBackground: true, preferCSSPageSize: true }));
      writeFileSync(path.join(out, `${bill.name}.pdf`), fixedDates ? withFixedDates(pdf) : pdf);
      writeExpected(out, bill.name, bill.expected);
      expectedOf.set(bill.name, bill.expected);
    }
  });
  return expectedOf;
}

/**
 * Chromium stamps the print time into the PDF's /CreationDate and /ModDate; overwriting the stamp
 * with a fixed one of the same length keeps the byte offsets (xref table) valid and the file the
 * same on every run.
 */
function withFixedDates(pdf: Buffer): Buffer {
  const text = pdf.toString("latin1");
  const fixed = text.replace(/\/(CreationDate|ModDate) \(D:(\d{14})([^)]*)\)/g, (_m, key: string, stamp: string, zone: string) => `/${key} (D:${"20261205000000".slice(0, stamp.length)}${zone.replace(/\d/g, "0")})`);
  return Buffer.from(fixed, "latin1");
}

/** One page of a PDF as a PNG at DPI (poppler's pdftoppm), through a scratch folder. */
export function renderPage(pdfFile: string, pageNo: number, dpi: number, tmp: string): Buffer {
  const prefix = path.join(tmp, `${path.basename(pdfFile, ".pdf")}-p${pageNo}-${dpi}`);
  execFileSync("pdftoppm", ["-r", String(dpi), "-png", "-f", String(pageNo), "-l", String(pageNo), "-singlefile", pdfFile, prefix]);
  return readFileSync(`${prefix}.png`);
}

/** How light falls on the sheet: an SVG the size of the page, multiplied over it. */
export type Light = (width: number, height: number, shade: number) => Buffer;

/** A linear fall-off of light across the page, from `from` to `to` (fractions of the page), ending in a tinted shadow. */
export function linearLight(opts: { from: [number, number]; to: [number, number]; bright: string; middle: [number, string]; tint: [number, number, number] }): Light {
  return (width, height, shade) => {
    const dark = Math.round(255 * (1 - shade));
    const [r, g, b] = opts.tint.map((t) => Math.round(dark * t));
    return Buffer.from(
      `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><linearGradient id="g" x1="${opts.from[0]}" y1="${opts.from[1]}" x2="${opts.to[0]}" y2="${opts.to[1]}">` +
        `<stop offset="0" stop-color="${opts.bright}"/><stop offset="${opts.middle[0]}" stop-color="${opts.middle[1]}"/><stop offset="1" stop-color="rgb(${r},${g},${b})"/></linearGradient></defs>` +
        `<rect width="100%" height="100%" fill="url(#g)"/></svg>`,
    );
  };
}

/** A desk lamp's pool of light centred at (cx, cy) (fractions of the page), falling off to a shadow at the edges. */
export function lampLight(opts: { cx: number; cy: number; radius: number; bright: string; tint: [number, number, number] }): Light {
  return (width, height, shade) => {
    const dark = Math.round(255 * (1 - shade));
    const [r, g, b] = opts.tint.map((t) => Math.round(dark * t));
    return Buffer.from(
      `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}"><defs><radialGradient id="g" cx="${opts.cx}" cy="${opts.cy}" r="${opts.radius}">` +
        `<stop offset="0" stop-color="${opts.bright}"/><stop offset="1" stop-color="rgb(${r},${g},${b})"/></radialGradient></defs>` +
        `<rect width="100%" height="100%" fill="url(#g)"/></svg>`,
    );
  };
}

export type PhotoLook = {
  angle: number;
  blur: number;
  shade: number;
  light: Light;
  background: string;
  quality: number;
  /** Optional: a horizontal shear (a page not held square to the camera), as an affine [1, shear, 0, 1]. */
  shear?: number;
  /** Optional: grain of a dim room, ± this many grey levels of seeded noise. */
  grain?: number;
};

/** A rendered page as a phone photo: lit unevenly, (sheared,) turned, blurred, (grainy,) JPEG. */
export async function photograph(page: Buffer, look: PhotoLook): Promise<Buffer> {
  const { width = 0, height = 0 } = await sharp(page).metadata();
  let image = sharp(await sharp(page).composite([{ input: look.light(width, height, look.shade), blend: "multiply" }]).png().toBuffer());
  if (look.shear) image = sharp(await image.affine([1, look.shear, 0, 1], { background: look.background }).png().toBuffer());
  const turned = image.rotate(look.angle, { background: look.background }).blur(look.blur);
  if (!look.grain) return turned.jpeg({ quality: look.quality }).toBuffer();
  return sharp(await addGrain(await turned.png().toBuffer(), look.grain)).jpeg({ quality: look.quality }).toBuffer();
}

/** Seeded noise (mulberry32), so the photo is the same on every run. */
async function addGrain(png: Buffer, amount: number): Promise<Buffer> {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  let seed = 0x5eed7;
  const next = () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  for (let i = 0; i < data.length; i += info.channels) {
    const d = Math.round((next() * 2 - 1) * amount);
    for (let c = 0; c < info.channels; c++) data[i + c] = Math.max(0, Math.min(255, data[i + c] + d));
  }
  return sharp(data, { raw: { width: info.width, height: info.height, channels: info.channels } }).png().toBuffer();
}
