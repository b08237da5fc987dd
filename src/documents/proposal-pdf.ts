// The proposal as a PDF: the same frozen snapshot the customer's page shows, as a real document
// (selectable text in embedded fonts, charts as vectors, the company's name, license number and
// "page N of M" on every page). Pages: cover, energy today, each offer (system with the
// production chart, money with the cash-flow chart, the 25-year table), assumptions and
// disclosures, the notice of the right to cancel (sales made in the home), and LAST the
// signature page, whose boxes stampSignedPdf fills in (their coordinates are exported below).
//
// Deterministic: the same snapshot and meta give the same bytes (fixed metadata dates from
// meta.sentAt, fixed producer and font names, no object streams).
import { PDFBool, PDFDocument, PDFHexString, PDFName, PDFString, type PDFPage } from "pdf-lib";
import { proposalLabel as shortProposalLabel } from "@/lib/proposal-snapshot";
import { formatCents, formatDate } from "@/lib/format";
import { figureDefinitions } from "@/lib/figure-definitions";
import { OFFER_CAUTION } from "@/lib/offer-figures";
import type { ProposalSnapshot, ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import { drawCashflowChart, drawUsageProductionChart } from "./charts";
import { embedFonts, type DocFonts } from "./fonts";
import {
  COLORS,
  CONTENT_TOP,
  CONTENT_WIDTH,
  MARGIN_X,
  PAGE_WIDTH,
  SAVE_OPTIONS,
  compressContentStreams,
  createFlow,
  drawLine,
  drawPageFrames,
  drawWrapped,
  licenseText,
  setFixedMetadata,
  type Flow,
  type FrameInfo,
  type TableColumn,
} from "./layout";

export type ProposalPdfMeta = {
  number: number;
  version: number;
  sentAt: Date;
  expiresAt: Date;
  /** The company's time zone (Settings → Company): the dates printed are its days. */
  timeZone: string;
  /** A sale made in the home carries the buyer's right to cancel (16 CFR Part 429). */
  inHomeSale: boolean;
  /** The last day to cancel as text (e.g. "Friday, March 6, 2026"); null when not known yet. */
  cancelDeadlineText: string | null;
  /**
   * The seller's business address for the notice of cancellation (16 CFR 429.1(b)). Optional:
   * the snapshot does not carry one yet; without it the notice points to the rep's e-mail and the
   * proposal page.
   */
  sellerAddress?: string | null;
};

// ── The signature page's boxes (PDF points from the bottom left of a US Letter page) ──────

export type Rect = { x: number; y: number; width: number; height: number };

/** Where the chosen offer's name and contract price are written. */
export const CHOSEN_OFFER_BOX: Rect = { x: MARGIN_X, y: 492, width: CONTENT_WIDTH, height: 58 };
/** Where the drawn signature is placed (scaled to fit, aspect kept). */
export const SIGNATURE_BOX: Rect = { x: MARGIN_X, y: 314, width: 300, height: 104 };
/** Where the typed name is written. */
export const SIGNER_NAME_BOX: Rect = { x: MARGIN_X, y: 252, width: 300, height: 30 };
/** Where the signing date (UTC) is written. */
export const SIGNED_DATE_BOX: Rect = { x: 378, y: 252, width: 180, height: 30 };
/** The notice of cancellation's blanks, on each copy of the form. */
export const NOTICE_TRANSACTION_DATE_BOX: Rect = { x: 250, y: 652, width: 308, height: 22 };
export const NOTICE_DEADLINE_BOX: Rect = { x: 250, y: 624, width: 308, height: 22 };

/** Page dictionary key marking the pages stampSignedPdf fills in; its value names the role. */
export const PAGE_ROLE_KEY = "KilowrightPageRole";
export const PAGE_ROLE = { signature: "signature", cancelNotice: "cancel-notice" } as const;
/** On a notice page: true when the deadline was printed at render time (nothing to fill in). */
export const DEADLINE_PRINTED_KEY = "KilowrightDeadlinePrinted";
/**
 * Catalog key holding the frame (company, license, document label) so pages added later (the
 * signing certificate) carry the same header and footer.
 */
export const FRAME_KEY = "KilowrightFrame";

function markPage(page: PDFPage, role: string): void {
  page.node.set(PDFName.of(PAGE_ROLE_KEY), PDFString.of(role));
}

function storeFrame(pdf: PDFDocument, frame: FrameInfo): void {
  pdf.catalog.set(
    PDFName.of(FRAME_KEY),
    pdf.context.obj({
      Company: PDFHexString.fromText(frame.companyName),
      License: PDFHexString.fromText(frame.licenseNumber ?? ""),
      Label: PDFHexString.fromText(frame.documentLabel),
    }),
  );
}

// ── Formatting ─────────────────────────────────────────────────────────────────────────────

const int = new Intl.NumberFormat("en-US", { maximumFractionDigits: 0 });
const kwh = (v: number) => `${int.format(v)} kWh`;
const pct = (v: number, digits = 1) => `${v < 0 ? "−" : ""}${Math.abs(v).toFixed(digits)} %`;
const ratioPct = (r: number | null, digits = 1) => (r === null ? "—" : pct(r * 100, digits));
const kw = (v: number) => `${v.toFixed(2)} kW`;
const signedCents = (c: number) => (c < 0 ? `−${formatCents(-c)}` : formatCents(c));
const sum = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);
const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** "Proposal P-1042 v2": the same number and version the customer's page and e-mails show. */
export function proposalLabel(meta: Pick<ProposalPdfMeta, "number" | "version">): string {
  return `Proposal ${shortProposalLabel(meta.number, meta.version)}`;
}

