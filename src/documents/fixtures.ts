// An invented proposal for tests and benchmarks of the documents (and for anyone else who needs
// a realistic ProposalSnapshot): three offers whose figures are computed by the real
// computeOfferFigures from invented usage, an invented production shape and an invented price
// book. Every name, place and product here is made up.
import { spreadMonthlyToHourly } from "@/engine/load-shape";
import { HOURS_PER_YEAR } from "@/engine/year-calendar";
import { computeOfferFigures, OFFER_CAUTION } from "@/lib/offer-figures";
import type { OfferInputs, PaymentInput } from "@/lib/schemas/offer";
import { priceBookSchema, type PriceBook } from "@/lib/schemas/price-book";
import type { ProposalSnapshot, ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import type { RatePlanInput } from "@/engine/rates";
import type { ProposalPdfMeta } from "./proposal-pdf";
import type { SignatureStamp } from "./signed-pdf";

const AS_OF = "2026-03-02";

const BOOK: PriceBook = priceBookSchema.parse({
  version: 1,
  bands: [
    { minWatts: 0, maxWatts: 6_000, centsPerWattDc: 310 },
    { minWatts: 6_000, maxWatts: 10_000, centsPerWattDc: 285 },
    { minWatts: 10_000, maxWatts: null, centsPerWattDc: 265 },
  ],
  adders: [
    { id: "optimizers", name: "Module-level optimizers", kind: "per_module", centsPerModule: 5_500 },
    { id: "steep-roof", name: "Steep roof (over 8/12 pitch)", kind: "per_watt", centsPerWattDc: 12 },
  ],
  lineItems: [{ id: "critter-guard", name: "Critter guard", amountCents: 65_000 }],
  discountLimits: { sales_rep: { maxCents: 100_000, maxPct: 3 }, office_manager: { maxCents: 300_000, maxPct: 8 } },
  incentives: [
    {
      id: "coop-rebate",
      name: "Haw River Cooperative solar rebate",
      source: "utility",
      amount: { kind: "per-watt", centsPerWattDc: 20, capCents: 150_000 },
      startDate: "2026-01-01",
      endDate: "2027-12-31",
      timing: "upfront",
      eligibility: {},
    },
    {
      id: "county-grant",
      name: "Alamance Ridge County home-energy grant",
      source: "local",
      amount: { kind: "fixed", amountCents: 50_000 },
      startDate: "2025-07-01",
      endDate: "2026-06-30",
      timing: { year: 1 },
      eligibility: { payment: ["cash"] },
    },
    {
      id: "early-bonus",
      name: "Cooperative early-adopter bonus",
      source: "utility",
      amount: { kind: "fixed", amountCents: 25_000 },
      startDate: "2025-01-01",
      endDate: "2025-12-31",
      timing: "upfront",
      eligibility: {},
    },
  ],
  deposit: { kind: "percent", pct: 10, minCents: 50_000, maxCents: 250_000 },
});

const RATE_PLAN: RatePlanInput = {
  name: "Residential Service R-2 (tiered, net metering)",
  fixedMonthlyCents: 1_400,
  minimumBillCents: 2_000,
  energy: { kind: "tiered", tiers: [{ upToKwh: 800, centsPerKwh: 12.6 }, { upToKwh: null, centsPerKwh: 14.4 }] },
  compensation: { kind: "net-metering", trueUpMonth: 5, surplusCentsPerKwh: 3.2 },
};

/** Monthly usage of the invented household, kWh, January–December. */
export const FIXTURE_MONTHLY_KWH = [1180, 1010, 890, 760, 820, 1150, 1420, 1380, 1060, 820, 850, 1090];

const FACES = [
  { id: "south", name: "South main roof", tiltDeg: 26.6, azimuthDeg: 180, solarAccessPct: 94, factor: 1 },
  { id: "west", name: "West garage", tiltDeg: 22.6, azimuthDeg: 262, solarAccessPct: 88, factor: 0.83 },
  { id: "east", name: "East dormer", tiltDeg: 33.7, azimuthDeg: 95, solarAccessPct: 91, factor: 0.8 },
];

/**
 * An invented production shape for 1 kW DC facing south: a half-sine day from 06:00 to 19:00
 * whose height follows the season, about 1,340 kWh a year. Not weather: a stand-in so the
 * fixture needs no weather file.
 */
function productionPerKw(): Float64Array {
  const out = new Float64Array(HOURS_PER_YEAR);
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    const hour = h % 24;
    const day = Math.floor(h / 24);
    const season = 0.72 + 0.28 * Math.cos((2 * Math.PI * (day - 172)) / 365);
    // Cloudy days every so often, fixed pattern.
    const cloud = (day * 37) % 11 === 0 ? 0.35 : (day * 17) % 7 === 0 ? 0.7 : 1;
    out[h] = hour >= 6 && hour < 19 ? 0.66 * season * cloud * Math.sin((Math.PI * (hour - 6 + 0.5)) / 13) : 0;
  }
  return out;
}

