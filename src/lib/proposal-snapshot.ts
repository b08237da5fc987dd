// Freezing offers into a proposal: the pure part, shared by the server (src/server/proposals/)
// and the demo seed (scripts/lib/seed/proposals.ts). It copies every figure and turns the
// assumptions behind them into sentences, so the customer's page and the PDF read only the
// snapshot, never the live offers, catalog or price book. Also: the states a proposal link can
// be in, and the right-to-cancel window. No server or browser imports.
import { formatCalendarDate } from "@/lib/format";
import { formatAprPct, plainAssumption } from "@/lib/plain-words";
import { addDaysToDate, startOfDayInZone } from "@/lib/zoned-time";
import { OFFER_CAUTION, STRING_CAUTION, type OfferFigures } from "@/lib/offer-figures";
import { depositFor } from "@/lib/pricing";
import type { OfferInputs } from "@/lib/schemas/offer";
import type { PriceBook } from "@/lib/schemas/price-book";
import type { ProposalSnapshot, ProposalSnapshotOffer } from "@/lib/schemas/proposal";

/** Proposal numbers of a company start here (then go up by one per deal). */
export const FIRST_PROPOSAL_NUMBER = 1001;

export const proposalLabel = (number: number, version: number) => `P-${number} v${version}`;

export type SnapshotFace = { id: string; name: string; tiltDeg: number; azimuthDeg: number; solarAccessPct: number | number[]; moduleCount: number };

export type SnapshotSource = {
  takenAt: Date;
  company: ProposalSnapshot["company"];
  rep: ProposalSnapshot["rep"];
  household: ProposalSnapshot["household"];
  utilityName: string | null;
  usage: {
    monthlyKwh: number[];
    source: "bills" | "interval" | "none";
    /** How many of the 12 months were estimated (filled) rather than billed. */
    estimatedMonths: number;
    fillMethod: string;
  };
  design: { lossesPct: number; faces: SnapshotFace[] };
  /** The offers, in the order they appear (position 1–3). */
  offers: {
    position: number;
    name: string;
    inputs: OfferInputs;
    figures: OfferFigures;
    module: { manufacturer: string; model: string; stcWatts: number };
    inverter: { manufacturer: string; model: string; kind: "string" | "micro"; acWatts: number };
  }[];
  /** The price book at the time of sending: its deposit policy and incentive dates. */
  book: PriceBook;
};

const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);
const round1 = (x: number) => Math.round(x * 10) / 10;

const INCENTIVES_CAUTION = "Incentives depend on the program's rules and budget on the day they are claimed; tax credits depend on your own tax liability.";
/** Said plainly instead when no offer has any incentive or tax credit. */
export const NO_INCENTIVES_NOTE = "No incentive or tax credit applies to these offers: the prices and savings shown are without any.";

/** The usual cautions shown with every proposal (our wording). */
export const PROPOSAL_CAUTIONS: readonly string[] = [
  OFFER_CAUTION,
  STRING_CAUTION,
  "Production figures are for a typical weather year; any single year can be sunnier or cloudier.",
  "Utility prices, rate plans and net-metering rules can change; savings follow them.",
  INCENTIVES_CAUTION,
  "Site conditions found during the survey (roof structure, electrical panel, shading) can change the design and the price; any change comes to you as a new proposal.",
];

/** The usual cautions; when no offer has any incentive, the incentives line says so plainly. */
export function cautionsFor(offers: readonly { figures: { incentives: { applied: readonly unknown[] } } }[]): string[] {
  const none = offers.every((o) => o.figures.incentives.applied.length === 0);
  return PROPOSAL_CAUTIONS.map((c) => (c === INCENTIVES_CAUTION && none ? NO_INCENTIVES_NOTE : c));
}

