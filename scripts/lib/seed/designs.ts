// Demo designs and offers: a saved design for every invented deal from "designing" onward
// (Prairieline modules on two or three roof faces, nearest station Greensboro), two offers on
// the "proposal out" deal (Dunmore), one of them with a discount beyond the rep's limit waiting
// for the office manager. Offer figures are computed by the same pure code the server uses.
import { readFile } from "node:fs/promises";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { and, eq } from "drizzle-orm";
import { bill, company, deal, dealUsage, design, discountRequest, inverterModel, moduleModel, offer, priceBook, ratePlan, timelineEvent } from "../../../src/db/schema";
import type { OfferBasis } from "../../../src/lib/offer-basis";
import { usageFromBills } from "../../../src/engine/bills";
import { spreadMonthlyToHourly } from "../../../src/engine/load-shape";
import { estimateProduction } from "../../../src/engine/production";
import { parseWeather } from "../../../src/engine/weather";
import { computeOfferFigures, engineSystem, suggestStrings, type InverterSpec, type ModuleSpec } from "../../../src/lib/offer-figures";
import { designDocumentSchema, type DesignDocumentInput } from "../../../src/lib/schemas/design";
import { offerInputsSchema, type OfferInputsInput } from "../../../src/lib/schemas/offer";
import { priceBookSchema } from "../../../src/lib/schemas/price-book";
import { ratePlanSchema } from "../../../src/engine/rates";
import { siteTimeZone } from "../../../src/engine/site-time-zone";
import type { SeedContext } from "../seed-demo";
import { DEMO_INVERTER_IDS, DEMO_MODULE_IDS } from "./catalog";
import { DEMO_RATE_PLAN_IDS } from "./pricing";

export const order = 30;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;

/** Fixed ids, for other areas' seeds and tests. */
export const DEMO_DESIGN_IDS = Array.from({ length: 12 }, (_, i) => uid(3001 + i));
export const DEMO_OFFER_IDS = { dunmoreCash: uid(3101), dunmoreLoan: uid(3102) } as const;
export const DEMO_DISCOUNT_REQUEST_ID = uid(3201);

const here = path.dirname(fileURLToPath(import.meta.url));
const GREENSBORO_FILE = path.resolve(here, "../../../src/engine/data/tmy3-723170-greensboro-nc.csv");

type DemoDesign = {
  /** Index of the deal in the demo households (seed-demo.ts HOUSEHOLDS). */
  dealIndex: number;
  inverter: "string7600" | "string11400" | "micro320";
  faces: { name: string; tiltDeg: number; azimuthDeg: number; usableSlots: number; solarAccessPct: number | number[]; moduleCount: number }[];
};

