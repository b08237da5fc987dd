// The signed copy: the unsigned proposal PDF with the customer's drawn signature, typed name,
// chosen offer and the signing date stamped into the signature page's boxes, the notice of
// cancellation's blanks filled in, and a signing certificate appended (signer, e-mail, the time
// on the company's clock and in UTC, IP, user agent, the SHA-256 of the unsigned document, the
// event list, and what the U.S. ESIGN Act and UETA ask of an electronic signature).
// Deterministic for the same input.
import { PDFBool, PDFDict, PDFDocument, PDFHexString, PDFName, PDFString, type PDFImage, type PDFPage } from "pdf-lib";
import { formatCents, formatDate, formatDateTime } from "@/lib/format";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { embedFonts, type DocFonts } from "./fonts";
import { COLORS, SAVE_OPTIONS, compressContentStreams, createFlow, drawLine, drawPageFrames, fitText, type FrameInfo, type TableColumn } from "./layout";
import {
  CHOSEN_OFFER_BOX,
  DEADLINE_PRINTED_KEY,
  FRAME_KEY,
  NOTICE_DEADLINE_BOX,
  NOTICE_TRANSACTION_DATE_BOX,
  PAGE_ROLE,
  PAGE_ROLE_KEY,
  SIGNATURE_BOX,
  SIGNED_DATE_BOX,
  SIGNER_NAME_BOX,
  type Rect,
} from "./proposal-pdf";

export type SignatureStamp = {
  /** The document's language (the proposal PDF's): the stamp and the certificate speak it. */
  locale?: Locale;
  signaturePng: Uint8Array;
  signerName: string;
  signerEmail: string;
  chosenPosition: number;
  chosenOfferName: string;
  chosenContractCents: number;
  signedAt: Date;
  /** The company's time zone: times are printed on its clock, the certificate adds UTC. */
  timeZone: string;
  ip: string;
  userAgent: string;
  /** Hex SHA-256 of the unsigned PDF's bytes. */
  unsignedSha256: string;
  proposalLabel: string;
  events: { at: Date; kind: string; detail: string }[];
  /**
   * The last day to cancel, written into the notice of cancellation's blank (sales made in the
   * home). Optional: without it the blank keeps pointing to the rule's three business days.
   */
  cancelDeadlineText?: string | null;
  /**
   * The day of signing as the deadline was counted from (e.g. the company's local date), for the
   * notice's "date of transaction"; default: the date of signedAt in `timeZone`.
   */
  signedOnText?: string | null;
};

/** The drawn signature is not a usable PNG image. */
export class SignatureImageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SignatureImageError";
  }
}

const PNG_MAGIC = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
/** Inner margin between the signature box's border and the drawing. */
const SIGNATURE_PADDING = 6;

const isoUtc = (d: Date) => d.toISOString();

async function embedSignature(pdf: PDFDocument, png: Uint8Array): Promise<PDFImage> {
  if (png.length < PNG_MAGIC.length || PNG_MAGIC.some((b, i) => png[i] !== b)) {
    throw new SignatureImageError("The signature must be a PNG image");
  }
  try {
    return await pdf.embedPng(png);
  } catch (e) {
    throw new SignatureImageError(`The signature PNG could not be read (${e instanceof Error ? e.message : String(e)})`);
  }
}

function pageRole(page: PDFPage): string | null {
  const v = page.node.get(PDFName.of(PAGE_ROLE_KEY));
  return v instanceof PDFString || v instanceof PDFHexString ? v.decodeText() : null;
}

function readFrame(pdf: PDFDocument, fallbackLabel: string): FrameInfo {
  const dict = pdf.catalog.lookupMaybe(PDFName.of(FRAME_KEY), PDFDict);
  const text = (key: string) => {
    const v = dict?.get(PDFName.of(key));
    return v instanceof PDFHexString || v instanceof PDFString ? v.decodeText() : "";
  };
  return {
    companyName: text("Company") || pdf.getAuthor() || "",
    licenseNumber: text("License") || null,
    documentLabel: text("Label") || fallbackLabel,
  };
}

