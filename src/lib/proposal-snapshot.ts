// Freezing offers into a proposal: the pure part, shared by the server (src/server/proposals/)
// and the demo seed (scripts/lib/seed/proposals.ts). It copies every figure and turns the
// assumptions behind them into sentences, so the customer's page and the PDF read only the
// snapshot, never the live offers, catalog or price book. Also: the states a proposal link can
// be in, and the right-to-cancel window. No server or browser imports.
import { formatCalendarDate } from "@/lib/format";
import { haversineKm } from "@/engine/geo";
import type { SkipWhy } from "@/engine/incentives";
import { plainAssumption, weatherSourcePlace } from "@/lib/plain-words";
import { msg, snapshotText, snapshotTexts, type SnapshotKey, type SnapshotMessage, type SnapshotText } from "@/lib/snapshot-text";
import { addDaysToDate, startOfDayInZone } from "@/lib/zoned-time";
import { OFFER_CAUTION, STRING_CAUTION, type OfferFigures } from "@/lib/offer-figures";
import { depositFor, type PriceLine } from "@/lib/pricing";
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

/** The usual cautions shown with every proposal (our wording), in English and as catalog keys (snapshot.caution.*). */
const CAUTIONS: readonly { text: string; key: SnapshotKey }[] = [
  { text: OFFER_CAUTION, key: "caution.offer" },
  { text: STRING_CAUTION, key: "caution.string" },
  { text: "Production figures are for a typical weather year; any single year can be sunnier or cloudier.", key: "caution.weatherYear" },
  { text: "Utility prices, rate plans and net-metering rules can change; savings follow them.", key: "caution.utilityRules" },
  { text: INCENTIVES_CAUTION, key: "caution.incentives" },
  {
    text: "Site conditions found during the survey (roof structure, electrical panel, shading) can change the design and the price; any change comes to you as a new proposal.",
    key: "caution.siteConditions",
  },
];
export const PROPOSAL_CAUTIONS: readonly string[] = CAUTIONS.map((c) => c.text);

const noIncentives = (offers: readonly { figures: { incentives: { applied: readonly unknown[] } } }[]) => offers.every((o) => o.figures.incentives.applied.length === 0);

/** The usual cautions; when no offer has any incentive, the incentives line says so plainly. */
export function cautionsFor(offers: readonly { figures: { incentives: { applied: readonly unknown[] } } }[]): string[] {
  return PROPOSAL_CAUTIONS.map((c) => (c === INCENTIVES_CAUTION && noIncentives(offers) ? NO_INCENTIVES_NOTE : c));
}

