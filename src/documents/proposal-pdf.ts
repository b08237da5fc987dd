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
import { INTL_LOCALE, type Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { figureDefinitions } from "@/lib/figure-definitions";
import { OFFER_CAUTION } from "@/lib/offer-figures";
import type { ProposalSnapshot, ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import { msg, snapshotText, snapshotTexts } from "@/lib/snapshot-text";
import { drawCashflowChart, drawUsageProductionChart, type ChartLabels } from "./charts";
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
  /** The household's language; English when not given. */
  locale?: Locale;
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

// Numbers keep US grouping in both languages ("12,345"; es-US writes them the same way).
const int = new Intl.NumberFormat("en-US", { maximumFractionDigits: 0 });
const kwh = (v: number) => `${int.format(v)} kWh`;
const pct = (v: number, digits = 1) => `${v < 0 ? "−" : ""}${Math.abs(v).toFixed(digits)} %`;
const ratioPct = (r: number | null, digits = 1) => (r === null ? "—" : pct(r * 100, digits));
const kw = (v: number) => `${v.toFixed(2)} kW`;
const sum = (xs: readonly number[]) => xs.reduce((a, b) => a + b, 0);

/** The document's language: its messages, money and month names. */
type Lang = { locale: Locale; t: ReturnType<typeof translator<"pdf">>; money: (c: number) => string; signed: (c: number) => string; months: string[] };
const langs = new Map<Locale, Lang>();
function pdfLang(locale: Locale = "en"): Lang {
  let l = langs.get(locale);
  if (!l) {
    const money = (c: number) => formatCents(c, locale);
    const monthName = new Intl.DateTimeFormat(INTL_LOCALE[locale], { month: "long", timeZone: "UTC" });
    // Spanish month names are written in lower case; a table's first column starts with a capital.
    const months = Array.from({ length: 12 }, (_, m) => monthName.format(Date.UTC(2026, m, 15))).map((n) => n.charAt(0).toLocaleUpperCase(INTL_LOCALE[locale]) + n.slice(1));
    langs.set(locale, (l = { locale, t: translator(locale, "pdf"), money, signed: (c) => (c < 0 ? `−${money(-c)}` : money(c)), months }));
  }
  return l;
}

/** "Proposal P-1042 v2": the same number and version the customer's page and e-mails show. */
export function proposalLabel(meta: Pick<ProposalPdfMeta, "number" | "version" | "locale">): string {
  return pdfLang(meta.locale).t("frame.proposalLabel", { label: shortProposalLabel(meta.number, meta.version) });
}

function paymentText(o: ProposalSnapshotOffer, { t }: Lang): string {
  const p = o.inputs.payment;
  if (p.kind === "cash") return t("money.cash");
  const loan = { apr: pct(p.aprPct, 2), months: p.termMonths };
  return p.dealerFeePct > 0 ? t("money.loanWithFee", { ...loan, fee: pct(p.dealerFeePct, 2) }) : t("money.loan", loan);
}

/** "25 years", or "20 to 25 years" when the offers were figured over different periods. */
function savingsYears(offers: readonly ProposalSnapshotOffer[], { t }: Lang): string {
  const ys = offers.map((o) => o.figures.assumptions.years);
  const lo = Math.min(...ys);
  const hi = Math.max(...ys);
  return lo === hi ? t("frame.years", { n: lo }) : t("frame.yearsRange", { lo, hi });
}

const chartLabels = ({ t, months }: Lang): ChartLabels => ({
  usage: t("chart.usage"),
  production: t("chart.production"),
  year: t("chart.year"),
  months: months.map((m) => m.slice(0, 3)),
  paybackAt: (years) => t("chart.paybackAt", { years }),
  notPaidBack: t("chart.notPaidBack"),
  paidBack: t("chart.paidBack"),
});

/** Where the usage came from, in the reader's words (the snapshot stores a code). */
const usageSource = (source: string, { t }: Lang) => (source === "bills" || source === "interval" || source === "none" ? t(`assumptions.usageSource.${source}`) : source);
const whenPaid = (year: number, { t }: Lang) => (year === 0 ? t("frame.atSigning") : t("frame.inYear", { year }));

// ── Pages ──────────────────────────────────────────────────────────────────────────────────

function cover(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta): void {
  const { page, fonts } = flow;
  const L = pdfLang(meta.locale);
  const { t, money } = L;
  let y = CONTENT_TOP - 30;
  page.drawRectangle({ x: MARGIN_X, y, width: 56, height: 4, color: COLORS.copper });
  y -= 34;
  drawLine(page, t("cover.title"), MARGIN_X, y, { font: fonts.sansBold, size: 28 });
  y -= 26;
  drawLine(page, t("cover.for", { household: s.household.name }), MARGIN_X, y, { font: fonts.sans, size: 16 });
  y -= 20;
  drawLine(page, `${s.household.street}, ${s.household.city}, ${s.household.region} ${s.household.postalCode}`, MARGIN_X, y, { font: fonts.sans, size: 11, color: COLORS.muted });
  y -= 44;
  flow.y = y;
  flow.facts(
    [
      { label: t("cover.proposal"), value: `${meta.number}-${meta.version}`, mono: true },
      { label: t("cover.preparedFor"), value: [s.household.contactName, s.household.email].filter(Boolean).join(" · ") || s.household.name },
      { label: t("cover.preparedBy"), value: `${s.rep.name} (${s.rep.email}), ${s.company.name}` },
      { label: t("cover.date"), value: formatDate(meta.sentAt, meta.timeZone, L.locale) },
      { label: t("cover.validUntil"), value: formatDate(meta.expiresAt, meta.timeZone, L.locale) },
      ...(s.company.licenseNumber ? [{ label: t("cover.license"), value: s.company.licenseNumber }] : []),
    ],
    130,
  );
  flow.space(14);
  flow.heading(t("cover.glance", { count: s.offers.length }), 13);
  flow.space(6);
  const cols: TableColumn[] = [
    { label: t("cover.colOffer"), width: 150 },
    { label: t("cover.colSystem"), width: 62, align: "right", mono: true },
    { label: t("cover.colContract"), width: 82, align: "right", mono: true },
    { label: t("cover.colNet"), width: 76, align: "right", mono: true },
    { label: t("cover.colYear1"), width: 76, align: "right", mono: true },
    { label: t("cover.colPayback"), width: 58, align: "right", mono: true },
  ];
  flow.table(
    cols,
    s.offers.map((o) => ({
      cells: [
        `${o.position}. ${o.name}`,
        kw(o.figures.summary.kwDc),
        money(o.figures.summary.contractCents),
        money(o.figures.summary.netCostCents),
        money(o.figures.summary.year1SavingsCents),
        o.figures.summary.paybackYears === null ? "—" : t("cover.yearsShort", { years: o.figures.summary.paybackYears.toFixed(1) }),
      ],
    })),
  );
  flow.paragraph(t(meta.inHomeSale ? "cover.insideWithCancel" : "cover.inside", { years: savingsYears(s.offers, L) }), { size: 9.5, color: COLORS.muted });
}

function energyToday(flow: Flow, s: ProposalSnapshot, L: Lang): void {
  const { t, money, months } = L;
  flow.newPage();
  flow.heading(t("energy.heading"));
  const first = s.offers[0];
  const usage = s.usage.monthlyKwh;
  const bills = first?.figures.monthly.billWithoutSolarCents ?? [];
  const planNames = [...new Set(s.offers.map((o) => o.figures.assumptions.ratePlanName))];
  flow.facts([
    { label: t("energy.utility"), value: s.utilityName ?? t("energy.notGiven") },
    { label: t("energy.ratePlan"), value: planNames.join("; ") || t("energy.notGiven") },
    { label: t("energy.usageFrom"), value: usageSource(s.usage.source, L) },
    { label: t("energy.annualUsage"), value: kwh(sum(usage)), mono: true },
    ...(bills.length === 12 ? [{ label: t("energy.annualBill"), value: money(sum(bills)), mono: true }] : []),
  ]);
  flow.space(6);
  flow.table(
    [
      { label: t("energy.month"), width: 160 },
      { label: t("energy.usage"), width: 110, align: "right", mono: true },
      { label: bills.length === 12 ? t("energy.billWithoutYear", { year: first.figures.assumptions.calendarYear }) : t("energy.billWithout"), width: 180, align: "right", mono: true },
    ],
    [
      ...months.map((m, i) => ({ cells: [m, kwh(usage[i] ?? 0), bills.length === 12 ? money(bills[i]) : "—"] })),
      { cells: [t("energy.year"), kwh(sum(usage)), bills.length === 12 ? money(sum(bills)) : "—"], bold: true },
    ],
  );
  if (planNames.length > 1) {
    flow.paragraph(t("energy.otherPlans", { plan: first.figures.assumptions.ratePlanName }), { size: 9, color: COLORS.muted });
  }
}

function offerSystem(flow: Flow, o: ProposalSnapshotOffer, L: Lang): void {
  const { fonts } = flow;
  const { t } = L;
  flow.newPage();
  flow.heading(t("frame.offerHeading", { n: o.position, name: o.name }));
  flow.paragraph(t("system.theSystem"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const e = o.equipment;
  const f = o.figures.summary;
  const acKw = e.inverter.kind === "micro" ? (e.inverter.acWatts * e.moduleCount) / 1000 : e.inverter.acWatts / 1000;
  flow.facts([
    { label: t("system.modules"), value: t("system.modulesValue", { count: e.moduleCount, make: e.module.manufacturer, model: e.module.model, watts: int.format(e.module.stcWatts) }) },
    {
      label: t("system.inverter"),
      value: t(e.inverter.kind === "micro" ? "system.micro" : "system.string", { make: e.inverter.manufacturer, model: e.inverter.model, watts: int.format(e.inverter.acWatts) }),
    },
    { label: t("system.size"), value: e.inverter.kind === "string" ? t("system.sizeDcAc", { dc: kw(f.kwDc), ac: kw(acKw) }) : t("system.sizeDc", { dc: kw(f.kwDc) }), mono: true },
    { label: t("system.production"), value: kwh(f.annualProductionKwh), mono: true },
    { label: t("system.share"), value: pct(f.offsetPct, 0), mono: true },
  ]);
  flow.space(4);
  flow.table(
    [
      { label: t("system.face"), width: 180 },
      { label: t("system.tilt"), width: 70, align: "right", mono: true },
      { label: t("system.azimuth"), width: 80, align: "right", mono: true },
      { label: t("system.modules"), width: 80, align: "right", mono: true },
      { label: t("system.solarAccess"), width: 94, align: "right", mono: true },
    ],
    e.faces.map((face) => ({ cells: [face.name, `${face.tiltDeg.toFixed(1)}°`, `${face.azimuthDeg.toFixed(0)}°`, String(face.moduleCount), pct(face.solarAccessPct, 0)] })),
  );
  flow.paragraph(t("system.azimuthNote"), { size: 8.5, color: COLORS.muted });
  flow.space(4);
  flow.paragraph(t("system.chartTitle"), { font: fonts.sansBold, size: 11, gapAfter: 6 });
  const height = 220;
  flow.ensure(height + 10);
  drawUsageProductionChart(flow.page, { x: MARGIN_X, y: flow.y - height, width: CONTENT_WIDTH, height }, { usageKwh: o.figures.monthly.usageKwh, productionKwh: o.figures.monthly.productionKwh }, fonts, chartLabels(L));
  flow.y -= height + 14;
  flow.table(
    [
      { label: "", width: 72 },
      ...L.months.map((m) => ({ label: m.slice(0, 3), width: 36, align: "right" as const, mono: true })),
    ],
    [
      { cells: [t("system.usageKwh"), ...o.figures.monthly.usageKwh.map((v) => int.format(v))] },
      { cells: [t("system.solarKwh"), ...o.figures.monthly.productionKwh.map((v) => int.format(v))] },
    ],
  );
}

/** What a price or incentive line costs, with its words; `texts` is the offer's stored messages (absent on older snapshots). */
function offerMoney(flow: Flow, o: ProposalSnapshotOffer, L: Lang, texts: NonNullable<ProposalSnapshot["texts"]>["offers"][number] | undefined): void {
  const { fonts } = flow;
  const { t, money, signed } = L;
  const f = o.figures.summary;
  const years = o.figures.assumptions.years;
  flow.newPage();
  flow.heading(t("money.heading", { n: o.position }));
  flow.table(
    [
      { label: t("money.price"), width: 214 },
      { label: t("money.how"), width: 206 },
      { label: t("money.amount"), width: 84, align: "right", mono: true },
    ],
    [
      ...o.figures.price.lines.map((l, i) => {
        // A new snapshot words our part of each line in the reader's language; a price-book name stays as typed.
        const own = texts?.priceLines[i];
        return { cells: own ? [snapshotText(own.label, L.locale), snapshotText(own.detail, L.locale), signed(l.amountCents)] : [l.label, l.detail, signed(l.amountCents)] };
      }),
      { cells: [t("money.contractPrice"), t("money.whatYouSign"), money(f.contractCents)], bold: true },
      ...o.figures.incentives.applied.map((a, i) => {
        const how = texts?.applied[i];
        return { cells: [t("money.incentivePaid", { name: a.name, when: whenPaid(a.year, L) }), how === undefined ? a.detail : snapshotText(how, L.locale), signed(-a.amountCents)] };
      }),
      { cells: [t("money.netCost"), "", money(f.netCostCents)], bold: true },
    ],
  );
  const bills = o.figures.monthly;
  flow.facts([
    { label: t("money.payment"), value: paymentText(o, L) },
    ...(f.monthlyLoanPaymentCents !== null ? [{ label: t("money.monthlyLoan"), value: money(f.monthlyLoanPaymentCents), mono: true }] : []),
    { label: t("money.deposit"), value: money(o.depositCents), mono: true },
    { label: t("money.bills"), value: t("money.billsValue", { without: money(sum(bills.billWithoutSolarCents)), with: money(sum(bills.billWithSolarCents)) }), mono: true },
    { label: t("money.savings1"), value: money(f.year1SavingsCents), mono: true },
    { label: t("money.payback"), value: f.paybackYears === null ? t("money.paybackNot", { years }) : t("frame.years", { n: f.paybackYears.toFixed(1) }), mono: true },
    { label: t("money.roi"), value: ratioPct(f.simpleRoi), mono: true },
    { label: t("money.billSavings", { years }), value: money(f.lifetimeSavingsCents), mono: true },
    { label: t("money.netGain", { years }), value: signed(f.lifetimeNetCents), mono: true },
    {
      label: t("money.npv"),
      value: t("money.npvValue", { npv: signed(f.npvCents), rate: pct(o.figures.assumptions.discountRatePct, 1), irr: f.irr === null && f.irrNote ? t("money.notMeaningful") : ratioPct(f.irr) }),
      mono: true,
    },
    ...(f.lcoeCentsPerKwh !== null ? [{ label: t("money.lcoe"), value: `${f.lcoeCentsPerKwh.toFixed(1)} ¢`, mono: true }] : []),
  ]);
  const meaning = figureDefinitions(o.figures, o.inputs.payment.kind, L.locale);
  for (const text of [meaning.payback, meaning.roi, meaning.irr]) if (text) flow.paragraph(text, { size: 8.5, color: COLORS.muted });
  flow.paragraph(t("money.cashflowTitle", { years }), { font: fonts.sansBold, size: 11, gapAfter: 6 });
  // Leaves room on the page for the definitions above.
  const height = 180;
  flow.ensure(height + 10);
  drawCashflowChart(flow.page, { x: MARGIN_X, y: flow.y - height, width: CONTENT_WIDTH, height }, { cumulativeCents: o.figures.rows.map((r) => r.cumulativeCents), paybackYears: f.paybackYears }, fonts, chartLabels(L));
  flow.y -= height + 10;
  flow.paragraph(texts ? snapshotText(msg("caution.offer"), L.locale) : o.figures.caution || OFFER_CAUTION, { size: 8.5, color: COLORS.muted });
}

function offerTable(flow: Flow, o: ProposalSnapshotOffer, { t, money, signed }: Lang): void {
  flow.newPage();
  flow.heading(t("table.heading", { n: o.position }));
  flow.table(
    [
      { label: t("table.year"), width: 34, align: "right", mono: true },
      { label: t("table.solarKwh"), width: 60, align: "right", mono: true },
      { label: t("table.billWithout"), width: 68, align: "right", mono: true },
      { label: t("table.billWith"), width: 62, align: "right", mono: true },
      { label: t("table.savings"), width: 62, align: "right", mono: true },
      { label: t("table.incentives"), width: 62, align: "right", mono: true },
      { label: t("table.system"), width: 70, align: "right", mono: true },
      { label: t("table.cumulative"), width: 86, align: "right", mono: true },
    ],
    o.figures.rows.map((r) => ({
      cells: [
        String(r.year),
        r.year === 0 ? "" : int.format(r.productionKwh),
        r.year === 0 ? "" : money(r.billWithoutSolarCents),
        r.year === 0 ? "" : money(r.billWithSolarCents),
        r.year === 0 ? "" : money(r.savingsCents),
        r.incentivesCents ? money(r.incentivesCents) : "",
        r.systemPaymentCents ? signed(-r.systemPaymentCents) : "",
        signed(r.cumulativeCents),
      ],
    })),
  );
  flow.paragraph(t("table.note"), {
    size: 8.5,
    color: COLORS.muted,
  });
}

function assumptions(flow: Flow, s: ProposalSnapshot, L: Lang): void {
  const { fonts } = flow;
  const { t, money } = L;
  flow.newPage();
  flow.heading(t("assumptions.heading"));
  flow.paragraph(t("assumptions.how"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const texts = s.texts;
  flow.bullets([
    ...(texts ? snapshotTexts(texts.assumptions, L.locale) : s.assumptions),
    t("assumptions.usage", { source: usageSource(s.usage.source, L), kwh: kwh(sum(s.usage.monthlyKwh)) }),
    ...s.offers.map((o) => {
      const a = o.figures.assumptions;
      const simple = figureDefinitions(o.figures, o.inputs.payment.kind, L.locale).simplePayback;
      const line = t("assumptions.offer", {
        n: o.position,
        plan: a.ratePlanName,
        year: a.calendarYear,
        degradation: pct(a.degradationPctPerYear, 2),
        escalation: pct(a.utilityEscalationPctPerYear, 1),
        years: a.years,
        discount: pct(a.discountRatePct, 1),
      });
      return simple ? `${line} ${simple}` : line;
    }),
  ]);
  flow.paragraph(t("assumptions.incentives"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const incentiveLines: string[] = [];
  for (const o of s.offers) {
    const inc = o.figures.incentives;
    const n = o.position;
    // A new snapshot words the details and reasons in the reader's language; an older one has the engine's English.
    const own = texts?.offers.find((x) => x.position === n);
    const detail = (i: number, english: string) => (own?.applied[i] !== undefined ? snapshotText(own.applied[i], L.locale) : english);
    const reason = (i: number, english: string) => (own?.skipped[i] !== undefined ? snapshotText(own.skipped[i], L.locale) : english);
    inc.applied.forEach((a, i) =>
      incentiveLines.push(t("assumptions.applied", { n, name: a.name, amount: money(a.amountCents), detail: detail(i, a.detail), when: whenPaid(a.year, L), asOf: o.figures.asOf })),
    );
    inc.skipped.forEach((k, i) => incentiveLines.push(t("assumptions.skipped", { n, name: k.name, reason: reason(i, k.reason) })));
    if (inc.applied.length === 0 && inc.skipped.length === 0) incentiveLines.push(t("assumptions.none", { n }));
  }
  flow.bullets(incentiveLines);
  flow.paragraph(t("assumptions.incentivesNote"), { size: 9, color: COLORS.muted });
  const notes = texts ? snapshotTexts(texts.notes, L.locale) : [...new Set(s.offers.flatMap((o) => o.figures.notes))];
  if (notes.length > 0) {
    flow.paragraph(t("assumptions.notes"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
    flow.bullets(notes);
  }
  flow.paragraph(t("assumptions.cautions"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  const cautions = texts
    ? [...snapshotTexts(texts.cautions, L.locale), t("assumptions.cautionDesign"), t("assumptions.cautionUtility")]
    : [...s.cautions, OFFER_CAUTION, t("assumptions.cautionDesign"), t("assumptions.cautionUtility")];
  flow.bullets([...new Set(cautions)]);
}

/**
 * The right to cancel in the document's language. 16 CFR 429.1 asks for the contract and the
 * notice in the language of the sales presentation; a Spanish document says its legal text is a
 * translation and prints the English text after it (our choice: the English text prevails).
 */
function rightToCancel(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta): void {
  const L = pdfLang(meta.locale);
  cancelSection(flow, s, meta, L);
  if (L.locale !== "en") {
    flow.paragraph(translator(L.locale, "legal")("translationNotice"), { font: flow.fonts.sansBold, size: 10 });
    flow.paragraph(L.t("cancel.englishFollows"), { size: 10 });
    cancelSection(flow, s, meta, pdfLang("en"));
  }
}

function cancelSection(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta, L: Lang): void {
  const { fonts } = flow;
  const { t } = L;
  flow.newPage();
  flow.heading(t("cancel.heading"));
  if (L.locale !== "en") flow.paragraph(translator(L.locale, "legal")("translationNotice"), { font: fonts.sansBold, size: 9.5, color: COLORS.copper });
  flow.paragraph(t("cancel.intro"));
  flow.paragraph(t("cancel.businessDays", { company: s.company.name }));
  const deadline = meta.cancelDeadlineText ?? t("cancel.deadlineFallback");
  flow.facts([{ label: t("cancel.lastDay"), value: t(meta.cancelDeadlineText ? "cancel.deadlineValue" : "cancel.deadlineValuePending", { deadline }) }], 130);
  flow.paragraph(t("cancel.howTo"), { font: fonts.sansBold, size: 11, gapAfter: 4 });
  flow.bullets([
    meta.sellerAddress
      ? t("cancel.howMailAddress", { company: s.company.name, address: meta.sellerAddress, email: s.rep.email })
      : t("cancel.howMail", { company: s.company.name, email: s.rep.email }),
    t("cancel.howPage"),
    t("cancel.refund", { company: s.company.name }),
  ]);
  flow.paragraph(t("cancel.ruleStatement"), { font: fonts.sansBold, size: 10 });
  noticeForm(flow, s, meta, L, t("cancel.copy1"));
  noticeForm(flow, s, meta, L, t("cancel.copy2"));
}

/**
 * The notice of cancellation in the form 16 CFR 429.1(b) prescribes: captioned "NOTICE OF
 * CANCELLATION", the statements in at least 10-point bold type, with the seller's name and the
 * deadline filled in. The statements are the rule's required wording; the explanation before
 * the form is our own.
 */
function noticeForm(flow: Flow, s: ProposalSnapshot, meta: ProposalPdfMeta, L: Lang, copyLabel: string): void {
  const { fonts } = flow;
  const { t } = L;
  const page = flow.newPage();
  markPage(page, PAGE_ROLE.cancelNotice);
  page.node.set(PDFName.of(DEADLINE_PRINTED_KEY), meta.cancelDeadlineText !== null ? PDFBool.True : PDFBool.False);
  let y = CONTENT_TOP - 16;
  drawLine(page, t("cancel.noticeTitle"), PAGE_WIDTH / 2, y, { font: fonts.sansBold, size: 15, align: "center" });
  y -= 16;
  drawLine(page, copyLabel, PAGE_WIDTH / 2, y, { font: fonts.sans, size: 9, color: COLORS.muted, align: "center" });
  for (const [box, label] of [
    [NOTICE_TRANSACTION_DATE_BOX, t("cancel.transactionDate")],
    [NOTICE_DEADLINE_BOX, t("cancel.lastDayMidnight")],
  ] as const) {
    drawLine(page, label, MARGIN_X, box.y + 7, { font: fonts.sansBold, size: 10 });
    page.drawLine({ start: { x: box.x, y: box.y + 3 }, end: { x: box.x + box.width, y: box.y + 3 }, thickness: 0.6, color: COLORS.graphite });
  }
  if (meta.cancelDeadlineText) drawLine(page, meta.cancelDeadlineText, NOTICE_DEADLINE_BOX.x + 4, NOTICE_DEADLINE_BOX.y + 7, { font: fonts.sans, size: 10 });

  const seller = meta.sellerAddress ? t("cancel.sellerAddress", { company: s.company.name, address: meta.sellerAddress }) : t("cancel.sellerEmail", { company: s.company.name, email: s.rep.email });
  const statements = [
    t("cancel.s1"),
    t("cancel.s2"),
    t("cancel.s3"),
    t("cancel.s4"),
    t("cancel.s5", { seller, deadline: meta.cancelDeadlineText ?? t("cancel.deadlineShownAbove") }),
  ];
  y = NOTICE_DEADLINE_BOX.y - 30;
  for (const st of statements) y = drawWrapped(page, st, MARGIN_X, y, CONTENT_WIDTH, { font: fonts.sansBold, size: 10 }) - 6;
  y -= 10;
  drawLine(page, t("cancel.iCancel"), MARGIN_X, y, { font: fonts.sansBold, size: 11 });
  y -= 52;
  page.drawLine({ start: { x: MARGIN_X, y }, end: { x: MARGIN_X + 170, y }, thickness: 0.6, color: COLORS.graphite });
  page.drawLine({ start: { x: 290, y }, end: { x: 290 + 268, y }, thickness: 0.6, color: COLORS.graphite });
  drawLine(page, t("cancel.date"), MARGIN_X, y - 12, { font: fonts.sans, size: 9, color: COLORS.muted });
  drawLine(page, t("cancel.buyerSignature"), 290, y - 12, { font: fonts.sans, size: 9, color: COLORS.muted });
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
  const { t, money } = pdfLang(meta.locale);
  const page = flow.newPage();
  markPage(page, PAGE_ROLE.signature);
  flow.heading(t("signature.heading"));
  flow.paragraph(t("signature.agree", { company: s.company.name, label: proposalLabel(meta) }));
  flow.paragraph(t("signature.offers", { list: s.offers.map((o) => `${o.position}. ${o.name}, ${money(o.figures.summary.contractCents)}`).join("; ") }), { size: 9.5, color: COLORS.muted });

  boxOutline(page, CHOSEN_OFFER_BOX);
  drawLine(page, t("signature.offerChosen"), CHOSEN_OFFER_BOX.x + 8, CHOSEN_OFFER_BOX.y + CHOSEN_OFFER_BOX.height - 13, { font: fonts.sans, size: 8.5, color: COLORS.muted });

  let y = CHOSEN_OFFER_BOX.y - 24;
  if (meta.inHomeSale) {
    // 16 CFR 429.1(a): in the contract, next to the buyer's signature, in bold of at least 10 points.
    y = drawWrapped(page, t("cancel.ruleStatement"), MARGIN_X, y, CONTENT_WIDTH, { font: fonts.sansBold, size: 10 });
  }

  boxOutline(page, SIGNATURE_BOX);
  drawLine(page, t("signature.buyerSignature"), SIGNATURE_BOX.x, SIGNATURE_BOX.y - 11, { font: fonts.sans, size: 8.5, color: COLORS.muted });
  page.drawLine({ start: { x: SIGNER_NAME_BOX.x, y: SIGNER_NAME_BOX.y }, end: { x: SIGNER_NAME_BOX.x + SIGNER_NAME_BOX.width, y: SIGNER_NAME_BOX.y }, thickness: 0.7, color: COLORS.graphite });
  drawLine(page, t("signature.buyerName"), SIGNER_NAME_BOX.x, SIGNER_NAME_BOX.y - 11, { font: fonts.sans, size: 8.5, color: COLORS.muted });
  page.drawLine({ start: { x: SIGNED_DATE_BOX.x, y: SIGNED_DATE_BOX.y }, end: { x: SIGNED_DATE_BOX.x + SIGNED_DATE_BOX.width, y: SIGNED_DATE_BOX.y }, thickness: 0.7, color: COLORS.graphite });
  drawLine(page, t("signature.dateSigned"), SIGNED_DATE_BOX.x, SIGNED_DATE_BOX.y - 11, { font: fonts.sans, size: 8.5, color: COLORS.muted });

  const sideX = SIGNED_DATE_BOX.x;
  let sy = SIGNATURE_BOX.y + SIGNATURE_BOX.height - 10;
  drawLine(page, t("signature.seller"), sideX, sy, { font: fonts.sans, size: 8.5, color: COLORS.muted });
  sy -= 15;
  drawLine(page, s.company.name, sideX, sy, { font: fonts.sansBold, size: 10 });
  sy -= 14;
  const lic = licenseText(s.company.licenseNumber, meta.locale);
  if (lic) {
    drawLine(page, lic, sideX, sy, { font: fonts.sans, size: 9 });
    sy -= 14;
  }
  drawLine(page, t("signature.rep", { name: s.rep.name }), sideX, sy, { font: fonts.sans, size: 9 });
  sy -= 14;
  drawLine(page, s.rep.email, sideX, sy, { font: fonts.sans, size: 9, color: COLORS.muted });

  drawWrapped(
    page,
    t("signature.esignNote"),
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
  const L = pdfLang(meta.locale);

  cover(flow, snapshot, meta);
  energyToday(flow, snapshot, L);
  for (const o of snapshot.offers) {
    offerSystem(flow, o, L);
    offerMoney(flow, o, L, snapshot.texts?.offers.find((x) => x.position === o.position));
    offerTable(flow, o, L);
  }
  assumptions(flow, snapshot, L);
  if (meta.inHomeSale) rightToCancel(flow, snapshot, meta);
  signaturePage(flow, snapshot, meta);

  const frame: FrameInfo = { companyName: snapshot.company.name, licenseNumber: snapshot.company.licenseNumber, documentLabel: `${proposalLabel(meta)} · ${snapshot.household.name}` };
  drawPageFrames(pdf, fonts, frame, { locale: L.locale });
  storeFrame(pdf, frame);
  setFixedMetadata(pdf, {
    title: L.t("frame.title", { number: meta.number, version: meta.version, household: snapshot.household.name }),
    subject: L.t("frame.subject", { count: snapshot.offers.length, company: snapshot.company.name }),
    author: snapshot.company.name,
    date: meta.sentAt,
  });
  pdf.setLanguage(INTL_LOCALE[L.locale]);
  compressContentStreams(pdf);
  return pdf.save(SAVE_OPTIONS);
}
