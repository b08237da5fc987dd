import { PDFDocument } from "pdf-lib";
import { extractText } from "unpdf";
import { beforeAll, describe, expect, it } from "vitest";
import { niceStep } from "./charts";
import { embedFonts, type DocFonts } from "./fonts";
import { SAVE_OPTIONS, compressContentStreams, createFlow, drawPageFrames, fitText, wrapText } from "./layout";

let pdf: PDFDocument;
let fonts: DocFonts;

beforeAll(async () => {
  pdf = await PDFDocument.create({ updateMetadata: false });
  fonts = await embedFonts(pdf);
});

describe("wrapText", () => {
  it("breaks at spaces within the width and keeps every word in order", () => {
    const text = "Production depends on weather, shading and upkeep, and bills on the utility's future prices.";
    const lines = wrapText(text, fonts.sans, 10, 150);
    expect(lines.length).toBeGreaterThan(2);
    for (const l of lines) expect(fonts.sans.widthOfTextAtSize(l, 10)).toBeLessThanOrEqual(150);
    expect(lines.join(" ")).toBe(text);
  });

  it("keeps explicit line breaks and cuts a word wider than the line", () => {
    expect(wrapText("one\ntwo", fonts.sans, 10, 300)).toEqual(["one", "two"]);
    const hash = "a".repeat(120);
    const lines = wrapText(hash, fonts.mono, 9, 200);
    expect(lines.length).toBeGreaterThan(1);
    expect(lines.join("")).toBe(hash);
    for (const l of lines) expect(fonts.mono.widthOfTextAtSize(l, 9)).toBeLessThanOrEqual(200);
  });

  it("fitText shortens with an ellipsis", () => {
    const s = fitText("Module-level optimizers for every panel on the roof", fonts.sans, 9, 80);
    expect(s.endsWith("…")).toBe(true);
    expect(fonts.sans.widthOfTextAtSize(s, 9)).toBeLessThanOrEqual(80);
    expect(fitText("short", fonts.sans, 9, 80)).toBe("short");
  });
});

describe("niceStep", () => {
  it("gives round steps", () => {
    expect(niceStep(1420, 5)).toBe(500);
    expect(niceStep(40_000, 5)).toBe(10_000);
    expect(niceStep(9, 5)).toBe(2);
    expect(niceStep(0, 5)).toBe(1);
  });
});

describe("flow and page frames", () => {
  it("flows a long table over pages and numbers every page", async () => {
    const doc = await PDFDocument.create({ updateMetadata: false });
    const f = await embedFonts(doc);
    const flow = createFlow(doc, f);
    flow.heading("Bill of materials");
    flow.table(
      [
        { label: "Item", width: 300 },
        { label: "Qty", width: 60, align: "right", mono: true },
      ],
      Array.from({ length: 80 }, (_, i) => ({ cells: [`Rail splice ${i + 1}`, String(i + 1)] })),
    );
    drawPageFrames(doc, f, { companyName: "Tallgrass Bright Energy", licenseNumber: "NC-EC 31187-U", documentLabel: "Job packet" });
    compressContentStreams(doc);
    const bytes = await doc.save(SAVE_OPTIONS);
    const { text, totalPages } = await extractText(bytes.slice(), { mergePages: false });
    expect(totalPages).toBeGreaterThan(1);
    const last = text[totalPages - 1];
    expect(text[0]).toContain("Rail splice 1");
    expect(last).toContain("Rail splice 80");
    expect(last).toContain("Item"); // header repeated on the new page
    expect(last).toContain(`page ${totalPages} of ${totalPages}`);
    // Every row once, in order.
    const rows = text.join("\n").match(/Rail splice \d+/g) ?? [];
    expect(rows).toEqual(Array.from({ length: 80 }, (_, i) => `Rail splice ${i + 1}`));
    expect(text[0]).toContain("License no. NC-EC 31187-U");
  });

  it("refuses a subset tag that is not two capital letters", async () => {
    const doc = await PDFDocument.create();
    await expect(embedFonts(doc, { subsetTag: "k1" })).rejects.toThrow(/two capital letters/);
  });
});
