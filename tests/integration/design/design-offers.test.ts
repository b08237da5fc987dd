// Design and offers against a real MariaDB: design validation, offers recomputed on the server,
// discounts beyond the rep's limit (request, e-mail, decision), roles and tenancy.
import { mkdtemp, readFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { discountRequest, offer, timelineEvent } from "@/db/schema";
import { startMailFake, type MailFake } from "@/fakes/mail-server";
import type { DesignDocumentInput } from "@/lib/schemas/design";
import { companySettingsSchema, DEFAULT_FINANCE, DEFAULT_STALL_SETTINGS } from "@/lib/schemas/company-settings";
import { offerInputsSchema, type OfferInputsInput } from "@/lib/schemas/offer";
import { updateCompanySettings } from "@/server/company-settings";
import type { Member } from "@/server/session";
import { addMember, newCompany, rejects, uniqueEmail, newUtility } from "../support/fixtures";
import { openDeal } from "@/server/deal-scope";

let fake: MailFake | null = null;
let owner: Member;
let rep: Member;
let office: Member;
let office2: Member;
let other: Member;
let dealId: string;
let moduleId: string;
let inverterId: string;
let ratePlanId: string;

type Server = {
  designs: typeof import("@/server/designs");
  offers: typeof import("@/server/offers");
  errors: typeof import("@/server/errors");
  db: typeof import("@/server/db");
};
let s: Server;


async function mailTo(to: string): Promise<{ subject: string; text: string | null }[]> {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}`, {
    headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}` },
  });
  return ((await res.json()) as { data: { subject: string; text: string | null }[] }).data;
}

const faces = [
  { id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 16, solarAccessPct: 95, moduleCount: 14 },
  { id: "west", name: "West", tiltDeg: 25, azimuthDeg: 270, usableSlots: 10, solarAccessPct: 90, moduleCount: 6 },
];
const designDoc = (): DesignDocumentInput => ({ moduleId, inverterId, faces, weather: { kind: "nearest" }, stringPlan: null });
const cashOffer = (over: Partial<OfferInputsInput> = {}): OfferInputsInput => ({ name: "Whole roof, cash", payment: { kind: "cash" }, ...over });