function paymentText(o: ProposalSnapshotOffer): string {
  const p = o.inputs.payment;
  if (p.kind === "cash") return "Cash";
  const fee = p.dealerFeePct > 0 ? `, dealer fee ${pct(p.dealerFeePct, 2)} added to the amount financed` : "";
  return `Loan: ${pct(p.aprPct, 2)} APR over ${p.termMonths} months${fee}`;
}

/** "25 years", or "20 to 25 years" when the offers were figured over different periods. */
function savingsYears(offers: readonly ProposalSnapshotOffer[]): string {
  const ys = offers.map((o) => o.figures.assumptions.years);
  const lo = Math.min(...ys);
  const hi = Math.max(...ys);
  return lo === hi ? `${lo} years` : `${lo} to ${hi} years`;
}

const whenPaid = (year: number) => (year === 0 ? "at signing" : `in year ${year}`);

// ── Pages ──────────────────────────────────────────────────────────────────────────────────

function cover(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta): void {
  const { page, fonts } = flow;
  let y = CONTENT_TOP - 30;
  page.drawRectangle({ x: MARGIN_X, y, width: 56, height: 4, color: COLORS.copper });
  y -= 34;
  drawLine(page, "Solar proposal", MARGIN_X, y, { font: fonts.sansBold, size: 28 });
  y -= 26;
  drawLine(page, `for ${s.household.name}`, MARGIN_X, y, { font: fonts.sans, size: 16 });
  y -= 20;
  drawLine(page, `${s.household.street}, ${s.household.city}, ${s.household.region} ${s.household.postalCode}`, MARGIN_X, y, { font: fonts.sans, size: 11, color: COLORS.muted });
  y -= 44;
  flow.y = y;
  flow.facts(
    [
      { label: "Proposal", value: `${meta.number}-${meta.version}`, mono: true },
      { label: "Prepared for", value: [s.household.contactName, s.household.email].filter(Boolean).join(" · ") || s.household.name },
      { label: "Prepared by", value: `${s.rep.name} (${s.rep.email}), ${s.company.name}` },
      { label: "Date", value: formatDate(meta.sentAt, meta.timeZone) },
      { label: "Valid until", value: formatDate(meta.expiresAt, meta.timeZone) },
      ...(s.company.licenseNumber ? [{ label: "Contractor license", value: s.company.licenseNumber }] : []),
    ],
    130,
  );
  flow.space(14);
  flow.heading(s.offers.length === 1 ? "The offer at a glance" : `${s.offers.length} offers at a glance`, 13);
  flow.space(6);
  const cols: TableColumn[] = [
    { label: "Offer", width: 150 },
    { label: "System", width: 62, align: "right", mono: true },
    { label: "Contract price", width: 82, align: "right", mono: true },
    { label: "Net cost", width: 76, align: "right", mono: true },
    { label: "Year-1 savings", width: 76, align: "right", mono: true },
    { label: "Payback", width: 58, align: "right", mono: true },
  ];
  flow.table(
    cols,
    s.offers.map((o) => ({
      cells: [
        `${o.position}. ${o.name}`,
        kw(o.figures.summary.kwDc),
        formatCents(o.figures.summary.contractCents),
        formatCents(o.figures.summary.netCostCents),
        formatCents(o.figures.summary.year1SavingsCents),
        o.figures.summary.paybackYears === null ? "—" : `${o.figures.summary.paybackYears.toFixed(1)} yr`,
      ],
    })),
  );
  flow.paragraph(
    `Inside: your energy today, each offer's system and expected production, what it costs and saves over ${savingsYears(s.offers)}, every assumption behind the figures` +
      (meta.inHomeSale ? ", your right to cancel," : ",") +
      " and the page to sign. All figures are estimates; see “Assumptions and disclosures”.",
    { size: 9.5, color: COLORS.muted },
  );
}

