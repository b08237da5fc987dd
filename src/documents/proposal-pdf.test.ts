import { createHash } from "node:crypto";
import { PDFDocument } from "pdf-lib";
import { extractText } from "unpdf";
import { beforeAll, describe, expect, it } from "vitest";
import { figureDefinitions } from "@/lib/figure-definitions";
import { formatCents } from "@/lib/format";
import { FIXTURE_META, fixtureSnapshot } from "./fixtures";
import { SIGNATURE_BOX, renderProposalPdf } from "./proposal-pdf";

const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
const latin1 = (b: Uint8Array) => Buffer.from(b).toString("latin1");

/** Text of each page (unpdf detaches the buffer it is given, so it gets a copy). */
async function pagesText(bytes: Uint8Array): Promise<string[]> {
  const { text } = await extractText(bytes.slice(), { mergePages: false });
  return text;
}

// Cover, energy today, 3 pages per offer, 2 of assumptions, the right to cancel with its two
// copies of the notice, and the signature page.
const PAGES_3_OFFERS_IN_HOME = 17;

describe("renderProposalPdf (3 offers, sold in the home)", () => {
  const snapshot = fixtureSnapshot(3);
  let bytes: Uint8Array;
  let pages: string[];
  let all: string;

  beforeAll(async () => {
    bytes = await renderProposalPdf(snapshot, FIXTURE_META);
    pages = await pagesText(bytes);
    all = pages.join("\n");
  });

  it("is a PDF that pdf-lib loads, with the expected pages, all US Letter", async () => {
    expect(latin1(bytes.slice(0, 5))).toBe("%PDF-");
    const doc = await PDFDocument.load(bytes);
    expect(doc.getPageCount()).toBe(PAGES_3_OFFERS_IN_HOME);
    expect(pages).toHaveLength(PAGES_3_OFFERS_IN_HOME);
    for (const p of doc.getPages()) expect(p.getSize()).toEqual({ width: 612, height: 792 });
  });

  it("has selectable text: the household, each offer and its contract price as formatted on screen", () => {
    expect(all).toContain(snapshot.household.name);
    expect(all).toContain(snapshot.household.street);
    for (const o of snapshot.offers) {
      expect(all).toContain(o.name);
      expect(all).toContain(formatCents(o.figures.summary.contractCents));
      expect(all).toContain(formatCents(o.figures.summary.netCostCents));
    }
    expect(all).toContain("Proposal P-1042 v2");
    expect(all).toContain(snapshot.rep.name);
  });

  it("puts the company name, license number and page N of M on every page", () => {
    pages.forEach((text, i) => {
      expect(text).toContain(`page ${i + 1} of ${PAGES_3_OFFERS_IN_HOME}`);
      expect(text).toContain("Tallgrass Bright Energy");
      expect(text).toContain("NC-EC 31187-U");
    });
  });

  it("covers energy today, the system, both charts' labels, money, assumptions and cautions", () => {
    expect(pages[1]).toContain("Your energy today");
    expect(pages[1]).toContain(snapshot.offers[0].figures.assumptions.ratePlanName);
    expect(pages[1]).toContain("12,430 kWh");
    expect(pages[2]).toContain("Prairieline PL-410");
    expect(pages[2]).toContain("South main roof");
    expect(pages[2]).toContain("Solar production (kWh)");
    expect(pages[3]).toContain("Cumulative cash flow over 25 years");
    expect(pages[3]).toContain("Simple ROI");
    expect(all).toContain("Assumptions and disclosures");
    expect(all).toContain("TMY3");
    expect(all).toContain("authority having jurisdiction (AHJ)");
    expect(all).toContain("Estimates, not a guarantee");
    // An incentive that ended before the offer date is listed with its dates, never applied.
    expect(all.replace(/\s+/g, " ")).toContain("ended 2025-12-31, before the offer on 2026-03-02");
  });

  it("says beside payback and ROI what each is, with each offer's own denominator, and the simple payback in the assumptions", () => {
    const flat = all.replace(/\s+/g, " ");
    const [cash, loan] = snapshot.offers;
    for (const o of [cash, loan]) {
      const d = figureDefinitions(o.figures, o.inputs.payment.kind);
      expect(flat).toContain(d.payback);
      expect(flat).toContain(d.roi);
      expect(flat).toContain(d.simplePayback!);
    }
    expect(flat).toContain(`What you pay: ${formatCents(cash.figures.summary.roiBasisCents)}, the cash price after the incentives and credits.`);
    expect(flat).toContain(`the ${formatCents(loan.figures.summary.downPaymentCents)} down payment plus all the loan's payments`);
  });

  it("carries the notice of the right to cancel (16 CFR 429.1) and its form twice", () => {
    expect(all).toContain("Your right to cancel");
    expect(all).toContain("16 CFR Part 429");
    // 429.1(a): the statement next to the buyer's signature, on the signature page.
    expect(pages[pages.length - 1]).toContain("You, the buyer, may cancel this transaction at any time prior to midnight of the third business day");
    // 429.1(b): the captioned form with the cancellation line, in duplicate.
    expect(all.match(/NOTICE OF CANCELLATION/g)).toHaveLength(2);
    expect(all.match(/I HEREBY CANCEL THIS TRANSACTION\./g)).toHaveLength(2);
    expect(all).toContain("three business days after you sign");
  });

  it("ends with the signature page", () => {
    const last = pages[pages.length - 1];
    expect(last).toContain("Your agreement");
    expect(last).toContain("Signature of buyer");
    expect(last).toContain("Offer chosen");
    expect(SIGNATURE_BOX.width).toBeGreaterThan(200);
  });

  it("embeds the three Plex fonts as TrueType subsets and no standard font", () => {
    const raw = latin1(bytes);
    expect(raw.match(/\/FontFile2/g)).toHaveLength(3);
    expect(raw).toContain("/KWSANS+IBMPlexSans-Regular");
    expect(raw).toContain("/KWSEMI+IBMPlexSans-SemiBold");
    expect(raw).toContain("/KWMONO+IBMPlexMono-Regular");
    expect(raw).not.toMatch(/\/BaseFont \/(Helvetica|Times|Courier)/);
  });

  it("is deterministic: same input, same SHA-256; dates from sentAt", async () => {
    const again = await renderProposalPdf(fixtureSnapshot(3), FIXTURE_META);
    expect(sha256(again)).toBe(sha256(bytes));
    const doc = await PDFDocument.load(bytes, { updateMetadata: false });
    expect(doc.getCreationDate()?.toISOString()).toBe(FIXTURE_META.sentAt.toISOString());
    expect(doc.getModificationDate()?.toISOString()).toBe(FIXTURE_META.sentAt.toISOString());
    expect(doc.getProducer()).toBe("Kilowright documents (pdf-lib)");
    const later = await renderProposalPdf(fixtureSnapshot(3), { ...FIXTURE_META, sentAt: new Date("2026-03-03T09:00:00Z") });
    expect(sha256(later)).not.toBe(sha256(bytes));
  });
});