beforeAll(async () => {
  if (!process.env.KW_TEST_MAIL_URL) {
    // Run alone: a private dev outbox on a free port, before anything reads the configuration.
    fake = await startMailFake({ port: 0, dataDir: await mkdtemp(path.join(tmpdir(), "kw-design-mail-")), apiKey: process.env.RESEND_API_KEY ?? "re_test123" });
    process.env.KW_TEST_MAIL_URL = fake.url;
    process.env.RESEND_BASE_URL = fake.url;
  }
  s = { designs: await import("@/server/designs"), offers: await import("@/server/offers"), errors: await import("@/server/errors"), db: await import("@/server/db") };
  const { createStation } = await import("@/server/weather-stations");
  const { createModule, createInverter } = await import("@/server/catalog");
  const { savePriceBook } = await import("@/server/price-book");
  const { createRatePlan } = await import("@/server/rate-plans");
  const { createLead } = await import("@/server/deals");
  const { saveBills } = await import("@/server/energy");

  owner = await newCompany("Design Test Solar");
  rep = await addMember(owner, "sales_rep", "Rhea Rep");
  office = await addMember(owner, "office_manager", "Otto Office");
  office2 = await addMember(owner, "office_manager", "Olga Office");
  other = await newCompany("Elsewhere Solar");

  const bytes = new Uint8Array(await readFile(path.join(process.cwd(), "src/engine/data/tmy3-723170-greensboro-nc.csv")));
  await createStation(owner, { bytes, fileName: "greensboro.csv" }, { format: "auto" } as Parameters<typeof createStation>[2]);
  moduleId = (
    await createModule(owner, {
      manufacturer: "Testline",
      model: "TL-400",
      stcWatts: 400,
      vocV: 37.5,
      iscA: 13.6,
      vmpV: 31.3,
      impA: 12.78,
      gammaPmaxPctPerC: -0.3,
      betaVocPctPerC: -0.25,
      lengthMm: 1722,
      widthMm: 1134,
      cellTechnology: "topcon",
      construction: "glass_glass",
      encapsulant: "POE",
    })
  ).id;
  inverterId = (
    await createInverter(owner, {
      kind: "string",
      manufacturer: "Testline",
      model: "TI-7600",
      acWatts: 7600,
      efficiencyPct: 97.5,
      maxDcVoltageV: 600,
      mpptMinV: 200,
      mpptMaxV: 480,
      maxInputCurrentA: 20,
      mpptCount: 2,
    } as Parameters<typeof createInverter>[1])
  ).id;
  await savePriceBook(owner, {
    version: 1,
    bands: [{ minWatts: 0, maxWatts: null, centsPerWattDc: 300 }],
    adders: [{ id: "steep", name: "Steep roof", kind: "per_watt", centsPerWattDc: 10 }],
    lineItems: [],
    discountLimits: { sales_rep: { maxCents: 50_000, maxPct: null }, office_manager: { maxCents: 200_000, maxPct: null } },
    incentives: [],
    deposit: { kind: "fixed", amountCents: 50_000 },
  });
  ratePlanId = (
    await createRatePlan(owner, {
      utilityId: await newUtility(owner),
      active: true,
      plan: { name: "Flat test", fixedMonthlyCents: 1000, energy: { kind: "flat", centsPerKwh: 14 }, compensation: { kind: "net-metering" } },
    })
  ).id;
  dealId = (
    await createLead(rep, {
      name: "Testwell household",
      contactName: "Tess Testwell",
      email: uniqueEmail("home"),
      street: "1 Test Lane",
      city: "Greensboro",
      region: "NC",
      postalCode: "27405",
      latitude: 36.1,
      longitude: -79.8,
      source: "Website",
      ratePlanId,
    } as Parameters<typeof createLead>[1])
  ).dealId;
  const bills = Array.from({ length: 12 }, (_, m) => {
    const start = new Date(Date.UTC(2025, m, 1));
    const end = new Date(Date.UTC(2025, m + 1, 0));
    return { periodStart: start.toISOString().slice(0, 10), periodEnd: end.toISOString().slice(0, 10), kwh: [1100, 950, 850, 700, 800, 1100, 1300, 1250, 1000, 750, 800, 1050][m], costCents: null };
  });
  await saveBills(await openDeal(rep, dealId), { bills } as Parameters<typeof saveBills>[1]);
}, 120_000);

afterAll(async () => {
  await fake?.close();
});

describe("design", () => {
  it("refuses a bad tilt, naming the field, and saves nothing", async () => {
    const bad = { ...designDoc(), faces: [{ ...faces[0], tiltDeg: 95 }] };
    const err = await rejects(s.designs.saveDesign(rep, { dealId, document: bad }), 422);
    expect(err.fields?.["document.faces.0.tiltDeg"]?.[0]).toMatch(/Tilt must be 0–90°/);
    expect(await s.designs.getDesignForDeal(await openDeal(rep, dealId))).toBeNull();
  });

  it("refuses more modules than slots and equipment of another company", async () => {
    const tooMany = { ...designDoc(), faces: [{ ...faces[0], moduleCount: 17 }] };
    const err = await rejects(s.designs.saveDesign(rep, { dealId, document: tooMany }), 422);
    expect(err.fields?.["document.faces.0.moduleCount"]).toBeDefined();
    const foreign = await rejects(s.designs.saveDesign(other, { dealId, document: designDoc() }), 404);
    expect(foreign.code).toBe("not_found");
  });

  it("saves, records a timeline event, and reads back by id with tenancy", async () => {
    const saved = await s.designs.saveDesign(rep, { dealId, document: designDoc() });
    expect(saved.document.faces).toHaveLength(2);
    const again = await s.designs.getDesignOrThrow(rep, saved.id);
    expect(again.dealId).toBe(dealId);
    await rejects(s.designs.getDesignOrThrow(other, saved.id), 404);
    const events = await s.db.db().select().from(timelineEvent).where(and(eq(timelineEvent.dealId, dealId), eq(timelineEvent.kind, "design.saved")));
    expect(events.length).toBe(1);
  });

  it("gives the Design tab its inputs: usage, catalog and the nearest station", async () => {
    const inputs = await s.designs.getDesignInputs(await openDeal(rep, dealId));
    expect(inputs.usage.annualKwh).toBeGreaterThan(10_000);
    expect(inputs.nearest?.distanceKm).toBeLessThan(50);
    const weather = await s.designs.getWeatherColumns(await openDeal(rep, dealId), inputs.nearest?.stationId ?? "");
    expect(weather.ghi).toHaveLength(8760);
  });
});