/** Faces of one offer: the design's faces with the offer's own module counts where it sets them. */
function offerFaces(faces: SnapshotFace[], inputs: OfferInputs): ProposalSnapshotOffer["equipment"]["faces"] {
  return faces
    .map((f) => {
      const own = inputs.faceCounts?.find((c) => c.faceId === f.id);
      const access = Array.isArray(f.solarAccessPct) ? round1(mean(f.solarAccessPct)) : f.solarAccessPct;
      return { name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, moduleCount: own ? own.moduleCount : f.moduleCount, solarAccessPct: access };
    })
    .filter((f) => f.moduleCount > 0);
}

const pct = (x: number) => `${Number.isInteger(x) ? x : x.toFixed(1)} %`;

function usageSentence(u: SnapshotSource["usage"]): string {
  const annual = Math.round(u.monthlyKwh.reduce((a, b) => a + b, 0)).toLocaleString("en-US");
  if (u.source === "interval") return `Usage: ${annual} kWh a year from the household's hourly interval data (Green Button or CSV), summed by month.`;
  if (u.source === "none") return "Usage: no bills or interval data were recorded.";
  const filled =
    u.estimatedMonths > 0
      ? ` ${u.estimatedMonths} of the 12 months had no bill and were estimated ${u.fillMethod === "degree-day" ? "from how the household's usage follows the weather at the site" : "from a seasonal usage shape"}.`
      : "";
  return `Usage: ${annual} kWh a year from the household's utility bills, spread to calendar months by day.${filled}`;
}

/** Every assumption behind the figures, as sentences (weather, losses, degradation, escalation, rate plan, incentive dates). */
export function assumptionSentences(src: SnapshotSource): string[] {
  const out: string[] = [usageSentence(src.usage)];
  const first = src.offers[0]?.figures;
  const seen = new Set<string>();
  const add = (s: string) => {
    if (!seen.has(s)) {
      seen.add(s);
      out.push(s);
    }
  };
  // Notes carry the weather source ("Weather: …") and anything the engine had to assume.
  for (const o of src.offers) for (const note of o.figures.notes) add(plainAssumption(note));
  add(`System losses: ${pct(src.design.lossesPct)} combined (wiring, soiling, mismatch, connections, availability and others).`);
  for (const f of src.design.faces.filter((x) => x.moduleCount > 0 || src.offers.some((o) => o.inputs.faceCounts?.some((c) => c.faceId === x.id && c.moduleCount > 0)))) {
    const access = Array.isArray(f.solarAccessPct) ? `${round1(mean(f.solarAccessPct))} % on average (12 monthly values)` : pct(f.solarAccessPct);
    add(`Roof face "${f.name}": tilt ${f.tiltDeg}°, azimuth ${f.azimuthDeg}° (clockwise from north), solar access ${access} after shading.`);
  }
  if (first) {
    const a = first.assumptions;
    add(`Module output falls ${pct(a.degradationPctPerYear)} a year (degradation); year 1 is the typical-year estimate.`);
    add(`Utility prices rise ${pct(a.utilityEscalationPctPerYear)} a year.`);
    add(`Bills with and without solar are computed under the rate plan "${a.ratePlanName}"${src.utilityName ? ` of ${src.utilityName}` : ""}, as it stands for ${a.calendarYear}.`);
    add(`The cash-flow table runs ${a.years} years; net present value discounts future money at ${pct(a.discountRatePct)} a year.`);
    add(`Incentives are evaluated as of ${first.asOf}.`);
  }
  for (const o of src.offers) {
    for (const inc of o.figures.incentives.applied) {
      const rule = src.book.incentives.find((r) => r.id === inc.id);
      add(`Incentive "${inc.name}": ${inc.detail}${rule ? `; the program runs ${rule.startDate} to ${rule.endDate}` : ""}${inc.year === 0 ? ", counted at signing" : `, counted in year ${inc.year}`}.`);
    }
    if (o.inputs.payment.kind === "loan") {
      const p = o.inputs.payment;
      add(`"${o.name}" is paid with a loan: ${formatAprPct(p.aprPct)} APR over ${p.termMonths} months${p.dealerFeePct > 0 ? `, with a ${pct(p.dealerFeePct)} dealer fee added to the amount financed` : ""}.`);
    }
  }
  add("Deposits follow the installer's deposit policy and count toward the contract price.");
  return out;
}