/** Draws `image` inside `box`, scaled to fit with its aspect ratio kept, centred. */
function drawFitted(page: PDFPage, image: PDFImage, box: Rect, padding: number): void {
  const w = box.width - 2 * padding;
  const h = box.height - 2 * padding;
  const scale = Math.min(w / image.width, h / image.height);
  const dw = image.width * scale;
  const dh = image.height * scale;
  page.drawImage(image, { x: box.x + padding + (w - dw) / 2, y: box.y + padding + (h - dh) / 2, width: dw, height: dh });
}

/** The signature page's boxes: the chosen offer and price, the drawn signature, the typed name and the date. */
function stampSignaturePage(sigPage: PDFPage, image: PDFImage, fonts: DocFonts, s: SignatureStamp, offerLine: string, priceLine: string): void {
  const locale = s.locale ?? "en";
  const t = translator(locale, "pdf.certificate");
  const ob = CHOSEN_OFFER_BOX;
  drawLine(sigPage, fitText(offerLine, fonts.sansBold, 13, ob.width - 16), ob.x + 8, ob.y + ob.height - 32, { font: fonts.sansBold, size: 13 });
  drawLine(sigPage, priceLine, ob.x + 8, ob.y + 9, { font: fonts.mono, size: 11 });
  drawFitted(sigPage, image, SIGNATURE_BOX, SIGNATURE_PADDING);
  drawLine(sigPage, fitText(s.signerName, fonts.sans, 12, SIGNER_NAME_BOX.width - 4), SIGNER_NAME_BOX.x + 2, SIGNER_NAME_BOX.y + 7, { font: fonts.sans, size: 12 });
  drawLine(sigPage, fitText(formatDateTime(s.signedAt, s.timeZone, "minutes", locale), fonts.mono, 10, SIGNED_DATE_BOX.width - 4), SIGNED_DATE_BOX.x + 2, SIGNED_DATE_BOX.y + 7, { font: fonts.mono, size: 10 });
  drawLine(
    sigPage,
    fitText(t("stampLine", { name: s.signerName, email: s.signerEmail, at: formatDateTime(s.signedAt, s.timeZone, "seconds", locale), utc: isoUtc(s.signedAt) }), fonts.sans, 7.5, SIGNATURE_BOX.width + 200),
    SIGNATURE_BOX.x,
    SIGNATURE_BOX.y - 22,
    { font: fonts.sans, size: 7.5, color: COLORS.copper },
  );
}

/** The notice of cancellation's blanks (each copy): the date of transaction, and the deadline where it was not printed. */
function fillCancelNotices(pages: PDFPage[], fonts: DocFonts, s: SignatureStamp): void {
  for (const page of pages) {
    if (pageRole(page) !== PAGE_ROLE.cancelNotice) continue;
    drawLine(page, s.signedOnText ?? formatDate(s.signedAt, s.timeZone, s.locale), NOTICE_TRANSACTION_DATE_BOX.x + 4, NOTICE_TRANSACTION_DATE_BOX.y + 7, { font: fonts.sans, size: 10 });
    const printed = page.node.get(PDFName.of(DEADLINE_PRINTED_KEY)) === PDFBool.True;
    if (!printed && s.cancelDeadlineText) {
      drawLine(page, s.cancelDeadlineText, NOTICE_DEADLINE_BOX.x + 4, NOTICE_DEADLINE_BOX.y + 7, { font: fonts.sans, size: 10 });
    }
  }
}

