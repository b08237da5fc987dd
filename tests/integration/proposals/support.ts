// Set-up for the proposal tests: a company with its people, catalog, price book, rate plan and
// weather station, and deals with bills, a design and offers, all written through the app's own
// modules. Tokens and codes are read from the dev outbox, as the customer would read them.
import { mkdtemp, readFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import sharp from "sharp";
import { expect } from "vitest";
import { startMailFake, type MailFake } from "@/fakes/mail-server";
import type { Member } from "@/server/session";
import { addMember, newCompany, uniqueEmail, newUtility } from "../support/fixtures";

/** A private dev outbox when the suite runs alone (before anything reads the configuration). */
export async function startMailIfNeeded(): Promise<MailFake | null> {
  if (process.env.KW_TEST_MAIL_URL) return null;
  const fake = await startMailFake({ port: 0, dataDir: await mkdtemp(path.join(tmpdir(), "kw-proposals-mail-")), apiKey: process.env.RESEND_API_KEY ?? "re_test123" });
  process.env.KW_TEST_MAIL_URL = fake.url;
  process.env.RESEND_BASE_URL = fake.url;
  return fake;
}

export type Mail = { subject: string; html: string | null; text: string | null; to: string[] };

export async function mailTo(to: string): Promise<Mail[]> {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}&limit=50`, {
    headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}` },
  });
  return ((await res.json()) as { data: Mail[] }).data;
}

/** The token in the newest proposal link e-mailed to `to`. */
export async function latestToken(to: string): Promise<string> {
  const mails = await mailTo(to);
  const link = mails.find((m) => /solar proposal/.test(m.subject));
  const token = link?.html?.match(/\/p\/([A-Za-z0-9_-]{43})/)?.[1];
  if (!token) throw new Error(`no proposal link e-mailed to ${to}`);
  return token;
}

/** The newest signing code e-mailed to `to`. */
export async function latestCode(to: string): Promise<string> {
  const mails = await mailTo(to);
  const code = mails.find((m) => /signing code/.test(m.subject))?.subject.match(/(\d{6})/)?.[1];
  if (!code) throw new Error(`no signing code e-mailed to ${to}`);
  return code;
}

/**
 * The homeowner's browser. Each test file (vitest loads this module once per file) gets its own
 * address from the IPv6 documentation range (RFC 3849), so the per-address limits (20 signing
 * codes an hour) count one file's requests, not the whole run's.
 */
export const client = { ip: `2001:db8::${crypto.randomUUID().slice(0, 4)}:${crypto.randomUUID().slice(0, 4)}`, userAgent: "vitest proposal tests" };