type OfferSpec = {
  position: number;
  name: string;
  module: { manufacturer: string; model: string; stcWatts: number };
  inverter: { manufacturer: string; model: string; kind: "string" | "micro"; acWatts: number };
  counts: number[];
  adderIds: string[];
  lineItemIds: string[];
  discountCents: number;
  payment: PaymentInput;
};

const OFFERS: OfferSpec[] = [
  {
    position: 1,
    name: "Essentials (cash)",
    module: { manufacturer: "Prairieline", model: "PL-410", stcWatts: 410 },
    inverter: { manufacturer: "Wrenfield", model: "WF-7600S", kind: "string", acWatts: 7600 },
    counts: [18, 0, 0],
    adderIds: [],
    lineItemIds: [],
    discountCents: 0,
    payment: { kind: "cash" },
  },
  {
    position: 2,
    name: "Full offset (loan)",
    module: { manufacturer: "Prairieline", model: "PL-410", stcWatts: 410 },
    inverter: { manufacturer: "Wrenfield", model: "MX-380 microinverter", kind: "micro", acWatts: 380 },
    counts: [18, 8, 0],
    adderIds: ["steep-roof"],
    lineItemIds: ["critter-guard"],
    discountCents: 0,
    payment: { kind: "loan", aprPct: 6.99, termMonths: 240, dealerFeePct: 12, downPaymentCents: null },
  },
  {
    position: 3,
    name: "Premium black (cash)",
    module: { manufacturer: "Prairieline", model: "PL-440 Midnight", stcWatts: 440 },
    inverter: { manufacturer: "Wrenfield", model: "WF-10000S", kind: "string", acWatts: 10000 },
    counts: [18, 6, 4],
    adderIds: ["optimizers"],
    lineItemIds: ["critter-guard"],
    discountCents: 75_000,
    payment: { kind: "cash" },
  },
];

function buildOffer(spec: OfferSpec, usageHourly: readonly number[], perKw: Float64Array): ProposalSnapshotOffer {
  const production = new Float64Array(HOURS_PER_YEAR);
  FACES.forEach((f, i) => {
    const kw = (spec.counts[i] * spec.module.stcWatts) / 1000;
    const scale = kw * f.factor * (f.solarAccessPct / 100);
    for (let h = 0; h < HOURS_PER_YEAR; h++) production[h] += perKw[h] * scale;
  });
  const moduleCount = spec.counts.reduce((a, b) => a + b, 0);
  const figures = computeOfferFigures({
    book: BOOK,
    role: "sales_rep",
    asOf: AS_OF,
    moduleCount,
    moduleWatts: spec.module.stcWatts,
    productionHourlyKwh: production,
    usageHourlyKwh: usageHourly,
    ratePlan: RATE_PLAN,
    timeZone: "America/New_York",
    payment: spec.payment,
    adderIds: spec.adderIds,
    lineItemIds: spec.lineItemIds,
    discountCents: spec.discountCents,
  });
  const inputs: OfferInputs = {
    name: spec.name,
    faceCounts: FACES.map((f, i) => ({ faceId: f.id, moduleCount: spec.counts[i] })),
    moduleId: null,
    inverterId: null,
    adderIds: spec.adderIds,
    lineItemIds: spec.lineItemIds,
    discountCents: spec.discountCents,
    discountReason: spec.discountCents > 0 ? "Spring install window" : "",
    payment: spec.payment,
    ratePlanId: null,
    ratePlanOverrideReason: "",
  };
  return {
    position: spec.position,
    name: spec.name,
    inputs,
    figures,
    equipment: {
      module: spec.module,
      inverter: spec.inverter,
      moduleCount,
      faces: FACES.map((f, i) => ({ name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, moduleCount: spec.counts[i], solarAccessPct: f.solarAccessPct })).filter((f) => f.moduleCount > 0),
    },
    depositCents: figures.price.depositCents,
  };
}

let cached: ProposalSnapshot | null = null;

