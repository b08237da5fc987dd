import { createHash } from "node:crypto";
import { PDFDict, PDFDocument, PDFName, PDFRawStream } from "pdf-lib";
import { extractText } from "unpdf";
import { beforeAll, describe, expect, it } from "vitest";
import { formatCents } from "@/lib/format";
import { FIXTURE_META, TINY_PNG, fixtureSignaturePng, fixtureSnapshot, fixtureStamp } from "./fixtures";
import { renderProposalPdf } from "./proposal-pdf";
import { SignatureImageError, stampSignedPdf, type SignatureStamp } from "./signed-pdf";

const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");

async function pagesText(bytes: Uint8Array): Promise<string[]> {
  const { text } = await extractText(bytes.slice(), { mergePages: false });
  return text;
}

describe("stampSignedPdf", () => {
  let unsigned: Uint8Array;
  let unsignedSha: string;
  let unsignedPages: number;
  let png: Uint8Array;
  let stamp: SignatureStamp;
  let signed: Uint8Array;
  let pages: string[];

  beforeAll(async () => {
    unsigned = await renderProposalPdf(fixtureSnapshot(3), FIXTURE_META);
    unsignedSha = sha256(unsigned);
    unsignedPages = (await PDFDocument.load(unsigned)).getPageCount();
    png = await fixtureSignaturePng();
    stamp = { ...fixtureStamp(png, unsignedSha), cancelDeadlineText: "Friday, March 6, 2026" };
    signed = await stampSignedPdf(unsigned, stamp);
    pages = await pagesText(signed);
  });

  it("adds exactly one page (the certificate) and pdf-lib loads the result", async () => {
    const doc = await PDFDocument.load(signed);
    expect(doc.getPageCount()).toBe(unsignedPages + 1);
    expect(pages).toHaveLength(unsignedPages + 1);
  });

  it("leaves the unsigned bytes untouched", () => {
    expect(sha256(unsigned)).toBe(unsignedSha);
  });

  it("stamps the signer's name, the chosen offer and its price, and the date on the company's clock on the signature page", () => {
    const sigPage = pages[unsignedPages - 1];
    expect(sigPage).toContain("Your agreement");
    expect(sigPage).toContain("Marisol Ventana");
    expect(sigPage).toContain(`Offer 2: ${stamp.chosenOfferName}`);
    expect(sigPage).toContain(`Contract price ${formatCents(stamp.chosenContractCents)}`);
    // 01:12 UTC on March 3 is the evening of March 2 in New York, the company's zone.
    expect(sigPage).toContain("Mar 2, 2026, 8:12 PM EST");
    expect(sigPage).toContain("on Mar 2, 2026, 8:12:45 PM EST (2026-03-03T01:12:45.000Z)");
    expect(sigPage).not.toContain("Mar 3, 2026");
  });

  it("draws the signature as an image inside the signature page", async () => {
    const doc = await PDFDocument.load(signed);
    const page = doc.getPage(unsignedPages - 1);
    const xobjects = page.node.Resources()?.lookup(PDFName.of("XObject"), PDFDict);
    const images = (xobjects?.values() ?? [])
      .map((ref) => doc.context.lookup(ref))
      .filter((o): o is PDFRawStream => o instanceof PDFRawStream && o.dict.get(PDFName.of("Subtype")) === PDFName.of("Image"));
    expect(images).toHaveLength(1);
  });

  it("appends the signing certificate with signer, e-mail, time, IP, user agent, the unsigned SHA-256 and the events", () => {
    const cert = pages[pages.length - 1];
    expect(cert).toContain("Signing certificate");
    expect(cert).toContain("Marisol Ventana");
    expect(cert).toContain("marisol.ventana@example.com");
    expect(cert).toContain("Mar 2, 2026, 8:12:45 PM EST"); // the company's clock, named
    expect(cert).toContain("2026-03-03T01:12:45.000Z"); // and UTC
    expect(cert).toContain("Mar 2, 2026, 10:30:02 AM EST"); // the "sent" event, on the same clock
    expect(cert).toContain("203.0.113.24");
    expect(cert).toContain("Mozilla/5.0 (iPhone;");
    expect(cert).toContain(unsignedSha);
    expect(cert).toContain("Proposal P-1042 v2");
    for (const e of stamp.events) expect(cert).toContain(e.detail);
    expect(cert).toContain("ESIGN");
    expect(cert).toContain("Retention");
    expect(cert).toContain("signing certificate, page 1 of 1");
    expect(cert).toContain("NC-EC 31187-U");
  });

  it("fills the notice of cancellation's date of transaction and deadline", () => {
    const notices = pages.filter((p) => p.includes("NOTICE OF CANCELLATION"));
    expect(notices).toHaveLength(2);
    for (const n of notices) {
      expect(n).toContain("Mar 2, 2026");
      expect(n).not.toContain("Mar 3, 2026");
      expect(n).toContain("Friday, March 6, 2026");
    }
  });

  it("is deterministic and keeps the creation date; its modification date is the signing time", async () => {
    const again = await stampSignedPdf(unsigned, stamp);
    expect(sha256(again)).toBe(sha256(signed));
    const doc = await PDFDocument.load(signed, { updateMetadata: false });
    expect(doc.getCreationDate()?.toISOString()).toBe(FIXTURE_META.sentAt.toISOString());
    expect(doc.getModificationDate()?.toISOString()).toBe(stamp.signedAt.toISOString());
  });

  it("a different signer gives a different file", async () => {
    const other = await stampSignedPdf(unsigned, { ...stamp, signerName: "Someone Else" });
    expect(sha256(other)).not.toBe(sha256(signed));
  });

  it("accepts a 1 × 1 PNG", async () => {
    const out = await stampSignedPdf(unsigned, { ...stamp, signaturePng: TINY_PNG });
    expect((await PDFDocument.load(out)).getPageCount()).toBe(unsignedPages + 1);
  });

  it("refuses a signature that is not a PNG, with a clear error", async () => {
    const jpeg = Uint8Array.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01]);
    await expect(stampSignedPdf(unsigned, { ...stamp, signaturePng: jpeg })).rejects.toThrow(SignatureImageError);
    await expect(stampSignedPdf(unsigned, { ...stamp, signaturePng: jpeg })).rejects.toThrow("The signature must be a PNG image");
    await expect(stampSignedPdf(unsigned, { ...stamp, signaturePng: new Uint8Array() })).rejects.toThrow(SignatureImageError);
  });

  it("refuses a PNG that is cut short", async () => {
    await expect(stampSignedPdf(unsigned, { ...stamp, signaturePng: png.slice(0, 40) })).rejects.toThrow(SignatureImageError);
  });

  it("refuses bytes that are not a PDF", async () => {
    await expect(stampSignedPdf(new TextEncoder().encode("not a pdf"), stamp)).rejects.toThrow();
  });
});