/** A small drawn signature as the browser sends it: a PNG data URL. */
export async function signatureDataUrl(): Promise<string> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="300" height="100"><path d="M10 70 C 60 10, 90 90, 140 40 S 220 80, 290 30" stroke="#1F2933" stroke-width="3" fill="none"/></svg>`;
  const png = await sharp(Buffer.from(svg)).png().toBuffer();
  return `data:image/png;base64,${png.toString("base64")}`;
}

export type World = { owner: Member; rep: Member; rep2: Member; office: Member; moduleId: string; inverterId: string; ratePlanId: string };

export async function newWorld(name: string): Promise<World> {
  const { createStation } = await import("@/server/weather-stations");
  const { createModule, createInverter } = await import("@/server/catalog");
  const { savePriceBook } = await import("@/server/price-book");
  const { createRatePlan } = await import("@/server/rate-plans");
  const owner = await newCompany(name);
  const rep = await addMember(owner, "sales_rep", "Rhea Rep");
  const rep2 = await addMember(owner, "sales_rep", "Rory Otherrep");
  const office = await addMember(owner, "office_manager", "Otto Office");
  const bytes = new Uint8Array(await readFile(path.join(process.cwd(), "src/engine/data/tmy3-723170-greensboro-nc.csv")));
  await createStation(owner, { bytes, fileName: "greensboro.csv" }, { format: "auto" } as Parameters<typeof createStation>[2]);
  const moduleId = (
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
  const inverterId = (
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
    adders: [],
    lineItems: [],
    discountLimits: { sales_rep: { maxCents: 50_000, maxPct: null }, office_manager: { maxCents: 200_000, maxPct: null } },
    incentives: [
      {
        id: "test-rebate",
        name: "Test county rebate",
        source: "local",
        amount: { kind: "fixed", amountCents: 100_000 },
        startDate: "2020-01-01",
        endDate: "2099-12-31",
        timing: "upfront",
        eligibility: {},
      },
    ],
    deposit: { kind: "percent", pct: 10, minCents: 50_000, maxCents: 150_000 },
  });
  const ratePlanId = (
    await createRatePlan(owner, {
      utilityId: await newUtility(owner),
      active: true,
      plan: { name: "Flat test", fixedMonthlyCents: 1000, energy: { kind: "flat", centsPerKwh: 14 }, compensation: { kind: "net-metering" } },
    })
  ).id;
  return { owner, rep, rep2, office, moduleId, inverterId, ratePlanId };
}

export type TestDeal = { dealId: string; email: string; cashOfferId: string; loanOfferId: string };

/** The household's service panel (the electrical checks need its ratings before a proposal can be sent). */
export async function setServicePanel(rep: Member, dealId: string, panel: { serviceBusbarA: number | null; serviceMainBreakerA: number | null; serviceVoltageV: 240 | 208 | null } = { serviceBusbarA: 200, serviceMainBreakerA: 200, serviceVoltageV: 240 }): Promise<void> {
  const { updateServicePanel } = await import("@/server/electrical");
  const { openDeal } = await import("@/server/deal-scope");
  await updateServicePanel(await openDeal(rep, dealId), panel);
}

/** A deal owned by `rep` with a year of bills, a design and two offers (cash, loan). */
export async function newDeal(w: World, rep: Member = w.rep): Promise<TestDeal> {
  const { createLead } = await import("@/server/deals");
  const { saveBills } = await import("@/server/energy");
  const { openDeal } = await import("@/server/deal-scope");
  const { saveDesign } = await import("@/server/designs");
  const { createOffer } = await import("@/server/offers");
  const email = uniqueEmail("home");
  const { dealId } = await createLead(rep, {
    name: "Testwell household",
    contactName: "Tess Testwell",
    email,
    street: "1 Test Lane",
    city: "Greensboro",
    region: "NC",
    postalCode: "27405",
    latitude: 36.1,
    longitude: -79.8,
    source: "Website",
    ratePlanId: w.ratePlanId,
  } as Parameters<typeof createLead>[1]);
  await setServicePanel(rep, dealId);
  const kwh = [1100, 950, 850, 700, 800, 1100, 1300, 1250, 1000, 750, 800, 1050];
  const bills = kwh.map((k, m) => ({
    periodStart: new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10),
    periodEnd: new Date(Date.UTC(2025, m + 1, 0)).toISOString().slice(0, 10),
    kwh: k,
    costCents: null,
  }));
  await saveBills(await openDeal(rep, dealId), { bills } as Parameters<typeof saveBills>[1]);
  await saveDesign(rep, {
    dealId,
    document: {
      moduleId: w.moduleId,
      inverterId: w.inverterId,
      faces: [
        { id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 16, solarAccessPct: 95, moduleCount: 14 },
        { id: "west", name: "West", tiltDeg: 25, azimuthDeg: 270, usableSlots: 10, solarAccessPct: 90, moduleCount: 6 },
      ],
      weather: { kind: "nearest" },
      stringPlan: { stringSizes: [10, 10], lowestTempC: -10, highestTempC: 35 },
    },
  });
  const cash = await createOffer(rep, { dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } });
  const loan = await createOffer(rep, { dealId, inputs: { name: "Whole roof, loan", payment: { kind: "loan", aprPct: 4.5, termMonths: 240, dealerFeePct: 0 } } });
  return { dealId, email, cashOfferId: cash.id, loanOfferId: loan.id };
}

/** Expects the promise to fail with an HttpError of `status`; returns it. */
export async function rejection(promise: Promise<unknown>, status: number): Promise<{ code: string; message: string; fields?: Record<string, string[]> }> {
  const { HttpError } = await import("@/server/errors");
  const err = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err, "expected an HttpError").toBeInstanceOf(HttpError);
  const e = err as InstanceType<typeof HttpError>;
  expect(e.status, e.message).toBe(status);
  return { code: e.code, message: e.message, fields: e.fields };
}
