// Photos and scans of bills through the real tesseract binary (Debian's tesseract-ocr, installed by
// scripts/bootstrap.mjs): the photo fixtures (tests/fixtures/bills/photos, made by
// scripts/make-bill-photos.ts from corpus pages turned, blurred and unevenly lit) and a scanned PDF.
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import sharp from "sharp";
import { describe, expect, it } from "vitest";
import { billJson, type BillJson } from "./index";
import { ocrImage, ocrScannedPdf, ocrTooPoor, readBillByOcr, MIN_CONFIDENT_WORDS, OcrError } from "./ocr-pages";

const dir = path.resolve(import.meta.dirname, "../../../tests/fixtures/bills/photos");
const files = readdirSync(dir).filter((f) => /\.(jpg|png|pdf)$/.test(f));
const read = (f: string) => new Uint8Array(readFileSync(path.join(dir, f)));

describe("bills read by OCR", () => {
  it("has at least two photos and one image-only PDF", () => {
    expect(files.filter((f) => f.endsWith(".jpg")).length).toBeGreaterThanOrEqual(2);
    expect(files.filter((f) => f.endsWith(".pdf")).length).toBeGreaterThanOrEqual(1);
  });

  // Up to four OCR runs a photo (first reading, sparse, sparse turned upright, one block), each a few seconds; more on a busy machine.
  it.each(files)("%s: every field read right", { timeout: 150_000 }, async (file) => {
    const expected = JSON.parse(readFileSync(path.join(dir, file.replace(/\.\w+$/, ".json")), "utf8")) as BillJson;
    const { reading } = await readBillByOcr(read(file), file.endsWith(".pdf") ? "pdf" : "image");
    const got = billJson(reading, "ocr");
    expect(got.source).toBe("ocr");
    expect(got.current).toEqual(expected.current);
    expect(got.history).toEqual(expected.history);
  });

  it("photos of a bill's two pages are read as one document: the history on page 2 joins page 1's fields", { timeout: 300_000 }, async () => {
    const setDir = path.resolve(dir, "../photo-sets/birchfield-two-page");
    const expected = JSON.parse(readFileSync(path.join(setDir, "expected.json"), "utf8")) as BillJson;
    const pages = ["page-1.jpg", "page-2.jpg"].map((f) => new Uint8Array(readFileSync(path.join(setDir, f))));
    const { reading, ocr } = await readBillByOcr(pages, "image");
    expect(ocr.pages).toHaveLength(2);
    const got = billJson(reading, "ocr");
    expect(got.current).toEqual(expected.current);
    expect(got.history).toEqual(expected.history);
    expect(reading.history?.months.at(-1)?.where.page).toBe(2);
  });

  it("stops a run over its time limit and names the limit", { timeout: 30_000 }, async () => {
    const err = await ocrImage(read("larkhaven-classic-photo.jpg"), { timeoutMs: 200 }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(OcrError);
    expect((err as OcrError).code).toBe("ocr_timeout");
    expect((err as OcrError).message).toMatch(/took longer than 0\.20 s and was stopped \(tesseract's time limit\)/);
  });

  it("stops rendering a scanned PDF over its time limit too", { timeout: 30_000 }, async () => {
    const err = await ocrScannedPdf(read("marrowstone-read-dates-scan.pdf"), { timeoutMs: 5 }).catch((e: unknown) => e);
    expect((err as OcrError).code).toBe("ocr_timeout");
  });

  it("says plainly when a photo is too blurred to read", { timeout: 60_000 }, async () => {
    const blurred = await sharp(read("larkhaven-classic-photo.jpg")).resize({ width: 500 }).blur(4).jpeg().toBuffer();
    const { reading, ocr } = await readBillByOcr(new Uint8Array(blurred), "image");
    expect(ocr.confidentWords).toBeLessThan(MIN_CONFIDENT_WORDS);
    const found = [reading.period, reading.kwh, reading.amountDue, reading.history].filter(Boolean).length;
    expect(ocrTooPoor(ocr, found)).toMatch(/^Only \d+ words? could be read with confidence \(at least 25 are needed\): the picture is too blurred, dark or small\.$/);
  });

  it("says so when the text reads but holds no bill", () => {
    const ocr = { pages: [], words: 80, confidentWords: 70 };
    expect(ocrTooPoor(ocr, 0)).toBe("The text was read, but no billing period, kWh, amount due or usage history was found in it.");
    expect(ocrTooPoor(ocr, 2)).toBeNull();
  });
});
