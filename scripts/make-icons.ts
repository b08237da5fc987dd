// Renders the app's icons from public/icon.svg: PNGs for home screens and a favicon.ico.
// Run after changing the mark: `npx tsx scripts/make-icons.ts` (the outputs are committed).
import { readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import sharp from "sharp";

const dir = join(import.meta.dirname, "..", "public");
const svg = readFileSync(join(dir, "icon.svg"));

const png = (size: number) => sharp(svg, { density: Math.ceil((72 * size) / 64) }).resize(size, size).png().toBuffer();

/** An ICO file holding PNG images (the layout Windows Vista introduced; every current browser reads it). */
function ico(images: { size: number; data: Buffer }[]): Buffer {
  const header = Buffer.alloc(6);
  header.writeUInt16LE(0, 0); // reserved
  header.writeUInt16LE(1, 2); // type: icon
  header.writeUInt16LE(images.length, 4);
  const entries: Buffer[] = [];
  let offset = 6 + 16 * images.length;
  for (const { size, data } of images) {
    const e = Buffer.alloc(16);
    e.writeUInt8(size >= 256 ? 0 : size, 0); // width (0 = 256)
    e.writeUInt8(size >= 256 ? 0 : size, 1); // height
    e.writeUInt16LE(1, 4); // colour planes
    e.writeUInt16LE(32, 6); // bits per pixel
    e.writeUInt32LE(data.length, 8);
    e.writeUInt32LE(offset, 12);
    offset += data.length;
    entries.push(e);
  }
  return Buffer.concat([header, ...entries, ...images.map((i) => i.data)]);
}

async function main() {
  for (const [name, size] of [["icon-192.png", 192], ["icon-512.png", 512], ["apple-touch-icon.png", 180]] as const) {
    writeFileSync(join(dir, name), await png(size));
  }
  const small = await Promise.all([16, 32, 48].map(async (size) => ({ size, data: await png(size) })));
  writeFileSync(join(dir, "favicon.ico"), ico(small));
}

void main();