function energyToday(flow: Flow, s: ProposalSnapshot): void {
  flow.newPage();
  flow.heading("Your energy today");
  const first = s.offers[0];
  const usage = s.usage.monthlyKwh;
  const bills = first?.figures.monthly.billWithoutSolarCents ?? [];
  const planNames = [...new Set(s.offers.map((o) => o.figures.assumptions.ratePlanName))];
  flow.facts([
    { label: "Utility", value: s.utilityName ?? "Not given" },
    { label: "Rate plan", value: planNames.join("; ") || "Not given" },
    { label: "Usage from", value: s.usage.source },
    { label: "Annual usage", value: kwh(sum(usage)), mono: true },
    ...(bills.length === 12 ? [{ label: "Annual bill without solar", value: formatCents(sum(bills)), mono: true }] : []),
  ]);
  flow.space(6);
  flow.table(
    [
      { label: "Month", width: 160 },
      { label: "Usage", width: 110, align: "right", mono: true },
      { label: bills.length === 12 ? `Bill without solar (${first.figures.assumptions.calendarYear})` : "Bill without solar", width: 180, align: "right", mono: true },
    ],
    [
      ...MONTHS.map((m, i) => ({ cells: [m, kwh(usage[i] ?? 0), bills.length === 12 ? formatCents(bills[i]) : "—"] })),
      { cells: ["Year", kwh(sum(usage)), bills.length === 12 ? formatCents(sum(bills)) : "—"], bold: true },
    ],
  );
  if (planNames.length > 1) {
    flow.paragraph(`The bills above use ${first.figures.assumptions.ratePlanName}; each offer's own rate plan is named with its figures.`, { size: 9, color: COLORS.muted });
  }
}