// Deals 2 (designing) … 13 (lost): every deal that had a design. Roofs invented.
const DESIGNS: DemoDesign[] = [
  { dealIndex: 2, inverter: "string7600", faces: [{ name: "South main", tiltDeg: 26, azimuthDeg: 178, usableSlots: 14, solarAccessPct: 96, moduleCount: 12 }, { name: "West porch", tiltDeg: 18, azimuthDeg: 268, usableSlots: 8, solarAccessPct: 88, moduleCount: 6 }] },
  { dealIndex: 3, inverter: "string11400", faces: [{ name: "South main", tiltDeg: 30, azimuthDeg: 185, usableSlots: 16, solarAccessPct: 94, moduleCount: 14 }, { name: "East wing", tiltDeg: 30, azimuthDeg: 95, usableSlots: 10, solarAccessPct: [78, 80, 84, 88, 90, 92, 92, 90, 88, 84, 80, 78], moduleCount: 7 }] },
  { dealIndex: 4, inverter: "string7600", faces: [{ name: "South", tiltDeg: 22, azimuthDeg: 170, usableSlots: 18, solarAccessPct: 97, moduleCount: 17 }] },
  { dealIndex: 5, inverter: "string11400", faces: [{ name: "South-west", tiltDeg: 27, azimuthDeg: 205, usableSlots: 16, solarAccessPct: 95, moduleCount: 14 }, { name: "South-east", tiltDeg: 27, azimuthDeg: 140, usableSlots: 10, solarAccessPct: 93, moduleCount: 8 }] },
  { dealIndex: 6, inverter: "micro320", faces: [{ name: "Garage south", tiltDeg: 20, azimuthDeg: 182, usableSlots: 12, solarAccessPct: 98, moduleCount: 12 }, { name: "House south", tiltDeg: 32, azimuthDeg: 182, usableSlots: 14, solarAccessPct: 91, moduleCount: 12 }] },
  { dealIndex: 7, inverter: "string7600", faces: [{ name: "West", tiltDeg: 24, azimuthDeg: 262, usableSlots: 10, solarAccessPct: 92, moduleCount: 8 }, { name: "East", tiltDeg: 24, azimuthDeg: 82, usableSlots: 10, solarAccessPct: 92, moduleCount: 10 }] },
  { dealIndex: 8, inverter: "string7600", faces: [{ name: "South", tiltDeg: 28, azimuthDeg: 176, usableSlots: 20, solarAccessPct: 94, moduleCount: 20 }] },
  { dealIndex: 9, inverter: "string7600", faces: [{ name: "South", tiltDeg: 20, azimuthDeg: 190, usableSlots: 16, solarAccessPct: 97, moduleCount: 16 }] },
  { dealIndex: 10, inverter: "string11400", faces: [{ name: "South main", tiltDeg: 33, azimuthDeg: 181, usableSlots: 18, solarAccessPct: 95, moduleCount: 18 }, { name: "West dormer", tiltDeg: 33, azimuthDeg: 271, usableSlots: 12, solarAccessPct: 86, moduleCount: 9 }] },
  { dealIndex: 11, inverter: "string7600", faces: [{ name: "South", tiltDeg: 25, azimuthDeg: 175, usableSlots: 14, solarAccessPct: 98, moduleCount: 14 }] },
  { dealIndex: 12, inverter: "string7600", faces: [{ name: "South", tiltDeg: 24, azimuthDeg: 188, usableSlots: 18, solarAccessPct: 90, moduleCount: 17 }] },
  { dealIndex: 13, inverter: "string7600", faces: [{ name: "South-east", tiltDeg: 26, azimuthDeg: 150, usableSlots: 15, solarAccessPct: 93, moduleCount: 15 }] },
];

/** Invented monthly use for a demo household whose bills are not seeded (kWh, January first). */
const FALLBACK_MONTHLY_KWH = [1180, 1010, 900, 760, 820, 1150, 1390, 1340, 1060, 790, 850, 1120];

const LOWEST_TEMP_C = -15; // Greensboro area record lows sit near −15 °C (invented demo figure, rounded).
const HIGHEST_TEMP_C = 36;

