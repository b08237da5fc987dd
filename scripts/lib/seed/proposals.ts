// Demo proposals: the "proposal out" deal (Dunmore) has its cash offer sent, opened and asked
// about (its loan offer waits for a discount decision, so it stays out); every deal from Signed
// onward has a signed proposal with its stamped PDF, certificate and events, built from the
// deal's seeded design, bills, catalog, rate plan and price book through the same snapshot
// builder the app uses (src/lib/proposal-snapshot.ts). The Galloway deal shows a replaced first
// version. Link tokens are random and not kept: "Re-send link" on the Proposal tab e-mails a
// working one to the dev outbox.
import { createHash, randomBytes } from "node:crypto";
import { readFile } from "node:fs/promises";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { and, asc, eq } from "drizzle-orm";
import sharp from "sharp";
import {
  bill,
  company,
  deal,
  design,
  household,
  inverterModel,
  moduleModel,
  offer,
  priceBook,
  proposal,
  proposalEvent,
  ratePlan,
  timelineEvent,
  user,
  utility,
} from "../../../src/db/schema";
import { renderProposalPdf } from "../../../src/documents/proposal-pdf";
import { stampSignedPdf } from "../../../src/documents/signed-pdf";
import { usageFromBills } from "../../../src/engine/bills";
import { spreadMonthlyToHourly } from "../../../src/engine/load-shape";
import { estimateProduction } from "../../../src/engine/production";
import { ratePlanSchema } from "../../../src/engine/rates";
import { siteTimeZone } from "../../../src/engine/site-time-zone";
import { parseWeather, type WeatherYear } from "../../../src/engine/weather";
import { cancelDeadline } from "../../../src/lib/business-days";
import { formatCents } from "../../../src/lib/format";
import { computeOfferFigures, engineSystem } from "../../../src/lib/offer-figures";
import { buildProposalSnapshot, formatIsoDateLong, proposalLabel, type SnapshotSource } from "../../../src/lib/proposal-snapshot";
import { dateInZone } from "../../../src/lib/zoned-time";
import { DEFAULT_TIME_ZONE } from "../../../src/lib/schemas/company-settings";
import { designDocumentSchema, type DesignDocument } from "../../../src/lib/schemas/design";
import { offerInputsSchema, type OfferInputs, type OfferInputsInput } from "../../../src/lib/schemas/offer";
import { priceBookSchema, type PriceBook } from "../../../src/lib/schemas/price-book";
import type { ProposalSnapshot } from "../../../src/lib/schemas/proposal";
import { seedStore } from "../seed-files";
import type { FileStorage } from "../../../src/server/file-stores";
import type { SeedContext } from "../seed-demo";

export const order = 60;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;
const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;

const here = path.dirname(fileURLToPath(import.meta.url));
const GREENSBORO_FILE = path.resolve(here, "../../../src/engine/data/tmy3-723170-greensboro-nc.csv");

/** Invented visitors: documentation addresses (RFC 5737) and a phone browser. */
const CUSTOMER_IP = "198.51.100.23";
const CUSTOMER_UA = "Mozilla/5.0 (iPhone; CPU iPhone OS 18_1 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) Version/18.1 Mobile/15E148 Safari/604.1";

/** The signed deals (index in the demo households), when they signed and which offer they chose. */
const SIGNED: { dealIndex: number; signedDaysAgo: number; chosen: 1 | 2; inHomeSale: boolean; replacedFirst?: boolean }[] = [
  { dealIndex: 4, signedDaysAgo: 1, chosen: 1, inHomeSale: true }, // Esposito, Signed: the window to cancel is still open
  { dealIndex: 5, signedDaysAgo: 9, chosen: 2, inHomeSale: true },
  { dealIndex: 6, signedDaysAgo: 30, chosen: 1, inHomeSale: true, replacedFirst: true },
  { dealIndex: 7, signedDaysAgo: 45, chosen: 2, inHomeSale: true },
  { dealIndex: 8, signedDaysAgo: 60, chosen: 1, inHomeSale: true },
  { dealIndex: 9, signedDaysAgo: 80, chosen: 2, inHomeSale: true },
  { dealIndex: 10, signedDaysAgo: 95, chosen: 1, inHomeSale: true },
  { dealIndex: 11, signedDaysAgo: 140, chosen: 1, inHomeSale: false }, // came through the website: signed at home, not sold there
];
const DUNMORE_INDEX = 3;