function offerSystem(flow: Flow, s: ProposalSnapshot, o: ProposalSnapshotOffer): void {
  const { fonts } = flow;
  flow.newPage();
  flow.heading(`Offer ${o.position}: ${o.name}`);
  flow.paragraph("The system", { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const e = o.equipment;
  const f = o.figures.summary;
  const acKw = e.inverter.kind === "micro" ? (e.inverter.acWatts * e.moduleCount) / 1000 : e.inverter.acWatts / 1000;
  flow.facts([
    { label: "Modules", value: `${e.moduleCount} × ${e.module.manufacturer} ${e.module.model} (${int.format(e.module.stcWatts)} W STC)` },
    {
      label: "Inverter",
      value:
        e.inverter.kind === "micro"
          ? `${e.inverter.manufacturer} ${e.inverter.model}, microinverters (${int.format(e.inverter.acWatts)} W AC each)`
          : `${e.inverter.manufacturer} ${e.inverter.model}, string inverter (${int.format(e.inverter.acWatts)} W AC)`,
    },
    { label: "Size", value: `${kw(f.kwDc)} DC${e.inverter.kind === "string" ? ` · ${kw(acKw)} AC` : ""}`, mono: true },
    { label: "Production, year 1", value: kwh(f.annualProductionKwh), mono: true },
    { label: "Share of your usage", value: pct(f.offsetPct, 0), mono: true },
  ]);
  flow.space(4);
  flow.table(
    [
      { label: "Roof face", width: 180 },
      { label: "Tilt", width: 70, align: "right", mono: true },
      { label: "Azimuth", width: 80, align: "right", mono: true },
      { label: "Modules", width: 80, align: "right", mono: true },
      { label: "Solar access", width: 94, align: "right", mono: true },
    ],
    e.faces.map((face) => ({ cells: [face.name, `${face.tiltDeg.toFixed(1)}°`, `${face.azimuthDeg.toFixed(0)}°`, String(face.moduleCount), pct(face.solarAccessPct, 0)] })),
  );
  flow.paragraph("Azimuth in degrees from true north, clockwise (180° faces south).", { size: 8.5, color: COLORS.muted });
  flow.space(4);
  flow.paragraph("Production against your usage, month by month", { font: fonts.sansBold, size: 11, gapAfter: 6 });
  const height = 220;
  flow.ensure(height + 10);
  drawUsageProductionChart(flow.page, { x: MARGIN_X, y: flow.y - height, width: CONTENT_WIDTH, height }, { usageKwh: o.figures.monthly.usageKwh, productionKwh: o.figures.monthly.productionKwh }, fonts);
  flow.y -= height + 14;
  flow.table(
    [
      { label: "", width: 72 },
      ...MONTHS.map((m) => ({ label: m.slice(0, 3), width: 36, align: "right" as const, mono: true })),
    ],
    [
      { cells: ["Usage kWh", ...o.figures.monthly.usageKwh.map((v) => int.format(v))] },
      { cells: ["Solar kWh", ...o.figures.monthly.productionKwh.map((v) => int.format(v))] },
    ],
  );
}

function offerMoney(flow: Flow, o: ProposalSnapshotOffer): void {
  const { fonts } = flow;
  const f = o.figures.summary;
  flow.newPage();
  flow.heading(`Offer ${o.position}: what it costs and saves`);
  flow.table(
    [
      { label: "Price", width: 214 },
      { label: "How", width: 206 },
      { label: "Amount", width: 84, align: "right", mono: true },
    ],
    [
      ...o.figures.price.lines.map((l) => ({ cells: [l.label, l.detail, signedCents(l.amountCents)] })),
      { cells: ["Contract price", "what you sign for", formatCents(f.contractCents)], bold: true },
      ...o.figures.incentives.applied.map((a) => ({ cells: [`${a.name}, paid ${whenPaid(a.year)}`, a.detail, signedCents(-a.amountCents)] })),
      { cells: ["Net cost after incentives", "", formatCents(f.netCostCents)], bold: true },
    ],
  );
  const bills = o.figures.monthly;
  flow.facts([
    { label: "Payment", value: paymentText(o) },
    ...(f.monthlyLoanPaymentCents !== null ? [{ label: "Monthly loan payment", value: formatCents(f.monthlyLoanPaymentCents), mono: true }] : []),
    { label: "Deposit at signing", value: formatCents(o.depositCents), mono: true },
    { label: "Bills, year 1", value: `${formatCents(sum(bills.billWithoutSolarCents))} without solar, ${formatCents(sum(bills.billWithSolarCents))} with solar`, mono: true },
    { label: "Savings, year 1", value: formatCents(f.year1SavingsCents), mono: true },
    { label: "Payback", value: f.paybackYears === null ? `not within ${o.figures.assumptions.years} years` : `${f.paybackYears.toFixed(1)} years`, mono: true },
    { label: "Simple ROI", value: ratioPct(f.simpleRoi), mono: true },
    { label: `Bill savings, ${o.figures.assumptions.years} years`, value: formatCents(f.lifetimeSavingsCents), mono: true },
    { label: `Net gain, ${o.figures.assumptions.years} years`, value: signedCents(f.lifetimeNetCents), mono: true },
    { label: "NPV · IRR", value: `${signedCents(f.npvCents)} at ${pct(o.figures.assumptions.discountRatePct, 1)} · ${f.irr === null && f.irrNote ? "not meaningful" : ratioPct(f.irr)}`, mono: true },
    ...(f.lcoeCentsPerKwh !== null ? [{ label: "Cost per kWh (LCOE)", value: `${f.lcoeCentsPerKwh.toFixed(1)} ¢`, mono: true }] : []),
  ]);
  const meaning = figureDefinitions(o.figures, o.inputs.payment.kind);
  for (const text of [meaning.payback, meaning.roi, meaning.irr]) if (text) flow.paragraph(text, { size: 8.5, color: COLORS.muted });
  flow.paragraph(`Cumulative cash flow over ${o.figures.assumptions.years} years`, { font: fonts.sansBold, size: 11, gapAfter: 6 });
  // Leaves room on the page for the definitions above.
  const height = 180;
  flow.ensure(height + 10);
  drawCashflowChart(flow.page, { x: MARGIN_X, y: flow.y - height, width: CONTENT_WIDTH, height }, { cumulativeCents: o.figures.rows.map((r) => r.cumulativeCents), paybackYears: f.paybackYears }, fonts);
  flow.y -= height + 10;
  flow.paragraph(o.figures.caution || OFFER_CAUTION, { size: 8.5, color: COLORS.muted });
}

function offerTable(flow: Flow, o: ProposalSnapshotOffer): void {
  flow.newPage();
  flow.heading(`Offer ${o.position}: year by year`);
  flow.table(
    [
      { label: "Year", width: 34, align: "right", mono: true },
      { label: "Solar kWh", width: 60, align: "right", mono: true },
      { label: "Bill without", width: 68, align: "right", mono: true },
      { label: "Bill with", width: 62, align: "right", mono: true },
      { label: "Savings", width: 62, align: "right", mono: true },
      { label: "Incentives", width: 62, align: "right", mono: true },
      { label: "System", width: 70, align: "right", mono: true },
      { label: "Cumulative", width: 86, align: "right", mono: true },
    ],
    o.figures.rows.map((r) => ({
      cells: [
        String(r.year),
        r.year === 0 ? "" : int.format(r.productionKwh),
        r.year === 0 ? "" : formatCents(r.billWithoutSolarCents),
        r.year === 0 ? "" : formatCents(r.billWithSolarCents),
        r.year === 0 ? "" : formatCents(r.savingsCents),
        r.incentivesCents ? formatCents(r.incentivesCents) : "",
        r.systemPaymentCents ? signedCents(-r.systemPaymentCents) : "",
        signedCents(r.cumulativeCents),
      ],
    })),
  );
  flow.paragraph("Year 0 is the day of signing. “System” is what you pay for the system that year: the price less upfront incentives for cash, the loan's payments for a loan.", {
    size: 8.5,
    color: COLORS.muted,
  });
}

function assumptions(flow: Flow, s: ProposalSnapshot): void {
  const { fonts } = flow;
  flow.newPage();
  flow.heading("Assumptions and disclosures");
  flow.paragraph("How the figures were made", { font: fonts.sansBold, size: 11, gapAfter: 4 });
  flow.bullets([
    ...s.assumptions,
    `Usage: ${s.usage.source} (${kwh(sum(s.usage.monthlyKwh))} a year).`,
    ...s.offers.map((o) => {
      const a = o.figures.assumptions;
      const simple = figureDefinitions(o.figures, o.inputs.payment.kind).simplePayback;
      return `Offer ${o.position}: rate plan ${a.ratePlanName} with ${a.calendarYear} prices; panel output falls ${pct(a.degradationPctPerYear, 2)} a year; utility prices rise ${pct(a.utilityEscalationPctPerYear, 1)} a year; ${a.years} years; money discounted at ${pct(a.discountRatePct, 1)} a year for NPV.${simple ? ` ${simple}` : ""}`;
    }),
  ]);
  flow.paragraph("Incentives", { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const incentiveLines: string[] = [];
  for (const o of s.offers) {
    const inc = o.figures.incentives;
    const asOf = `as of ${o.figures.asOf}`;
    for (const a of inc.applied) incentiveLines.push(`Offer ${o.position}: ${a.name}, ${formatCents(a.amountCents)} (${a.detail}), paid ${whenPaid(a.year)}; in force ${asOf}.`);
    for (const k of inc.skipped) incentiveLines.push(`Offer ${o.position}: ${k.name} does not apply: ${k.reason}.`);
    if (inc.applied.length === 0 && inc.skipped.length === 0) incentiveLines.push(`Offer ${o.position}: no incentives.`);
  }
  flow.bullets(incentiveLines);
  flow.paragraph(
    "Incentives depend on the program's rules and funds at the time you apply; tax credits depend on your own tax situation. The dates above are the programs' dates as entered in our price book.",
    { size: 9, color: COLORS.muted },
  );
  const notes = [...new Set(s.offers.flatMap((o) => o.figures.notes))];
  if (notes.length > 0) {
    flow.paragraph("Notes on the figures", { font: fonts.sansBold, size: 11, gapAfter: 4 });
    flow.bullets(notes);
  }
  flow.paragraph("Cautions", { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const cautions = [
    ...s.cautions,
    OFFER_CAUTION,
    "Electrical and structural figures (string sizes, voltages, currents, roof loads) are preliminary: the final design is checked by a licensed professional against the local code and the authority having jurisdiction (AHJ), and may change the system.",
    "The utility's approval to connect (interconnection and permission to operate) and the local permit are needed before the system runs.",
  ];
  flow.bullets([...new Set(cautions)]);
}

const RULE_STATEMENT =
  "You, the buyer, may cancel this transaction at any time prior to midnight of the third business day after the date of this transaction. See the attached notice of cancellation form for an explanation of this right.";

function deadlineText(meta: ProposalPdfMeta): string {
  return meta.cancelDeadlineText ?? "three business days after you sign";
}

function rightToCancel(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta): void {
  const { fonts } = flow;
  flow.newPage();
  flow.heading("Your right to cancel");
  flow.paragraph(
    `This proposal was presented to you in your home. Under the U.S. Federal Trade Commission's rule on sales made at home or away from the seller's place of business (16 CFR Part 429), you may cancel the agreement you sign, without any penalty or obligation, until midnight of the third business day after the day you sign.`,
  );
  flow.paragraph(
    `${s.company.name} counts business days as Monday to Friday and leaves out U.S. federal holidays. That never gives you less time than the rule does, which counts Saturdays.`,
  );
  flow.facts(
    [
      {
        label: "Last day to cancel",
        value: meta.cancelDeadlineText
          ? `${deadlineText(meta)}, until midnight`
          : `${deadlineText(meta)}, until midnight (the date is filled in on the signed copy and shown on your proposal page)`,
      },
    ],
    130,
  );
  flow.paragraph("How to cancel", { font: fonts.sansBold, size: 11, gapAfter: 4 });
  flow.bullets([
    `Sign and date one copy of the Notice of Cancellation on the next pages (or write your own notice) and mail or deliver it to ${s.company.name}${meta.sellerAddress ? ` at ${meta.sellerAddress}` : ""}, or e-mail it to ${s.rep.email}, before the deadline.`,
    "Or use “Cancel this agreement” on your proposal page while the window is open; the page shows the deadline and confirms the cancellation.",
    `If you cancel, ${s.company.name} returns every payment you made, including any deposit, within 10 business days of receiving your notice, and cancels any security interest arising from the sale.`,
  ]);
  flow.paragraph(RULE_STATEMENT, { font: fonts.sansBold, size: 10 });
  noticeForm(flow, s, meta, "Copy 1 of 2: keep this copy");
  noticeForm(flow, s, meta, "Copy 2 of 2: sign, date and send this copy to cancel");
}

/**
 * The notice of cancellation in the form 16 CFR 429.1(b) prescribes: captioned "NOTICE OF
 * CANCELLATION", the statements in at least 10-point bold type, with the seller's name and the
 * deadline filled in. The statements are the rule's required wording; the explanation before
 * the form is our own.
 */
function noticeForm(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta, copyLabel: string): void {
  const { fonts } = flow;
  const page = flow.newPage();
  markPage(page, PAGE_ROLE.cancelNotice);
  page.node.set(PDFName.of(DEADLINE_PRINTED_KEY), meta.cancelDeadlineText !== null ? PDFBool.True : PDFBool.False);
  let y = CONTENT_TOP - 16;
  drawLine(page, "NOTICE OF CANCELLATION", PAGE_WIDTH / 2, y, { font: fonts.sansBold, size: 15, align: "center" });
  y -= 16;
  drawLine(page, copyLabel, PAGE_WIDTH / 2, y, { font: fonts.sans, size: 9, color: COLORS.muted, align: "center" });
  for (const [box, label] of [
    [NOTICE_TRANSACTION_DATE_BOX, "Date of transaction"],
    [NOTICE_DEADLINE_BOX, "Last day to cancel (until midnight)"],
  ] as const) {
    drawLine(page, label, MARGIN_X, box.y + 7, { font: fonts.sansBold, size: 10 });
    page.drawLine({ start: { x: box.x, y: box.y + 3 }, end: { x: box.x + box.width, y: box.y + 3 }, thickness: 0.6, color: COLORS.graphite });
  }
  if (meta.cancelDeadlineText) drawLine(page, meta.cancelDeadlineText, NOTICE_DEADLINE_BOX.x + 4, NOTICE_DEADLINE_BOX.y + 7, { font: fonts.sans, size: 10 });

  const seller = `${s.company.name}${meta.sellerAddress ? `, at ${meta.sellerAddress}` : ` (or by e-mail to ${s.rep.email})`}`;
  const statements = [
    "You may CANCEL this transaction, without any Penalty or Obligation, within THREE BUSINESS DAYS from the above date.",
    "If you cancel, any property traded in, any payments made by you under the contract or sale, and any negotiable instrument executed by you will be returned within TEN BUSINESS DAYS following receipt by the seller of your cancellation notice, and any security interest arising out of the transaction will be cancelled.",
    "If you cancel, you must make available to the seller at your residence, in substantially as good condition as when received, any goods delivered to you under this contract or sale, or you may, if you wish, comply with the instructions of the seller regarding the return shipment of the goods at the seller's expense and risk.",
    "If you do make the goods available to the seller and the seller does not pick them up within 20 days of the date of your notice of cancellation, you may retain or dispose of the goods without any further obligation. If you fail to make the goods available to the seller, or if you agree to return the goods to the seller and fail to do so, then you remain liable for performance of all obligations under the contract.",
    `To cancel this transaction, mail or deliver a signed and dated copy of this cancellation notice or any other written notice, or send a telegram, to ${seller}, NOT LATER THAN MIDNIGHT OF ${meta.cancelDeadlineText ?? "the last day to cancel shown above"}.`,
  ];
  y = NOTICE_DEADLINE_BOX.y - 30;
  for (const st of statements) y = drawWrapped(page, st, MARGIN_X, y, CONTENT_WIDTH, { font: fonts.sansBold, size: 10 }) - 6;
  y -= 10;
  drawLine(page, "I HEREBY CANCEL THIS TRANSACTION.", MARGIN_X, y, { font: fonts.sansBold, size: 11 });
  y -= 52;
  page.drawLine({ start: { x: MARGIN_X, y }, end: { x: MARGIN_X + 170, y }, thickness: 0.6, color: COLORS.graphite });
  page.drawLine({ start: { x: 290, y }, end: { x: 290 + 268, y }, thickness: 0.6, color: COLORS.graphite });
  drawLine(page, "(Date)", MARGIN_X, y - 12, { font: fonts.sans, size: 9, color: COLORS.muted });
  drawLine(page, "(Buyer's signature)", 290, y - 12, { font: fonts.sans, size: 9, color: COLORS.muted });
  y -= 40;
  drawWrapped(page, `${s.household.name}, ${s.household.street}, ${s.household.city}, ${s.household.region} ${s.household.postalCode} · ${proposalLabel(meta)}`, MARGIN_X, y, CONTENT_WIDTH, {
    font: fonts.sans,
    size: 8.5,
    color: COLORS.muted,
  });
  flow.y = y - 20;
}

function boxOutline(page: PDFPage, r: { x: number; y: number; width: number; height: number }): void {
  page.drawRectangle({ x: r.x, y: r.y, width: r.width, height: r.height, borderColor: COLORS.graphite, borderWidth: 0.7 });
}

function signaturePage(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta): void {
  const { fonts } = flow;
  const page = flow.newPage();
  markPage(page, PAGE_ROLE.signature);
  flow.heading("Your agreement");
  flow.paragraph(
    `By signing below, I agree to buy the system of the offer named in the box below from ${s.company.name} for its contract price, as described in this proposal (${proposalLabel(meta)}). I have read the assumptions and disclosures and understand that production and savings are estimates.`,
  );
  flow.paragraph(
    `Offers in this proposal: ${s.offers.map((o) => `${o.position}. ${o.name}, ${formatCents(o.figures.summary.contractCents)}`).join("; ")}.`,
    { size: 9.5, color: COLORS.muted },
  );

  boxOutline(page, CHOSEN_OFFER_BOX);
  drawLine(page, "Offer chosen", CHOSEN_OFFER_BOX.x + 8, CHOSEN_OFFER_BOX.y + CHOSEN_OFFER_BOX.height - 13, { font: fonts.sans, size: 8.5, color: COLORS.muted });

  let y = CHOSEN_OFFER_BOX.y - 24;
  if (meta.inHomeSale) {
    // 16 CFR 429.1(a): in the contract, next to the buyer's signature, in bold of at least 10 points.
    y = drawWrapped(page, RULE_STATEMENT, MARGIN_X, y, CONTENT_WIDTH, { font: fonts.sansBold, size: 10 });
  }

  boxOutline(page, SIGNATURE_BOX);
  drawLine(page, "Signature of buyer", SIGNATURE_BOX.x, SIGNATURE_BOX.y - 11, { font: fonts.sans, size: 8.5, color: COLORS.muted });
  page.drawLine({ start: { x: SIGNER_NAME_BOX.x, y: SIGNER_NAME_BOX.y }, end: { x: SIGNER_NAME_BOX.x + SIGNER_NAME_BOX.width, y: SIGNER_NAME_BOX.y }, thickness: 0.7, color: COLORS.graphite });
  drawLine(page, "Name of buyer", SIGNER_NAME_BOX.x, SIGNER_NAME_BOX.y - 11, { font: fonts.sans, size: 8.5, color: COLORS.muted });
  page.drawLine({ start: { x: SIGNED_DATE_BOX.x, y: SIGNED_DATE_BOX.y }, end: { x: SIGNED_DATE_BOX.x + SIGNED_DATE_BOX.width, y: SIGNED_DATE_BOX.y }, thickness: 0.7, color: COLORS.graphite });
  drawLine(page, "Date signed", SIGNED_DATE_BOX.x, SIGNED_DATE_BOX.y - 11, { font: fonts.sans, size: 8.5, color: COLORS.muted });

  const sideX = SIGNED_DATE_BOX.x;
  let sy = SIGNATURE_BOX.y + SIGNATURE_BOX.height - 10;
  drawLine(page, "Seller", sideX, sy, { font: fonts.sans, size: 8.5, color: COLORS.muted });
  sy -= 15;
  drawLine(page, s.company.name, sideX, sy, { font: fonts.sansBold, size: 10 });
  sy -= 14;
  const lic = licenseText(s.company.licenseNumber);
  if (lic) {
    drawLine(page, lic, sideX, sy, { font: fonts.sans, size: 9 });
    sy -= 14;
  }
  drawLine(page, `Sales representative: ${s.rep.name}`, sideX, sy, { font: fonts.sans, size: 9 });
  sy -= 14;
  drawLine(page, s.rep.email, sideX, sy, { font: fonts.sans, size: 9, color: COLORS.muted });

  drawWrapped(
    page,
    "Signed electronically on the proposal page after confirming the buyer's e-mail address; the signed copy carries a signing certificate after this page. Keep a copy for your records.",
    MARGIN_X,
    SIGNER_NAME_BOX.y - 40,
    CONTENT_WIDTH,
    { font: fonts.sans, size: 8.5, color: COLORS.muted },
  );
  void y;
}

/** Renders the proposal PDF. Same input, same bytes. */
export async function renderProposalPdf(snapshot: ProposalSnapshot, meta: ProposalPdfMeta): Promise<Uint8Array> {
  if (snapshot.offers.length === 0) throw new Error("A proposal needs at least one offer");
  const pdf = await PDFDocument.create({ updateMetadata: false });
  const fonts: DocFonts = await embedFonts(pdf);
  const flow = createFlow(pdf, fonts);

  cover(flow, snapshot, meta);
  energyToday(flow, snapshot);
  for (const o of snapshot.offers) {
    offerSystem(flow, snapshot, o);
    offerMoney(flow, o);
    offerTable(flow, o);
  }
  assumptions(flow, snapshot);
  if (meta.inHomeSale) rightToCancel(flow, snapshot, meta);
  signaturePage(flow, snapshot, meta);

  const frame: FrameInfo = { companyName: snapshot.company.name, licenseNumber: snapshot.company.licenseNumber, documentLabel: `${proposalLabel(meta)} · ${snapshot.household.name}` };
  drawPageFrames(pdf, fonts, frame);
  storeFrame(pdf, frame);
  setFixedMetadata(pdf, {
    title: `Solar proposal ${meta.number}-${meta.version} for ${snapshot.household.name}`,
    subject: `${snapshot.offers.length} offer${snapshot.offers.length === 1 ? "" : "s"} from ${snapshot.company.name}`,
    author: snapshot.company.name,
    date: meta.sentAt,
  });
  pdf.setLanguage("en-US");
  compressContentStreams(pdf);
  return pdf.save(SAVE_OPTIONS);
}
