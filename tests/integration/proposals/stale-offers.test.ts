// An offer records what it was computed from; a proposal freezes only offers whose inputs are
// all current, and its snapshot (and so every page of its PDF) shows the usage the offers'
// savings were figured with. Real MariaDB, real PDF.
import { extractText } from "unpdf";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { MailFake } from "@/fakes/mail-server";
import { companySettingsSchema, DEFAULT_FINANCE, DEFAULT_STALL_SETTINGS } from "@/lib/schemas/company-settings";
import { newDeal, newWorld, rejection, startMailIfNeeded, type TestDeal, type World } from "./support";

let fake: MailFake | null = null;
let w: World;

type Mods = {
  scope: typeof import("@/server/deal-scope");
  energy: typeof import("@/server/energy");
  offers: typeof import("@/server/offers");
  designs: typeof import("@/server/designs");
  proposals: typeof import("@/server/proposals");
  priceBook: typeof import("@/server/price-book");
  ratePlans: typeof import("@/server/rate-plans");
  settings: typeof import("@/server/company-settings");
};
let m: Mods;

beforeAll(async () => {
  fake = await startMailIfNeeded();
  m = {
    scope: await import("@/server/deal-scope"),
    energy: await import("@/server/energy"),
    offers: await import("@/server/offers"),
    designs: await import("@/server/designs"),
    proposals: await import("@/server/proposals"),
    priceBook: await import("@/server/price-book"),
    ratePlans: await import("@/server/rate-plans"),
    settings: await import("@/server/company-settings"),
  };
  w = await newWorld("Stale Offer Solar");
}, 180_000);

afterAll(async () => {
  await fake?.close();
});

/** A year of monthly bills, each month's kWh times `factor`. */
function bills(factor: number) {
  const kwh = [1100, 950, 850, 700, 800, 1100, 1300, 1250, 1000, 750, 800, 1050];
  return kwh.map((k, i) => ({
    periodStart: new Date(Date.UTC(2025, i, 1)).toISOString().slice(0, 10),
    periodEnd: new Date(Date.UTC(2025, i + 1, 0)).toISOString().slice(0, 10),
    kwh: Math.round(k * factor),
    costCents: null,
  }));
}

const stale = async (d: TestDeal) => (await m.offers.listOffers(await m.scope.openDeal(w.rep, d.dealId))).map((o) => [o.name, o.stale]);
const send = (d: TestDeal) => m.proposals.sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, validDays: 30 });
const recomputeAll = async (d: TestDeal) => {
  for (const o of await m.offers.listOffers(await m.scope.openDeal(w.rep, d.dealId))) await m.offers.updateOffer(w.rep, o.id, { inputs: o.inputs });
};
const int = (s: string) => Number(s.replaceAll(",", ""));