/** The signing certificate, appended on new pages: who, when, from where, the fingerprint, the events and the law. */
function appendCertificate(pdf: PDFDocument, fonts: DocFonts, s: SignatureStamp, offerLine: string): void {
  const locale = s.locale ?? "en";
  const t = translator(locale, "pdf.certificate");
  const flow = createFlow(pdf, fonts);
  flow.heading(t("heading"));
  flow.paragraph(t("intro", { label: s.proposalLabel }), { size: 9.5, color: COLORS.muted });
  flow.facts([
    { label: t("document"), value: s.proposalLabel },
    { label: t("signer"), value: s.signerName },
    { label: t("email"), value: s.signerEmail },
    { label: t("signedAt"), value: formatDateTime(s.signedAt, s.timeZone, "seconds", locale), mono: true },
    { label: t("signedAtUtc"), value: isoUtc(s.signedAt), mono: true },
    // The address is the connection's (or the trusted proxy's report); the browser names itself.
    { label: t("ip"), value: s.ip, mono: true },
    { label: t("browser"), value: s.userAgent },
    { label: t("offerChosen"), value: `${offerLine}, ${formatCents(s.chosenContractCents, locale)}` },
  ]);
  flow.paragraph(t("sha"), { size: 10, color: COLORS.muted, gapAfter: 2 });
  flow.paragraph(s.unsignedSha256, { font: fonts.mono, size: 9 });
  flow.paragraph(t("shaNote"), { size: 8.5, color: COLORS.muted });
  flow.paragraph(t("events"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const columns: TableColumn[] = [
    { label: t("time"), width: 148 },
    { label: t("event"), width: 76 },
    { label: t("detail"), width: 280 },
  ];
  flow.table(
    columns,
    [...s.events].sort((a, b) => a.at.getTime() - b.at.getTime()).map((e) => ({ cells: [formatDateTime(e.at, s.timeZone, "seconds", locale), e.kind.replace(/_/g, " "), e.detail] })),
  );
  flow.paragraph(t("law"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const law = ["consent", "intent", "association", "retention"] as const;
  flow.bullets(law.map((k) => t(k)), { size: 9 });
  if (locale !== "en") {
    // Legal text in translation: say so and keep the English text (our choice: the English prevails).
    const en = translator("en", "pdf.certificate");
    flow.paragraph(translator(locale, "legal")("translationNotice"), { font: fonts.sansBold, size: 9.5 });
    flow.paragraph(en("law"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
    flow.bullets(law.map((k) => en(k)), { size: 9 });
  }
}

/** Stamps the signature into the unsigned proposal and appends the signing certificate. */
export async function stampSignedPdf(unsigned: Uint8Array, s: SignatureStamp): Promise<Uint8Array> {
  const pdf = await PDFDocument.load(unsigned, { updateMetadata: false });
  const image = await embedSignature(pdf, s.signaturePng);
  const fonts = await embedFonts(pdf, { subsetTag: "KS" });
  const pages = pdf.getPages();
  const originalCount = pages.length;
  const sigPage = pages.find((p) => pageRole(p) === PAGE_ROLE.signature) ?? pages[originalCount - 1];
  const locale = s.locale ?? "en";
  const t = translator(locale, "pdf.certificate");
  const offerLine = t("offerLine", { n: s.chosenPosition, name: s.chosenOfferName });
  const priceLine = t("priceLine", { price: formatCents(s.chosenContractCents, locale) });
  stampSignaturePage(sigPage, image, fonts, s, offerLine, priceLine);
  fillCancelNotices(pages, fonts, s);
  appendCertificate(pdf, fonts, s, offerLine);

  const frame = readFrame(pdf, s.proposalLabel);
  const certPages = pdf.getPageCount() - originalCount;
  const frameT = translator(locale, "pdf.frame");
  drawPageFrames(pdf, fonts, frame, {
    fromPage: originalCount,
    locale,
    pageLabel: (i) => frameT("certificatePage", { n: i - originalCount + 1, total: certPages }),
  });
  pdf.setModificationDate(s.signedAt);
  compressContentStreams(pdf);
  return pdf.save(SAVE_OPTIONS);
}