describe("renderProposalPdf, other cases", () => {
  it("prints a known cancellation deadline in the notice and on the form", async () => {
    const bytes = await renderProposalPdf(fixtureSnapshot(1), { ...FIXTURE_META, cancelDeadlineText: "Friday, March 6, 2026" });
    const all = (await pagesText(bytes)).join("\n");
    expect(all).toContain("Friday, March 6, 2026");
    expect(all).toMatch(/NOT\s+LATER\s+THAN\s+MIDNIGHT\s+OF\s+Friday,\s+March\s+6,\s+2026/);
  });

  it("a sale not made in the home has no cancellation pages; one offer makes fewer pages", async () => {
    const bytes = await renderProposalPdf(fixtureSnapshot(1), { ...FIXTURE_META, inHomeSale: false });
    const pages = await pagesText(bytes);
    // Cover, energy, 3 for the offer, assumptions (1–2 pages), signature.
    expect(pages.length).toBeGreaterThanOrEqual(7);
    expect(pages.length).toBeLessThanOrEqual(8);
    const all = pages.join("\n");
    expect(all).not.toContain("NOTICE OF CANCELLATION");
    expect(pages[pages.length - 1]).not.toContain("You, the buyer, may cancel");
    expect(pages[pages.length - 1]).toContain("Your agreement");
    expect(pages[0]).toContain(`page 1 of ${pages.length}`);
  });

  it("a household or company with characters outside Latin-1 still renders", async () => {
    const s = fixtureSnapshot(1);
    s.household.name = "Nguyễn–Øberg household";
    s.company.name = "Tallgrass Bright Energy — Süd";
    s.company.licenseNumber = null;
    const bytes = await renderProposalPdf(s, FIXTURE_META);
    const all = (await pagesText(bytes)).join("\n");
    expect(all).toContain("Nguyễn–Øberg household");
    expect(all).not.toContain("License no.");
  });

  it("refuses a snapshot without offers", async () => {
    const s = fixtureSnapshot(1);
    s.offers = [];
    await expect(renderProposalPdf(s, FIXTURE_META)).rejects.toThrow(/at least one offer/);
  });
});