/** Freezes the offers into the snapshot the proposal carries (a deep copy: no shared references). */
export function buildProposalSnapshot(src: SnapshotSource): ProposalSnapshot {
  if (src.offers.length < 1 || src.offers.length > 3) throw new Error("A proposal holds 1–3 offers.");
  const offers: ProposalSnapshotOffer[] = src.offers.map((o) => {
    const faces = offerFaces(src.design.faces, o.inputs);
    return {
      position: o.position,
      name: o.name,
      inputs: structuredClone(o.inputs),
      figures: structuredClone(o.figures),
      equipment: {
        module: { ...o.module },
        inverter: { ...o.inverter },
        moduleCount: o.figures.summary.moduleCount,
        faces,
      },
      depositCents: depositFor(src.book, o.figures.summary.contractCents),
    };
  });
  return {
    version: 1,
    takenAt: src.takenAt.toISOString(),
    company: { ...src.company },
    rep: { ...src.rep },
    household: { ...src.household },
    utilityName: src.utilityName,
    usage: { monthlyKwh: src.usage.monthlyKwh.map((v) => Math.round(v * 10) / 10), source: src.usage.source },
    assumptions: assumptionSentences(src),
    offers,
    cautions: cautionsFor(offers),
  };
}

// ── Link states ─────────────────────────────────────────────────────────────────────────────

export type ProposalLinkState = "live" | "expired" | "revoked" | "replaced" | "signed" | "cancelled";

/** What the customer's link shows. A signed or cancelled record stays readable after the link's expiry. */
export function proposalLinkState(p: { status: string; expiresAt: Date }, now = new Date()): ProposalLinkState {
  switch (p.status) {
    case "signed":
      return "signed";
    case "cancelled":
      return "cancelled";
    case "revoked":
      return "revoked";
    case "replaced":
      return "replaced";
    default:
      return p.expiresAt.getTime() <= now.getTime() ? "expired" : "live";
  }
}

/** The office's view of a version: the link state, with "opened"/"viewed" for live links. */
export function proposalDisplayStatus(p: { status: string; expiresAt: Date; firstOpenedAt: Date | null; lastViewedAt: Date | null }, now = new Date()) {
  const state = proposalLinkState(p, now);
  if (state !== "live") return state;
  if (p.lastViewedAt && p.firstOpenedAt && p.lastViewedAt.getTime() > p.firstOpenedAt.getTime()) return "viewed";
  return p.firstOpenedAt ? "opened" : "sent";
}

// ── Right to cancel (16 CFR Part 429) ──────────────────────────────────────────────────────
// Days are the company's calendar days (Settings → Company time zone): installers sell in
// their own area, so it stands in for the household's own time zone, which is not recorded.

/** The instant the deadline day ends: midnight after it, in the time zone (16 CFR 429.1(a): "prior to midnight"). */
export function cancelWindowClosesAt(deadlineIsoDate: string, timeZone: string): Date {
  return startOfDayInZone(addDaysToDate(deadlineIsoDate, 1), timeZone);
}

export function canStillCancel(p: { status: string; inHomeSale: boolean; cancelDeadline: string | null }, timeZone: string, now = new Date()): boolean {
  if (p.status !== "signed" || !p.inHomeSale || !p.cancelDeadline) return false;
  return now.getTime() < cancelWindowClosesAt(p.cancelDeadline, timeZone).getTime();
}

/** "Friday, December 5, 2026" for an ISO date (the date itself, not shifted by any time zone). */
export function formatIsoDateLong(isoDate: string): string {
  return formatCalendarDate(isoDate, "full");
}