export async function seed(ctx: SeedContext): Promise<void> {
  const { tx, companyId } = ctx;
  const createdAt = new Date(Date.now() - 5 * 86_400_000);
  const rep2 = ctx.people.find((p) => p.email.startsWith("rep2@")) ?? ctx.people.find((p) => p.role === "sales_rep");
  // The catalog seed (order 10) wrote the equipment; the figures read it from there.
  const [pl410] = await tx.select().from(moduleModel).where(and(eq(moduleModel.id, DEMO_MODULE_IDS.topcon410), eq(moduleModel.companyId, companyId)));
  const inverterRows = await tx.select().from(inverterModel).where(eq(inverterModel.companyId, companyId));
  const inverterSpec = (key: DemoDesign["inverter"]): InverterSpec => {
    const row = inverterRows.find((r) => r.id === DEMO_INVERTER_IDS[key]);
    if (!row) throw new Error(`demo seed: inverter ${key} missing from the catalog seed`);
    return row;
  };
  if (!pl410) throw new Error("demo seed: module PL-410T missing from the catalog seed");
  const PL410: ModuleSpec = pl410;

  for (const [k, d] of DESIGNS.entries()) {
    const dealId = ctx.dealIds[d.dealIndex];
    if (!dealId) continue;
    const total = d.faces.reduce((s, f) => s + f.moduleCount, 0);
    const inv = inverterSpec(d.inverter);
    const doc: DesignDocumentInput = {
      moduleId: DEMO_MODULE_IDS.topcon410,
      inverterId: DEMO_INVERTER_IDS[d.inverter],
      inverterCount: 1,
      faces: d.faces.map((f, i) => ({ id: `face-${i + 1}`, ...f })),
      weather: { kind: "nearest" },
      lossesPct: 14,
      targetOffsetPct: 100,
      stringPlan: inv.kind === "string" ? { stringSizes: suggestStrings(total, PL410, inv, LOWEST_TEMP_C, HIGHEST_TEMP_C), lowestTempC: LOWEST_TEMP_C, highestTempC: HIGHEST_TEMP_C } : null,
    };
    await tx.insert(design).values({ id: DEMO_DESIGN_IDS[k], companyId, dealId, document: designDocumentSchema.parse(doc), weatherStationId: null, createdAt });
    // The demo's households are on the co-op's residential plan unless another seed said otherwise.
    await tx.update(deal).set({ ratePlanId: DEMO_RATE_PLAN_IDS.residential }).where(and(eq(deal.id, dealId), eq(deal.companyId, companyId)));
  }

  // ── Two offers on the "proposal out" deal (Dunmore, index 3) ──
  const dealIndex = 3;
  const dealId = ctx.dealIds[dealIndex];
  const d = DESIGNS.find((x) => x.dealIndex === dealIndex);
  if (!dealId || !d || !rep2) return;

  const weather = parseWeather(await readFile(GREENSBORO_FILE, "utf8"), { format: "tmy3" });
  const inv = inverterSpec(d.inverter);
  const counts = d.faces.map((f) => f.moduleCount);
  const system = engineSystem(d.faces, counts, PL410, inv, { inverterCount: 1, lossesPct: 14 });
  if (!system) return;
  const produced = estimateProduction(weather, system);
  const productionHourlyKwh = Float64Array.from(produced.hourlyAcW, (w) => w / 1000);

  const bills = await tx.select().from(bill).where(and(eq(bill.companyId, companyId), eq(bill.dealId, dealId)));
  const monthlyKwh = bills.length
    ? usageFromBills({ bills: bills.map((b) => ({ id: b.id, startDate: b.periodStart, endDate: b.periodEnd, kwh: b.kwh, costCents: b.costCents ?? undefined })), fill: "seasonal" }).monthlyKwh
    : FALLBACK_MONTHLY_KWH;
  const usageHourlyKwh = spreadMonthlyToHourly(monthlyKwh).hourlyKwh;

  const [bookRow] = await tx.select().from(priceBook).where(eq(priceBook.companyId, companyId));
  const [planRow] = await tx.select().from(ratePlan).where(and(eq(ratePlan.id, DEMO_RATE_PLAN_IDS.residential), eq(ratePlan.companyId, companyId)));
  if (!bookRow || !planRow) return;
  const json = (raw: unknown) => (typeof raw === "string" ? JSON.parse(raw) : raw);
  const book = priceBookSchema.parse(json(bookRow.document));
  const plan = ratePlanSchema.parse(json(planRow.plan));
  const asOf = new Date().toISOString().slice(0, 10);
  // What the offers are computed from, as the app records it (src/lib/offer-basis.ts).
  const [usageRow] = await tx.select().from(dealUsage).where(and(eq(dealUsage.companyId, companyId), eq(dealUsage.dealId, dealId)));
  const [designRow] = await tx.select({ revision: design.revision }).from(design).where(and(eq(design.companyId, companyId), eq(design.dealId, dealId)));
  const [companyRow] = await tx.select({ financeVersion: company.financeVersion }).from(company).where(eq(company.id, companyId));
  const inverterRow = inverterRows.find((r) => r.id === DEMO_INVERTER_IDS[d.inverter]);
  const basis: OfferBasis | null =
    usageRow && designRow && companyRow && inverterRow
      ? {
          usage: {
            version: usageRow.version,
            monthlyKwh: json(usageRow.monthlyKwh) as number[],
            annualKwh: usageRow.annualKwh,
            source: usageRow.source,
            estimatedMonths: (json(usageRow.estimatedMonths) as boolean[]).filter(Boolean).length,
            fillMethod: usageRow.fillMethod,
          },
          design: { revision: designRow.revision, lossesPct: 14, faces: d.faces.map((f, i) => ({ id: `face-${i + 1}`, name: f.name, tiltDeg: f.tiltDeg, azimuthDeg: f.azimuthDeg, solarAccessPct: f.solarAccessPct, moduleCount: f.moduleCount })) },
          ratePlan: { id: planRow.id, version: planRow.version },
          priceBook: { version: bookRow.version, incentivesVersion: bookRow.incentivesVersion, document: book },
          assumptionsVersion: companyRow.financeVersion,
          module: { manufacturer: pl410.manufacturer, model: pl410.model, stcWatts: pl410.stcWatts },
          inverter: { manufacturer: inverterRow.manufacturer, model: inverterRow.model, kind: inverterRow.kind, acWatts: inverterRow.acWatts },
        }
      : null;

  const offers: { id: string; position: number; inputs: OfferInputsInput }[] = [
    { id: DEMO_OFFER_IDS.dunmoreCash, position: 1, inputs: { name: "Whole roof, cash", adderIds: ["optimizers"], lineItemIds: ["critter-guard"], payment: { kind: "cash" } } },
    {
      id: DEMO_OFFER_IDS.dunmoreLoan,
      position: 2,
      inputs: {
        name: "Whole roof, 20-year loan",
        lineItemIds: ["critter-guard"],
        discountCents: 150_000,
        discountReason: "Matching a neighbour's offer from another installer",
        payment: { kind: "loan", aprPct: 3.99, termMonths: 240, dealerFeePct: 0 },
      },
    },
  ];
  for (const o of offers) {
    const inputs = offerInputsSchema.parse(o.inputs);
    const figures = computeOfferFigures({
      book,
      role: "sales_rep",
      asOf,
      moduleCount: counts.reduce((a, b) => a + b, 0),
      moduleWatts: PL410.stcWatts,
      productionHourlyKwh,
      usageHourlyKwh,
      ratePlan: plan,
      timeZone: siteTimeZone(weather.site.latitude, weather.site.longitude),
      payment: inputs.payment,
      adderIds: inputs.adderIds,
      lineItemIds: inputs.lineItemIds,
      discountCents: inputs.discountCents,
      notes: [`Weather: ${weather.sourceLabel}.`, ...(bills.length ? [] : ["Usage: the demo household's invented monthly figures."])],
    });
    const status = inputs.discountCents === 0 ? "none" : figures.discountNeedsApproval ? "pending" : "within_limit";
    await tx.insert(offer).values({ id: o.id, companyId, dealId, position: o.position, name: inputs.name, inputs, results: figures, basis, discountCents: inputs.discountCents, discountStatus: status, createdAt });
    await tx.insert(timelineEvent).values({
      id: uid(3300 + o.position),
      companyId,
      dealId,
      kind: "offer.created",
      summary: `Offer "${inputs.name}" created by ${rep2.name}`,
      data: { offerId: o.id },
      actorUserId: rep2.id,
      createdAt,
    });
    if (status === "pending") {
      await tx.insert(discountRequest).values({
        id: DEMO_DISCOUNT_REQUEST_ID,
        companyId,
        dealId,
        offerId: o.id,
        amountCents: inputs.discountCents,
        reason: inputs.discountReason,
        status: "pending",
        requestedByUserId: rep2.id,
        createdAt,
      });
      await tx.insert(timelineEvent).values({
        id: uid(3310),
        companyId,
        dealId,
        kind: "discount.requested",
        summary: `${rep2.name} asked for a $1,500 discount on "${inputs.name}"`,
        data: { offerId: o.id, discountRequestId: DEMO_DISCOUNT_REQUEST_ID },
        actorUserId: rep2.id,
        createdAt,
      });
    }
  }
}