describe("the freeze rule", () => {
  it("refuses offers computed before the bills changed (409 naming them and the usage) until they are recomputed; the PDF shows one usage on every page", async () => {
    const d = await newDeal(w);
    const before = await m.energy.getDealUsage(await m.scope.openDeal(w.rep, d.dealId));
    expect(await stale(d)).toEqual([
      ["Whole roof, cash", []],
      ["Whole roof, loan", []],
    ]);

    // The bills change after the offers were computed: the stored year is rebuilt with a new version.
    await m.energy.saveBills(await m.scope.openDeal(w.rep, d.dealId), { bills: bills(1.5) });
    const after = await m.energy.getDealUsage(await m.scope.openDeal(w.rep, d.dealId));
    expect(after.version).toBe(before.version + 1);
    expect(after.annualKwh).toBeGreaterThan(before.annualKwh * 1.4);
    expect(await stale(d)).toEqual([
      ["Whole roof, cash", ["usage"]],
      ["Whole roof, loan", ["usage"]],
    ]);
    const refused = await rejection(send(d), 409);
    expect(refused.code).toBe("offers_stale");
    expect(refused.message).toMatch(/^Recompute these offers: "Whole roof, cash" \(usage \(bills or interval data\) changed\); "Whole roof, loan" \(usage/);

    // One recomputed offer is not enough when both are chosen; choosing only it is.
    const [cash, loan] = await m.offers.listOffers(await m.scope.openDeal(w.rep, d.dealId));
    await m.offers.updateOffer(w.rep, cash.id, { inputs: cash.inputs });
    expect((await rejection(send(d), 409)).message).toMatch(/^Recompute these offers: "Whole roof, loan"/);
    await m.offers.updateOffer(w.rep, loan.id, { inputs: loan.inputs });
    const sent = await send(d);

    const p = await m.proposals.getProposalOrThrow(w.rep, sent.id);
    const offers = await m.offers.listOffers(await m.scope.openDeal(w.rep, d.dealId));
    expect(p.snapshot.usage.monthlyKwh).toEqual(offers[0].basis?.usage.monthlyKwh.map((v) => Math.round(v * 10) / 10));
    for (const o of p.snapshot.offers) expect(o.figures.monthly.usageKwh.reduce((a, b) => a + b, 0)).toBeCloseTo(after.annualKwh, 0);

    // Every page of the PDF that names the usage names the same year (the new bills).
    const pdf = await m.proposals.readProposalPdf(p, "unsigned");
    const { text: pages } = await extractText(pdf.slice(), { mergePages: false });
    const annual = pages.flatMap((t) => [...t.matchAll(/Annual usage\s+([\d,]+) kWh/g)].map((x) => int(x[1])));
    const sentence = pages.flatMap((t) => [...t.matchAll(/Usage: (?:utility bills \()?([\d,]+) kWh a year/g)].map((x) => int(x[1])));
    const offerRows = pages.flatMap((t) => [...t.matchAll(/Usage kWh((?:\s+[\d,]+){12})/g)].map((x) => x[1].trim().split(/\s+/).map(int).reduce((a, b) => a + b, 0)));
    expect(annual.length, "the energy page's annual usage").toBeGreaterThan(0);
    expect(sentence.length, "the assumptions' usage sentences").toBeGreaterThan(1);
    expect(offerRows.length, "each offer's monthly usage row").toBe(2);
    for (const kwh of [...annual, ...sentence]) expect(kwh).toBe(Math.round(after.annualKwh));
    // Twelve rounded months add up to the year within 12 kWh.
    for (const kwh of offerRows) expect(Math.abs(kwh - after.annualKwh)).toBeLessThanOrEqual(12);
  });

  it("names each other input that changed: design, rate plan, price book, incentive rules, savings assumptions", async () => {
    const d = await newDeal(w);
    const scope = () => m.scope.openDeal(w.rep, d.dealId);

    const design = await m.designs.getDesignForDeal(await scope());
    if (!design) throw new Error("newDeal saves a design");
    await m.designs.saveDesign(w.rep, { dealId: d.dealId, document: { ...design.document, lossesPct: 12 } });
    expect((await stale(d)).map(([, s]) => s)).toEqual([["design"], ["design"]]);
    expect((await rejection(send(d), 409)).message).toMatch(/"Whole roof, cash" \(design changed\)/);
    await recomputeAll(d);

    const plan = await m.ratePlans.getRatePlanOrThrow(w.owner.companyId, w.ratePlanId);
    await m.ratePlans.updateRatePlan(w.owner, w.ratePlanId, { utilityId: plan.utilityId, active: true, plan: { ...plan.plan, fixedMonthlyCents: 1200 } });
    expect((await stale(d)).map(([, s]) => s)).toEqual([["rate_plan"], ["rate_plan"]]);
    expect((await rejection(send(d), 409)).message).toMatch(/\(rate plan changed\)/);
    await recomputeAll(d);

    const book = (await m.priceBook.getPriceBookRecord(w.owner.companyId))?.document;
    if (!book) throw new Error("newWorld saves a price book");
    await m.priceBook.savePriceBook(w.owner, { ...book, bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 310 }] });
    expect((await stale(d)).map(([, s]) => s)).toEqual([["price_book"], ["price_book"]]);
    expect((await rejection(send(d), 409)).message).toMatch(/\(price book changed\)/);
    await recomputeAll(d);

    await m.priceBook.savePriceBook(w.owner, { ...book, bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 310 }], incentives: book.incentives.map((r) => ({ ...r, endDate: "2098-12-31" })) });
    expect((await stale(d)).map(([, s]) => s)).toEqual([["incentives"], ["incentives"]]);
    expect((await rejection(send(d), 409)).message).toMatch(/\(incentive rules changed\)/);
    await recomputeAll(d);

    const settings = (finance: Record<string, string>) =>
      companySettingsSchema.parse({ name: "Stale Offer Solar", licenseNumber: "", timeZone: "America/New_York", stallDays: DEFAULT_STALL_SETTINGS, finance });
    const defaults = Object.fromEntries(Object.entries(DEFAULT_FINANCE).map(([k, v]) => [k, String(v)]));
    // Saving the same assumptions again changes nothing.
    await m.settings.updateCompanySettings(w.owner, settings(defaults));
    expect((await stale(d)).map(([, s]) => s)).toEqual([[], []]);
    await m.settings.updateCompanySettings(w.owner, settings({ ...defaults, utilityEscalationPctPerYear: "4.5" }));
    expect((await stale(d)).map(([, s]) => s)).toEqual([["assumptions"], ["assumptions"]]);
    expect((await rejection(send(d), 409)).message).toMatch(/\(savings assumptions changed\)/);
    await recomputeAll(d);

    expect((await send(d)).version).toBe(1);
  });
});