const CASH: OfferInputsInput = { name: "Whole roof, cash", lineItemIds: ["critter-guard"], payment: { kind: "cash" } };
const LOAN: OfferInputsInput = { name: "Whole roof, 20-year loan", lineItemIds: ["critter-guard"], payment: { kind: "loan", aprPct: 3.99, termMonths: 240, dealerFeePct: 0 } };

const json = (raw: unknown) => (typeof raw === "string" ? JSON.parse(raw) : raw);
const sha256 = (b: Uint8Array) => createHash("sha256").update(b).digest("hex");
/** A link token nobody keeps (only its hash is stored, as in the app). */
const unusedTokenHash = () => sha256(new Uint8Array(Buffer.from(randomBytes(32).toString("base64url"))));

/** A small drawn signature, made in code: one pen stroke as SVG, rasterised to PNG. */
async function demoSignaturePng(): Promise<Uint8Array> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="360" height="120"><path d="M14 86 C 40 20, 62 24, 70 78 S 96 112, 118 60 C 130 34, 142 40, 150 72 S 178 96, 196 58 L 214 84 C 236 46, 262 40, 288 66 S 330 84, 348 52" stroke="#1F2933" stroke-width="3.2" stroke-linecap="round" stroke-linejoin="round" fill="none"/></svg>`;
  return new Uint8Array(await sharp(Buffer.from(svg)).png().toBuffer());
}

type Ctx = {
  tx: SeedContext["tx"];
  companyId: string;
  weather: WeatherYear;
  book: PriceBook;
  companyRow: { name: string; licenseNumber: string | null };
  store: FileStorage;
  signaturePng: Uint8Array;
  ids: { proposal: number; event: number; timeline: number; file: number };
};

/** Everything the snapshot builder needs for one demo deal, with offers computed like the server computes them. */
async function sourceFor(c: Ctx, dealId: string, offers: { position: number; inputs: OfferInputsInput; figures?: SnapshotSource["offers"][number]["figures"] }[], takenAt: Date): Promise<SnapshotSource | null> {
  const { tx, companyId } = c;
  const [d] = await tx
    .select({ ownerUserId: deal.ownerUserId, ratePlanId: deal.ratePlanId, utilityName: utility.name, householdId: deal.householdId })
    .from(deal)
    .leftJoin(utility, and(eq(utility.id, deal.utilityId), eq(utility.companyId, deal.companyId)))
    .where(and(eq(deal.id, dealId), eq(deal.companyId, companyId)));
  const [designRow] = await tx.select({ document: design.document }).from(design).where(and(eq(design.dealId, dealId), eq(design.companyId, companyId)));
  if (!d || !designRow || !d.ratePlanId || !d.ownerUserId) return null;
  const doc: DesignDocument = designDocumentSchema.parse(json(designRow.document));
  const [h] = await tx.select().from(household).where(and(eq(household.id, d.householdId), eq(household.companyId, companyId)));
  const [rep] = await tx.select({ name: user.name, email: user.email }).from(user).where(eq(user.id, d.ownerUserId));
  const [mod] = await tx.select().from(moduleModel).where(and(eq(moduleModel.id, doc.moduleId), eq(moduleModel.companyId, companyId)));
  const [inv] = await tx.select().from(inverterModel).where(and(eq(inverterModel.id, doc.inverterId), eq(inverterModel.companyId, companyId)));
  const [planRow] = await tx.select({ plan: ratePlan.plan }).from(ratePlan).where(and(eq(ratePlan.id, d.ratePlanId), eq(ratePlan.companyId, companyId)));
  if (!h || !rep || !mod || !inv || !planRow) return null;

  const bills = await tx.select().from(bill).where(and(eq(bill.companyId, companyId), eq(bill.dealId, dealId))).orderBy(asc(bill.periodStart));
  if (bills.length === 0) return null;
  const usage = usageFromBills({ bills: bills.map((b) => ({ id: b.id, startDate: b.periodStart, endDate: b.periodEnd, kwh: b.kwh, costCents: b.costCents ?? undefined })), fill: "seasonal" });
  const counts = doc.faces.map((f) => f.moduleCount);
  const system = engineSystem(doc.faces, counts, mod, inv, { inverterCount: doc.inverterCount, lossesPct: doc.lossesPct });
  if (!system) return null;
  const produced = estimateProduction(c.weather, system);
  const productionHourlyKwh = Float64Array.from(produced.hourlyAcW, (wAc) => wAc / 1000);
  const usageHourlyKwh = spreadMonthlyToHourly(usage.monthlyKwh).hourlyKwh;
  const plan = ratePlanSchema.parse(json(planRow.plan));
  const asOf = takenAt.toISOString().slice(0, 10);

  return {
    takenAt,
    company: c.companyRow,
    rep,
    household: {
      name: h.name,
      contactName: h.contactName,
      email: h.email,
      phone: h.phone,
      street: h.street,
      city: h.city,
      region: h.region,
      postalCode: h.postalCode,
      latitude: h.latitude,
      longitude: h.longitude,
    },
    utilityName: d.utilityName,
    usage: { monthlyKwh: usage.monthlyKwh, source: "bills", estimatedMonths: usage.months.filter((x) => x.status === "estimated").length, fillMethod: usage.fillMethod },
    design: { lossesPct: doc.lossesPct, faces: doc.faces },
    offers: offers.map((o) => {
      const inputs: OfferInputs = offerInputsSchema.parse(o.inputs);
      const figures =
        o.figures ??
        computeOfferFigures({
          book: c.book,
          role: "sales_rep",
          asOf,
          moduleCount: counts.reduce((a, b) => a + b, 0),
          moduleWatts: mod.stcWatts,
          productionHourlyKwh,
          usageHourlyKwh,
          ratePlan: plan,
          timeZone: siteTimeZone(h.latitude, h.longitude),
          payment: inputs.payment,
          adderIds: inputs.adderIds,
          lineItemIds: inputs.lineItemIds,
          discountCents: inputs.discountCents,
          notes: [`Weather: ${c.weather.sourceLabel}.`],
        });
      return {
        position: o.position,
        name: inputs.name,
        inputs,
        figures,
        module: { manufacturer: mod.manufacturer, model: mod.model, stcWatts: mod.stcWatts },
        inverter: { manufacturer: inv.manufacturer, model: inv.model, kind: inv.kind, acWatts: inv.acWatts },
      };
    }),
    book: c.book,
  };
}

type EventSpec = { kind: string; at: Date; body?: string | null; customer?: boolean; actorUserId?: string | null };

/** Writes one proposal version with its PDF, events and Timeline lines; signs it when asked. */
async function writeProposal(
  c: Ctx,
  p: {
    dealId: string;
    snapshot: ProposalSnapshot;
    number: number;
    version: number;
    sentAt: Date;
    sentByUserId: string | null;
    inHomeSale: boolean;
    status: "sent" | "replaced" | "signed";
    events: EventSpec[];
    sign?: { at: Date; position: number; signerName: string };
  },
): Promise<string> {
  const id = uid(c.ids.proposal++);
  const label = proposalLabel(p.number, p.version);
  const expiresAt = new Date(p.sentAt.getTime() + 30 * DAY_MS);
  const unsigned = await renderProposalPdf(p.snapshot, { number: p.number, version: p.version, sentAt: p.sentAt, expiresAt, timeZone: DEFAULT_TIME_ZONE, inHomeSale: p.inHomeSale, cancelDeadlineText: null });
  const pdfKey = `${c.companyId}/proposals/${uid(c.ids.file++)}.pdf`;
  await c.store.put(pdfKey, unsigned);
  const toEmail = p.snapshot.household.email ?? "customer@homeowner.example";

  const eventRows = p.events.map((e) => ({
    id: uid(c.ids.event++),
    companyId: c.companyId,
    proposalId: id,
    kind: e.kind,
    body: e.body ?? null,
    ip: e.customer ? CUSTOMER_IP : null,
    userAgent: e.customer ? CUSTOMER_UA : null,
    actorUserId: e.actorUserId ?? null,
    createdAt: e.at,
  }));

  let signed: Partial<typeof proposal.$inferInsert> = {};
  if (p.sign) {
    const offerSigned = p.snapshot.offers.find((o) => o.position === p.sign?.position) ?? p.snapshot.offers[0];
    const signedOn = dateInZone(p.sign.at, DEFAULT_TIME_ZONE);
    const deadline = p.inHomeSale ? cancelDeadline(signedOn) : null;
    const detail: Record<string, (e: EventSpec) => string> = {
      sent: (e) => `Proposal sent ${e.body ?? ""}`.trim(),
      opened: () => `Opened from ${CUSTOMER_IP}`,
      viewed: () => `Viewed from ${CUSTOMER_IP}`,
      code_sent: (e) => `One-time code sent ${e.body ?? ""}`.trim(),
      code_verified: () => `E-mail confirmed with the one-time code from ${CUSTOMER_IP}`,
      consented: () => `Consent to electronic records and signatures given from ${CUSTOMER_IP}`,
      signed: () => `Signed from ${CUSTOMER_IP}`,
    };
    const stamped = await stampSignedPdf(unsigned, {
      signaturePng: c.signaturePng,
      signerName: p.sign.signerName,
      signerEmail: toEmail,
      chosenPosition: offerSigned.position,
      chosenOfferName: offerSigned.name,
      chosenContractCents: offerSigned.figures.summary.contractCents,
      signedAt: p.sign.at,
      timeZone: DEFAULT_TIME_ZONE,
      ip: CUSTOMER_IP,
      userAgent: CUSTOMER_UA,
      unsignedSha256: sha256(unsigned),
      proposalLabel: label,
      events: p.events.filter((e) => detail[e.kind]).map((e) => ({ at: e.at, kind: e.kind, detail: detail[e.kind](e) })),
      cancelDeadlineText: deadline ? formatIsoDateLong(deadline) : null,
      signedOnText: formatIsoDateLong(signedOn),
    });
    const signedKey = `${c.companyId}/signed/${uid(c.ids.file++)}.pdf`;
    await c.store.put(signedKey, stamped);
    signed = {
      chosenPosition: offerSigned.position,
      codeVerifiedAt: new Date(p.sign.at.getTime() - 3 * 60_000),
      consentedAt: p.sign.at,
      signedAt: p.sign.at,
      signerName: p.sign.signerName,
      signerEmail: toEmail,
      signerIp: CUSTOMER_IP,
      signerUserAgent: CUSTOMER_UA,
      signedStorageKey: signedKey,
      signedSha256: sha256(stamped),
      cancelDeadline: deadline,
    };
    await c.tx
      .update(deal)
      .set({ contractCents: offerSigned.figures.summary.contractCents, systemDcWatts: Math.round(offerSigned.equipment.moduleCount * offerSigned.equipment.module.stcWatts) })
      .where(and(eq(deal.id, p.dealId), eq(deal.companyId, c.companyId)));
  }

  const opened = p.events.find((e) => e.kind === "opened")?.at ?? null;
  const viewed = [...p.events].reverse().find((e) => e.kind === "viewed" || e.kind === "opened")?.at ?? null;
  await c.tx.insert(proposal).values({
    id,
    companyId: c.companyId,
    dealId: p.dealId,
    number: p.number,
    version: p.version,
    status: p.status,
    snapshot: p.snapshot,
    pdfStorageKey: pdfKey,
    pdfSha256: sha256(unsigned),
    tokenHash: unusedTokenHash(),
    expiresAt,
    sentToEmail: toEmail,
    sentByUserId: p.sentByUserId,
    inHomeSale: p.inHomeSale,
    firstOpenedAt: opened,
    lastViewedAt: viewed,
    createdAt: p.sentAt,
    ...signed,
  });
  if (eventRows.length > 0) await c.tx.insert(proposalEvent).values(eventRows);

  const timeline: { kind: string; summary: string; at: Date; actorUserId: string | null }[] = [
    { kind: "proposal.sent", summary: `${p.snapshot.rep.name} sent proposal ${label} to ${toEmail}`, at: p.sentAt, actorUserId: p.sentByUserId },
  ];
  if (opened) timeline.push({ kind: "proposal.opened", summary: `The customer opened proposal ${label}`, at: opened, actorUserId: null });
  for (const q of p.events.filter((e) => e.kind === "question")) {
    timeline.push({ kind: "proposal.question", summary: `The customer asked about ${label}: “${q.body ?? ""}”`, at: q.at, actorUserId: null });
  }
  if (p.sign && signed.chosenPosition) {
    const o = p.snapshot.offers.find((x) => x.position === signed.chosenPosition) ?? p.snapshot.offers[0];
    timeline.push({
      kind: "proposal.signed",
      summary: `${p.sign.signerName} signed proposal ${label}: "${o.name}" at ${formatCents(o.figures.summary.contractCents)}${signed.cancelDeadline ? `; may cancel until ${formatIsoDateLong(signed.cancelDeadline)}` : ""}`,
      at: p.sign.at,
      actorUserId: null,
    });
  }
  for (const t of timeline) {
    await c.tx.insert(timelineEvent).values({
      id: uid(c.ids.timeline++),
      companyId: c.companyId,
      dealId: p.dealId,
      kind: t.kind,
      summary: t.summary,
      data: { proposalId: id },
      actorUserId: t.actorUserId,
      createdAt: t.at,
    });
  }
  return id;
}

export async function seed(ctx: SeedContext): Promise<void> {
  const { tx, companyId } = ctx;
  const [bookRow] = await tx.select({ document: priceBook.document }).from(priceBook).where(eq(priceBook.companyId, companyId));
  const [companyRow] = await tx.select({ name: company.name, licenseNumber: company.licenseNumber }).from(company).where(eq(company.id, companyId));
  if (!bookRow || !companyRow) {
    console.warn("seed proposals: no price book or company row, so no demo proposals were written");
    return;
  }
  const c: Ctx = {
    tx,
    companyId,
    weather: parseWeather(await readFile(GREENSBORO_FILE, "utf8"), { format: "tmy3" }),
    book: priceBookSchema.parse(json(bookRow.document)),
    companyRow,
    store: seedStore("demo proposals"),
    signaturePng: await demoSignaturePng(),
    // Ids: proposals …0601+, their events …0621+, Timeline lines …6601+, file names …6501+.
    ids: { proposal: 601, event: 621, timeline: 6601, file: 6501 },
  };
  const now = Date.now();
  let number = 1001;

  // ── Dunmore (proposal out): the seeded cash offer, sent, opened, viewed, with a question ──
  const dunmoreId = ctx.dealIds[DUNMORE_INDEX];
  const dunmoreOffers = dunmoreId
    ? await tx.select().from(offer).where(and(eq(offer.companyId, companyId), eq(offer.dealId, dunmoreId))).orderBy(asc(offer.position))
    : [];
  const sendable = dunmoreOffers.filter((o) => o.discountStatus !== "pending" && o.discountStatus !== "declined");
  if (dunmoreId && sendable.length > 0) {
    const sentAt = new Date(now - 6 * DAY_MS);
    const source = await sourceFor(
      c,
      dunmoreId,
      sendable.map((o) => ({ position: o.position, inputs: json(o.inputs) as OfferInputsInput, figures: json(o.results) as SnapshotSource["offers"][number]["figures"] })),
      sentAt,
    );
    if (source) {
      const snapshot = buildProposalSnapshot(source);
      const [owner] = await tx.select({ id: deal.ownerUserId }).from(deal).where(eq(deal.id, dunmoreId));
      await writeProposal(c, {
        dealId: dunmoreId,
        snapshot,
        number: number++,
        version: 1,
        sentAt,
        sentByUserId: owner?.id ?? null,
        inHomeSale: true,
        status: "sent",
        events: [
          { kind: "sent", at: sentAt, body: `to ${snapshot.household.email}`, actorUserId: owner?.id ?? null },
          { kind: "opened", at: new Date(sentAt.getTime() + 3 * HOUR_MS), customer: true },
          { kind: "viewed", at: new Date(sentAt.getTime() + 2 * DAY_MS), customer: true },
          {
            kind: "question",
            at: new Date(sentAt.getTime() + 2 * DAY_MS + 20 * 60_000),
            body: "Does the price include the critter guard, and do you handle the paperwork with the co-op?",
            customer: true,
          },
        ],
      });
    }
  }

  // ── Signed and later: a signed proposal each ──
  for (const s of SIGNED) {
    const dealId = ctx.dealIds[s.dealIndex];
    if (!dealId) continue;
    const signedAt = new Date(now - s.signedDaysAgo * DAY_MS);
    const sentAt = new Date(signedAt.getTime() - 2 * DAY_MS);
    const [owner] = await tx.select({ id: deal.ownerUserId }).from(deal).where(eq(deal.id, dealId));
    const source = await sourceFor(
      c,
      dealId,
      [
        { position: 1, inputs: CASH },
        { position: 2, inputs: LOAN },
      ],
      sentAt,
    );
    if (!source) {
      console.warn(`seed proposals: deal ${dealId} lacks a design, bills or rate plan; no proposal seeded for it`);
      continue;
    }
    const snapshot = buildProposalSnapshot(source);
    const myNumber = number++;
    let version = 1;
    const toEmail = snapshot.household.email ?? "";
    if (s.replacedFirst) {
      // A first version with the cash offer only, opened, then replaced by the one signed.
      const firstSentAt = new Date(sentAt.getTime() - 4 * DAY_MS);
      const first = buildProposalSnapshot({ ...(await sourceFor(c, dealId, [{ position: 1, inputs: CASH }], firstSentAt))!, takenAt: firstSentAt });
      const firstId = await writeProposal(c, {
        dealId,
        snapshot: first,
        number: myNumber,
        version: version++,
        sentAt: firstSentAt,
        sentByUserId: owner?.id ?? null,
        inHomeSale: s.inHomeSale,
        status: "replaced",
        events: [
          { kind: "sent", at: firstSentAt, body: `to ${toEmail}`, actorUserId: owner?.id ?? null },
          { kind: "opened", at: new Date(firstSentAt.getTime() + 5 * HOUR_MS), customer: true },
        ],
      });
      // Ids are sequential: the next proposal written is the version that replaces this one.
      await tx.update(proposal).set({ replacedByProposalId: uid(c.ids.proposal) }).where(eq(proposal.id, firstId));
    }
    const signer = snapshot.household.contactName ?? snapshot.household.name;
    const t = (ms: number) => new Date(signedAt.getTime() - ms);
    await writeProposal(c, {
      dealId,
      snapshot,
      number: myNumber,
      version,
      sentAt,
      sentByUserId: owner?.id ?? null,
      inHomeSale: s.inHomeSale,
      status: "signed",
      events: [
        { kind: "sent", at: sentAt, body: `to ${toEmail}`, actorUserId: owner?.id ?? null },
        { kind: "opened", at: new Date(sentAt.getTime() + 2 * HOUR_MS), customer: true },
        { kind: "viewed", at: t(40 * 60_000), customer: true },
        { kind: "code_sent", at: t(6 * 60_000), body: `to ${toEmail}`, customer: true },
        { kind: "code_verified", at: t(3 * 60_000), body: `e-mail ${toEmail} confirmed`, customer: true },
        { kind: "consented", at: signedAt, body: "Agreed to the electronic records disclosure", customer: true },
        { kind: "signed", at: signedAt, customer: true },
      ],
      sign: { at: signedAt, position: s.chosen, signerName: signer },
    });
  }
}