/** The same cautions as catalog keys, for the reader's language. */
export function cautionMessages(offers: readonly { figures: { incentives: { applied: readonly unknown[] } } }[]): SnapshotMessage[] {
  return CAUTIONS.map((c) => msg(c.key === "caution.incentives" && noIncentives(offers) ? "caution.noIncentives" : c.key));
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

function usageMessage(u: SnapshotSource["usage"]): SnapshotMessage {
  const kwh = Math.round(u.monthlyKwh.reduce((a, b) => a + b, 0));
  if (u.source === "interval") return msg("usage.interval", { kwh });
  if (u.source === "none") return msg("usage.none");
  if (u.estimatedMonths === 0) return msg("usage.bills", { kwh });
  return msg(u.fillMethod === "degree-day" ? "usage.billsFilledWeather" : "usage.billsFilledSeasonal", { kwh, months: u.estimatedMonths });
}

// The notes the offer path writes (src/server/offers.ts: the weather source; src/lib/offer-figures.ts:
// the loan's term, late incentives), read back into catalog keys. Any other note (a weather
// file's repairs, say) is kept as the engine wrote it, in plain words.
const LOAN_TERM_NOTE = /^The table runs (\d+) years, the loan's term, instead of the usual (\d+), so every loan payment is counted\.$/;
const LATE_INCENTIVES_NOTE = /^Incentives paid after year (\d+) are left out\.$/;

/** One note on an offer's figures as a catalog message, or in plain English when we have no message for it. */
export function noteMessage(note: string): SnapshotText {
  const weather = note.match(/^Weather: (.*?)\.?$/);
  if (weather) {
    const w = weatherSourcePlace(weather[1]);
    return !w ? msg("weather.near") : "typed" in w ? msg("weather.typed", { source: w.typed }) : msg("weather.station", { place: w.place });
  }
  const loan = note.match(LOAN_TERM_NOTE);
  if (loan) return msg("note.loanTerm", { years: Number(loan[1]), usual: Number(loan[2]) });
  const late = note.match(LATE_INCENTIVES_NOTE);
  if (late) return msg("note.incentivesAfter", { years: Number(late[1]) });
  return plainAssumption(note);
}

/** How a price-book incentive is worked out, from its rule (the name stays as the company typed it). */
function incentiveDetail(rule: PriceBook["incentives"][number] | undefined): SnapshotMessage {
  const a = rule?.amount;
  if (!a || a.kind === "fixed") return msg("incentiveDetail.fixed");
  const base =
    a.kind === "per-watt" ? msg("incentiveDetail.perWatt", { cents: a.centsPerWattDc }) : msg(a.basis === "net-of-earlier" ? "incentiveDetail.percentNet" : "incentiveDetail.percent", { pct: a.pct });
  return a.capCents === undefined ? base : msg("incentiveDetail.capped", { detail: base, cap: { cents: a.capCents } });
}

const SKIPPED_PAYMENT = { cash: "skipped.paymentCash", loan: "skipped.paymentLoan", lease: "skipped.paymentLease", ppa: "skipped.paymentPpa" } as const;

/** Why an incentive does not apply, as a catalog message (figures computed before the engine recorded why: its English reason). */
export function skipMessage(k: { reason: string; why?: SkipWhy }): SnapshotText {
  const w = k.why;
  if (!w) return k.reason;
  switch (w.kind) {
    case "starts":
    case "ended": {
      const on = msg(w.onWhat === "installation" ? "skipped.onInstallation" : "skipped.onOffer", { date: w.on });
      return w.kind === "starts" ? msg("skipped.starts", { start: w.date, on }) : msg("skipped.ended", { end: w.date, on });
    }
    case "belowMin":
    case "aboveMax":
      return msg(`skipped.${w.kind}`, { kw: w.kw, limit: w.limit });
    case "payment":
      return msg(SKIPPED_PAYMENT[w.payment]);
  }
}

/** A price line's label and detail: our words as catalog keys, a price-book name as the company typed it. */
function priceLineMessages(l: PriceLine): { label: SnapshotText; detail: SnapshotText } {
  const label = l.kind === "base" ? msg("price.system") : l.kind === "discount" ? msg("price.discount") : l.label;
  const h = l.how;
  if (!h) return { label, detail: l.detail };
  const detail =
    h.per === "watt"
      ? msg("price.perWatt", { watts: h.watts, cents: h.centsPerWatt })
      : h.per === "module"
        ? msg("price.perModule", { modules: h.modules, each: { cents: h.centsEach } })
        : h.per === "job"
          ? msg("price.perJob")
          : msg("price.off", { amount: { cents: h.cents } });
  return { label, detail };
}

function faceMessages(src: SnapshotSource): SnapshotMessage[] {
  const used = src.design.faces.filter((x) => x.moduleCount > 0 || src.offers.some((o) => o.inputs.faceCounts?.some((c) => c.faceId === x.id && c.moduleCount > 0)));
  return used.map((f) => {
    const access = Array.isArray(f.solarAccessPct) ? msg("accessMonthly", { pct: round1(mean(f.solarAccessPct)) }) : msg("access", { pct: f.solarAccessPct });
    return msg("face", { name: f.name, tilt: f.tiltDeg, azimuth: f.azimuthDeg, access });
  });
}

function offerMessages(src: SnapshotSource): SnapshotMessage[] {
  const out: SnapshotMessage[] = [];
  for (const o of src.offers) {
    for (const inc of o.figures.incentives.applied) {
      const rule = src.book.incentives.find((r) => r.id === inc.id);
      const program = rule ? msg("program", { start: rule.startDate, end: rule.endDate }) : "";
      out.push(msg("incentive", { name: inc.name, detail: incentiveDetail(rule), program, when: inc.year === 0 ? msg("atSigning") : msg("inYear", { year: inc.year }) }));
    }
    if (o.inputs.payment.kind === "loan") {
      const p = o.inputs.payment;
      const loan = { name: o.name, apr: p.aprPct, months: p.termMonths };
      out.push(p.dealerFeePct > 0 ? msg("loanFee", { ...loan, fee: p.dealerFeePct }) : msg("loan", loan));
    }
  }
  return out;
}

/** Every assumption behind the figures, as catalog messages (weather, losses, degradation, escalation, rate plan, incentive dates), each once. */
export function assumptionMessages(src: SnapshotSource): SnapshotText[] {
  const out: SnapshotText[] = [usageMessage(src.usage)];
  // Notes carry the weather source ("Weather: …") and anything the engine had to assume.
  for (const o of src.offers) for (const note of o.figures.notes) out.push(noteMessage(note));
  out.push(msg("losses", { pct: src.design.lossesPct }), ...faceMessages(src));
  const first = src.offers[0]?.figures;
  if (first) {
    const a = first.assumptions;
    const plan = { plan: a.ratePlanName, year: String(a.calendarYear) };
    out.push(
      msg("degradation", { pct: a.degradationPctPerYear }),
      msg("escalation", { pct: a.utilityEscalationPctPerYear }),
      src.utilityName ? msg("ratePlanOf", { ...plan, utility: src.utilityName }) : msg("ratePlan", plan),
      msg("years", { years: a.years, rate: a.discountRatePct }),
      msg("incentivesAsOf", { date: first.asOf }),
    );
  }
  out.push(...offerMessages(src), msg("deposits"));
  const seen = new Set<string>();
  return out.filter((m) => {
    const en = snapshotText(m, "en");
    return seen.has(en) ? false : (seen.add(en), true);
  });
}

/** Every assumption behind the figures, as English sentences (what older snapshots stored, and the office reads). */
export function assumptionSentences(src: SnapshotSource): string[] {
  return snapshotTexts(assumptionMessages(src), "en");
}

/** The homeowner texts of a new snapshot, as catalog messages (see src/lib/snapshot-text.ts). */
function snapshotTextsOf(src: SnapshotSource, offers: ProposalSnapshotOffer[]): NonNullable<ProposalSnapshot["texts"]> {
  return {
    assumptions: assumptionMessages(src),
    cautions: cautionMessages(offers),
    notes: [...new Set(src.offers.flatMap((o) => o.figures.notes))].map(noteMessage),
    offers: src.offers.map((o) => ({
      position: o.position,
      priceLines: o.figures.price.lines.map(priceLineMessages),
      applied: o.figures.incentives.applied.map((inc) => incentiveDetail(src.book.incentives.find((r) => r.id === inc.id))),
      skipped: o.figures.incentives.skipped.map(skipMessage),
    })),
  };
}

/** The station the offers' weather came from (the first offer that names one), with its distance from the home in whole km. */
function stationOf(src: SnapshotSource): Pick<ProposalSnapshot, "station"> {
  const station = src.offers.find((o) => o.figures.weatherStation)?.figures.weatherStation;
  if (!station) return {};
  return { station: { ...station, distanceKm: Math.round(haversineKm(src.household, station)) } };
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
    ...stationOf(src),
    usage: { monthlyKwh: src.usage.monthlyKwh.map((v) => Math.round(v * 10) / 10), source: src.usage.source },
    assumptions: assumptionSentences(src),
    offers,
    cautions: cautionsFor(offers),
    texts: snapshotTextsOf(src, offers),
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