describe("offers", () => {
  let offerId: string;

  it("computes the figures on the server and ignores figures sent by the client", async () => {
    const sneaky = { dealId, inputs: cashOffer(), results: { summary: { contractCents: 1 } } };
    const created = await s.offers.createOffer(rep, sneaky);
    offerId = created.id;
    // 20 × 400 W = 8,000 W × 300 ¢/W = $24,000.
    expect(created.results.summary.contractCents).toBe(2_400_000);
    expect(created.results.summary.kwDc).toBe(8);
    expect(created.results.summary.annualProductionKwh).toBeGreaterThan(8_000);
    expect(created.results.summary.year1SavingsCents).toBeGreaterThan(0);
    expect(created.results.rows).toHaveLength(26);
    expect(created.discountStatus).toBe("none");
  });

  it("previews unsaved inputs with the figures a save stores, writing nothing", async () => {
    const saved = await s.offers.getOfferOrThrow(rep, offerId);
    const offersBefore = await s.db.db().select({ id: offer.id }).from(offer).where(eq(offer.dealId, dealId));
    const preview = await s.offers.previewOffer(rep, { dealId, inputs: offerInputsSchema.parse(cashOffer()) });
    expect(preview.summary).toEqual(saved.results.summary);
    expect(preview.discountNeedsApproval).toBe(false);

    // Beyond the rep's limit: flagged in the preview, and no request is made until a save.
    const big = await s.offers.previewOffer(rep, { dealId, inputs: offerInputsSchema.parse(cashOffer({ discountCents: 150_000 })) });
    expect(big.summary.contractCents).toBe(saved.results.summary.contractCents - 150_000);
    expect(big.discountNeedsApproval).toBe(true);
    expect(await s.db.db().select({ id: discountRequest.id }).from(discountRequest).where(eq(discountRequest.dealId, dealId))).toEqual([]);
    expect(await s.db.db().select({ id: offer.id }).from(offer).where(eq(offer.dealId, dealId))).toEqual(offersBefore);
    expect((await s.offers.getOfferOrThrow(rep, offerId)).results).toEqual(saved.results);

    await rejects(s.offers.previewOffer(other, { dealId, inputs: offerInputsSchema.parse(cashOffer()) }), 404);
  });

  it("recomputes on update from its own face counts", async () => {
    const updated = await s.offers.updateOffer(rep, offerId, { inputs: cashOffer({ faceCounts: [{ faceId: "south", moduleCount: 16 }, { faceId: "west", moduleCount: 0 }] }) });
    expect(updated.results.summary.moduleCount).toBe(16);
    expect(updated.results.summary.contractCents).toBe(1_920_000);
  });

  it("turns a discount beyond the rep's limit into a pending request mailed to the office manager", async () => {
    const err = await rejects(s.offers.updateOffer(rep, offerId, { inputs: cashOffer({ discountCents: 150_000 }) }), 422);
    expect(err.fields?.["inputs.discountReason"]).toBeDefined();
    const updated = await s.offers.updateOffer(rep, offerId, { inputs: cashOffer({ discountCents: 150_000, discountReason: "Matching a neighbour's quote" }) });
    expect(updated.discountStatus).toBe("pending");
    const [request] = await s.db.db().select().from(discountRequest).where(and(eq(discountRequest.offerId, offerId), eq(discountRequest.companyId, owner.companyId)));
    expect(request.status).toBe("pending");
    expect(request.amountCents).toBe(150_000);
    const mails = await mailTo(office.email);
    expect(mails[0]?.subject).toMatch(/Discount to review: \$1,500/);
    const pending = await s.offers.listPendingDiscountRequests(office);
    expect(pending.map((p) => p.id)).toContain(request.id);
  });

  it("figures offers with the company's savings assumptions from the next save; a saved offer keeps its figures", async () => {
    const before = await s.offers.getOfferOrThrow(rep, offerId);
    expect(before.results.assumptions).toMatchObject(DEFAULT_FINANCE);
    const settings = (finance?: Record<string, string>) =>
      companySettingsSchema.parse({ name: "Design Test Solar", licenseNumber: "", timeZone: "America/New_York", stallDays: DEFAULT_STALL_SETTINGS, finance });
    await updateCompanySettings(owner, settings({ years: "20", degradationPctPerYear: "1", utilityEscalationPctPerYear: "4", discountRatePct: "6" }));
    try {
      expect((await s.offers.getOfferOrThrow(rep, offerId)).results).toEqual(before.results);
      const again = await s.offers.updateOffer(rep, offerId, { inputs: before.inputs });
      expect(again.results.assumptions).toMatchObject({ years: 20, degradationPctPerYear: 1, utilityEscalationPctPerYear: 4, discountRatePct: 6 });
      expect(again.results.rows).toHaveLength(21); // year 0 and 20 years
      // Same system and price; output falls 1 %/yr instead of 0.5 %, prices rise 4 % instead of 2.5 %.
      expect(again.results.summary.contractCents).toBe(before.results.summary.contractCents);
      expect(again.results.summary.year1SavingsCents).toBe(before.results.summary.year1SavingsCents);
      expect(again.results.rows[10].savingsCents).toBeGreaterThan(before.results.rows[10].savingsCents);
    } finally {
      await updateCompanySettings(owner, settings(Object.fromEntries(Object.entries(DEFAULT_FINANCE).map(([k, v]) => [k, String(v)]))));
    }
    const restored = await s.offers.updateOffer(rep, offerId, { inputs: before.inputs });
    expect(restored.results.summary).toEqual(before.results.summary);
  });

  it("a rep cannot decide a discount; another company cannot see it", async () => {
    const [request] = await s.db.db().select().from(discountRequest).where(eq(discountRequest.offerId, offerId));
    await rejects(s.offers.decideDiscountRequest(rep, request.id, { decision: "approve", note: "" }), 403);
    await rejects(s.offers.getDiscountRequestOrThrow(other, request.id), 404);
    await rejects(s.offers.getOfferOrThrow(other, offerId), 404);
  });

  it("the office manager approves: status approved and the rep gets an e-mail", async () => {
    const [request] = await s.db.db().select().from(discountRequest).where(eq(discountRequest.offerId, offerId));
    const decided = await s.offers.decideDiscountRequest(office, request.id, { decision: "approve", note: "OK for a referral" });
    expect(decided.status).toBe("approved");
    const [row] = await s.db.db().select().from(offer).where(eq(offer.id, offerId));
    expect(row.discountStatus).toBe("approved");
    const mails = await mailTo(rep.email);
    expect(mails[0]?.subject).toMatch(/Discount approved/);
    await rejects(s.offers.decideDiscountRequest(office, request.id, { decision: "decline", note: "too late" }), 409);
  });

  it("a declined discount prices the offer again without it", async () => {
    const second = await s.offers.createOffer(rep, { dealId, inputs: cashOffer({ name: "Loan", payment: { kind: "loan", aprPct: 6.99, termMonths: 240, dealerFeePct: 0 }, discountCents: 90_000, discountReason: "Slow season" }) });
    expect(second.discountStatus).toBe("pending");
    expect(second.results.summary.monthlyLoanPaymentCents).toBeGreaterThan(0);
    const [request] = await s.db.db().select().from(discountRequest).where(and(eq(discountRequest.offerId, second.id), eq(discountRequest.status, "pending")));
    await s.offers.decideDiscountRequest(office, request.id, { decision: "decline", note: "Not this month" });
    const after = await s.offers.getOfferOrThrow(rep, second.id);
    expect(after.discountStatus).toBe("declined");
    expect(after.results.summary.discountCents).toBe(0);
    expect((await mailTo(rep.email))[0]?.subject).toMatch(/Discount declined/);
  });

  it("a discount above an office manager's own limit is decided only by an owner or admin, and only theirs show it on Today", async () => {
    // The office managers' limit is $2,000; the rep asks $2,500.
    const asked = await s.offers.updateOffer(rep, offerId, { inputs: cashOffer({ discountCents: 250_000, discountReason: "Two neighbours signing together" }) });
    expect(asked.discountStatus).toBe("pending");
    const [request] = await s.db.db().select().from(discountRequest).where(and(eq(discountRequest.offerId, offerId), eq(discountRequest.status, "pending")));
    const err = await rejects(s.offers.decideDiscountRequest(office, request.id, { decision: "approve", note: "" }), 403);
    expect(err.code).toBe("not_your_decision");
    expect(err.message).toMatch(/above your own limit of \$2,000\.00/);
    expect((await s.offers.listPendingDiscountRequests(office)).map((r) => r.id)).not.toContain(request.id);
    expect((await s.offers.listPendingDiscountRequests(owner)).map((r) => r.id)).toContain(request.id);
    const mails = await mailTo(owner.email);
    expect(mails[0]?.subject).toMatch(/Discount to review: \$2,500/);
    expect((await mailTo(office.email)).some((m) => /\$2,500/.test(m.subject))).toBe(false);
    expect((await s.offers.decideDiscountRequest(owner, request.id, { decision: "approve", note: "" })).status).toBe("approved");
  });

  it("nobody decides their own discount: an office manager's over-limit request goes to an owner", async () => {
    const asked = await s.offers.updateOffer(office, offerId, { inputs: cashOffer({ discountCents: 260_000, discountReason: "Storm damage credit" }) });
    expect(asked.discountStatus).toBe("pending");
    const [request] = await s.db.db().select().from(discountRequest).where(and(eq(discountRequest.offerId, offerId), eq(discountRequest.status, "pending")));
    expect(request.requestedByUserId).toBe(office.userId);
    const own = await rejects(s.offers.decideDiscountRequest(office, request.id, { decision: "approve", note: "" }), 403);
    expect(own.message).toMatch(/You asked for this discount, so someone else decides it/);
    // Another office manager has the same, lower limit.
    await rejects(s.offers.decideDiscountRequest(office2, request.id, { decision: "approve", note: "" }), 403);
    for (const m of [office, office2]) expect((await s.offers.listPendingDiscountRequests(m)).map((r) => r.id)).not.toContain(request.id);
    expect((await s.offers.listPendingDiscountRequests(owner)).map((r) => r.id)).toContain(request.id);
    expect((await s.offers.decideDiscountRequest(owner, request.id, { decision: "decline", note: "Not this one" })).status).toBe("declined");
  });

  it("a loan takes a down payment: refused below the deposit on its field, kept with the offer, off the loan amount and in year 0", async () => {
    const loan = (downPaymentCents: number | null): OfferInputsInput => cashOffer({ name: "Loan with money down", payment: { kind: "loan", aprPct: 0, termMonths: 120, dealerFeePct: 0, downPaymentCents } });
    const low = await rejects(s.offers.createOffer(rep, { dealId, inputs: loan(20_000) }), 422);
    expect(low.fields?.["inputs.payment.downPaymentCents"]?.[0]).toMatch(/\$500(\.00)? deposit is paid at signing/);
    const created = await s.offers.createOffer(rep, { dealId, inputs: loan(500_000) });
    // 20 × 400 W × 300 ¢/W = $24,000; no incentives: $24,000 − $5,000 down = $19,000 borrowed at 0 % over 120 months.
    expect(created.results.summary).toMatchObject({ downPaymentCents: 500_000, loanAmountCents: 1_900_000, monthlyLoanPaymentCents: Math.round(1_900_000 / 120) });
    expect(created.results.rows[0]).toMatchObject({ year: 0, systemPaymentCents: 500_000, cashFlowCents: -500_000 });
    const read = await s.offers.getOfferOrThrow(rep, created.id);
    expect(read.inputs.payment).toMatchObject({ kind: "loan", downPaymentCents: 500_000 });
    expect(read.stale).toEqual([]);
    // Empty: the deposit at signing.
    const updated = await s.offers.updateOffer(rep, created.id, { inputs: loan(null) });
    expect(updated.results.summary).toMatchObject({ downPaymentCents: 50_000, loanAmountCents: 2_350_000 });
    await s.offers.deleteOffer(rep, created.id);
  });

  it("keeps to three offers a deal", async () => {
    await s.offers.createOffer(rep, { dealId, inputs: cashOffer({ name: "Third" }) });
    const err = await rejects(s.offers.createOffer(rep, { dealId, inputs: cashOffer({ name: "Fourth" }) }), 409);
    expect(err.code).toBe("too_many_offers");
  });
});