/** The invented snapshot with 1–3 offers (3 by default). Computed once, then copied. */
export function fixtureSnapshot(offerCount: 1 | 2 | 3 = 3): ProposalSnapshot {
  if (!cached) {
    const usage = spreadMonthlyToHourly(FIXTURE_MONTHLY_KWH).hourlyKwh;
    const perKw = productionPerKw();
    cached = {
      version: 1,
      takenAt: "2026-03-02T15:20:00.000Z",
      company: { name: "Tallgrass Bright Energy", licenseNumber: "NC-EC 31187-U" },
      rep: { name: "Dana Whitcombe", email: "rep@tallgrass.example" },
      household: {
        name: "Ventana household",
        contactName: "Marisol Ventana",
        email: "marisol.ventana@example.com",
        phone: "+1 336 555 0148",
        street: "418 Thornapple Lane",
        city: "Elm Crossing",
        region: "NC",
        postalCode: "27409",
        latitude: 36.0712,
        longitude: -79.9431,
      },
      utilityName: "Haw River Electric Cooperative",
      usage: { monthlyKwh: FIXTURE_MONTHLY_KWH, source: "12 bills, March 2025 to February 2026" },
      assumptions: [
        "Weather: typical meteorological year for Greensboro, NC (TMY3 station 723170, 6 km from the site).",
        "System losses 14 % (soiling 2 %, shading per face, mismatch 2 %, wiring 2 %, connections 0.5 %, light-induced degradation 1.5 %, nameplate 1 %, availability 3 %).",
        "Production modelled hour by hour with the Perez 1990 sky model, Fuentes cell temperature and the PVWatts DC and inverter models.",
      ],
      offers: OFFERS.map((o) => buildOffer(o, usage, perKw)),
      cautions: [
        OFFER_CAUTION,
        "Electrical and structural figures are preliminary: the final design must be checked by a licensed professional against the local code and the authority having jurisdiction (AHJ).",
      ],
    };
  }
  const copy = structuredClone(cached);
  copy.offers = copy.offers.slice(0, offerCount);
  return copy;
}

export const FIXTURE_META: ProposalPdfMeta = {
  number: 1042,
  version: 2,
  sentAt: new Date("2026-03-02T15:30:00.000Z"),
  expiresAt: new Date("2026-04-01T15:30:00.000Z"),
  timeZone: "America/New_York",
  inHomeSale: true,
  cancelDeadlineText: null,
};

/** A 1 × 1 transparent PNG. */
export const TINY_PNG = Uint8Array.from(
  Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==", "base64"),
);

/** A drawn-looking signature (600 × 200, transparent background) rendered from SVG strokes. */
export async function fixtureSignaturePng(): Promise<Uint8Array> {
  const { default: sharp } = await import("sharp");
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="200" viewBox="0 0 600 200">
    <path d="M30 140 C 60 40, 90 40, 100 120 S 140 170, 160 90 C 170 60, 190 60, 200 130 C 215 170, 240 80, 260 110 C 275 135, 290 120, 305 95 C 320 70, 335 150, 360 120 C 380 95, 400 100, 420 125 C 445 150, 470 60, 500 80 C 530 100, 540 140, 575 110"
      fill="none" stroke="#101820" stroke-width="4" stroke-linecap="round" stroke-linejoin="round"/>
    <path d="M120 160 C 220 150, 360 150, 520 160" fill="none" stroke="#101820" stroke-width="3" stroke-linecap="round"/>
  </svg>`;
  return new Uint8Array(await sharp(Buffer.from(svg)).png().toBuffer());
}

/** A signing stamp for the fixture proposal (offer 2). */
export function fixtureStamp(signaturePng: Uint8Array, unsignedSha256: string): SignatureStamp {
  const snapshot = fixtureSnapshot();
  const offer = snapshot.offers[1];
  const at = (iso: string) => new Date(iso);
  return {
    signaturePng,
    signerName: "Marisol Ventana",
    signerEmail: "marisol.ventana@example.com",
    chosenPosition: offer.position,
    chosenOfferName: offer.name,
    chosenContractCents: offer.figures.summary.contractCents,
    // 01:12 UTC on the 3rd is 8:12 PM on the 2nd in the company's zone: a wrong clock shows the wrong day.
    signedAt: at("2026-03-03T01:12:45.000Z"),
    timeZone: "America/New_York",
    ip: "203.0.113.24",
    userAgent:
      "Mozilla/5.0 (iPhone; CPU iPhone OS 19_2 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/19.2 Mobile/15E148 Safari/604.1",
    unsignedSha256,
    proposalLabel: "Proposal P-1042 v2",
    events: [
      { at: at("2026-03-02T15:30:02.000Z"), kind: "sent", detail: "Sent to marisol.ventana@example.com by Dana Whitcombe" },
      { at: at("2026-03-03T00:58:10.000Z"), kind: "opened", detail: "Link opened" },
      { at: at("2026-03-03T01:09:31.000Z"), kind: "code_sent", detail: "One-time code sent to marisol.ventana@example.com" },
      { at: at("2026-03-03T01:10:02.000Z"), kind: "code_verified", detail: "E-mail confirmed with the one-time code" },
      { at: at("2026-03-03T01:11:40.000Z"), kind: "consented", detail: "Agreed to electronic records and signatures" },
      { at: at("2026-03-03T01:12:45.000Z"), kind: "signed", detail: `Signed, offer ${offer.position}: ${offer.name}` },
    ],
  };
}
