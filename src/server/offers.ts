import "server-only";
import { siteTimeZone } from "@/engine/site-time-zone";
import { createElement } from "react";
import { and, asc, desc, eq, inArray, sql } from "drizzle-orm";
import { deal, dealUsage, design, discountRequest, household, job, membership, offer, priceBook, ratePlan, user, type Role } from "@/db/schema";
import { EngineInputError } from "@/engine/errors";
import { env } from "@/env";
import { formatCents } from "@/lib/format";
import { offerBasisSchema, staleInputs, type CurrentInputs, type OfferBasis, type StaleInput } from "@/lib/offer-basis";
import { computeOfferFigures, type OfferFigures } from "@/lib/offer-figures";
import { bookForUtility, emptyPriceBook } from "@/lib/schemas/price-book";
import { can } from "@/lib/permissions";
import { discountDecisionRefusal, PricingInputError } from "@/lib/pricing";
import { todayInZone } from "@/lib/zoned-time";
import { createOfferSchema, discountDecisionSchema, MAX_OFFERS_PER_DEAL, offerInputsSchema, updateOfferSchema, type OfferInputs } from "@/lib/schemas/offer";
import DiscountDecisionEmail from "@emails/discount-decision";
import DiscountRequestEmail from "@emails/discount-request";
import { db, transaction, type Tx } from "@/server/db";
import { inDealOrThrow, openDeal, openDealOf, type DealScope } from "@/server/deal-scope";
import { designEquipment, getDesignForDeal, jsonValue, productionForDesign } from "@/server/designs";
import { getDealUsage } from "@/server/energy";
import { fieldError, forbidden, HttpError, notFound } from "@/server/errors";
import { queueMail, sendQueuedNow } from "@/server/outbound-mail";
import { getPriceBook, getPriceBookRecord } from "@/server/price-book";
import { getRatePlanOrThrow, type RatePlanRow } from "@/server/rate-plans";
import { validationError } from "@/server/route";
import type { Member } from "@/server/session";
import { recordEvent } from "@/server/timeline";

export type DiscountStatus = "none" | "within_limit" | "pending" | "approved" | "declined";

export type OfferRecord = {
  id: string;
  dealId: string;
  position: number;
  name: string;
  inputs: OfferInputs;
  results: OfferFigures;
  discountCents: number;
  discountStatus: DiscountStatus;
  /** What the figures were computed from; null for offers saved before it was recorded. */
  basis: OfferBasis | null;
  /** Inputs changed since (empty: current). A proposal freezes only current offers. */
  stale: StaleInput[];
  updatedAt: Date;
};

const offerColumns = {
  id: offer.id,
  dealId: offer.dealId,
  position: offer.position,
  name: offer.name,
  inputs: offer.inputs,
  results: offer.results,
  discountCents: offer.discountCents,
  discountStatus: offer.discountStatus,
  basis: offer.basis,
  updatedAt: offer.updatedAt,
};

type StoredOffer = Omit<OfferRecord, "inputs" | "results" | "basis" | "stale"> & { inputs: unknown; results: unknown; basis: unknown };

function toRecord(row: StoredOffer, now: CurrentInputs | ((ratePlanId: string | null) => CurrentInputs)): OfferRecord {
  const inputs = offerInputsSchema.safeParse(jsonValue(row.inputs));
  if (!inputs.success) throw new HttpError(500, "offer_unreadable", `The saved offer "${row.name}" does not match the current format. Save it again.`);
  const parsedBasis = row.basis == null ? null : offerBasisSchema.safeParse(jsonValue(row.basis));
  const basis = parsedBasis?.success ? parsedBasis.data : null;
  const current = typeof now === "function" ? now(inputs.data.ratePlanId) : now;
  return { ...row, inputs: inputs.data, results: jsonValue(row.results) as OfferFigures, basis, stale: staleInputs(basis, current) };
}

/**
 * The versions of the deal's inputs as stored now, per rate plan an offer names (its own, else
 * the deal's): what staleInputs compares an offer's basis with.
 */
export async function currentInputs(scope: DealScope, ratePlanIds: (string | null)[]): Promise<(ratePlanId: string | null) => CurrentInputs> {
  const { companyId, dealId } = scope;
  const planIds = [...new Set(ratePlanIds.map((id) => id ?? scope.deal.ratePlanId).filter((id): id is string => !!id))];
  const [[usage], [saved], [book], plans, jobInstallDate] = await Promise.all([
    db().select({ version: dealUsage.version }).from(dealUsage).where(and(eq(dealUsage.companyId, companyId), eq(dealUsage.dealId, dealId))).limit(1),
    db().select({ revision: design.revision }).from(design).where(and(eq(design.companyId, companyId), eq(design.dealId, dealId))).limit(1),
    db().select({ version: priceBook.version, incentivesVersion: priceBook.incentivesVersion }).from(priceBook).where(eq(priceBook.companyId, companyId)).limit(1),
    planIds.length
      ? db()
          .select({ id: ratePlan.id, version: ratePlan.version, utilityId: ratePlan.utilityId })
          .from(ratePlan)
          .where(and(eq(ratePlan.companyId, companyId), inArray(ratePlan.id, planIds)))
      : Promise.resolve([]),
    plannedInstallDate(scope),
  ]);
  return (ratePlanId) => {
    const planId = ratePlanId ?? scope.deal.ratePlanId;
    const plan = plans.find((p) => p.id === planId);
    return {
      usageVersion: usage?.version ?? 0,
      designRevision: saved?.revision ?? 0,
      ratePlan: plan ? { id: plan.id, version: plan.version } : null,
      priceBookVersion: book?.version ?? 0,
      incentivesVersion: book?.incentivesVersion ?? 0,
      assumptionsVersion: scope.settings.financeVersion,
      jobInstallDate,
      utilityId: scope.deal.utilityId ?? plan?.utilityId ?? null,
    };
  };
}

/** The install date planned on the deal's job, if it has a job with one. */
async function plannedInstallDate(scope: DealScope): Promise<string | null> {
  const [row] = await db().select({ installDate: job.installDate }).from(job).where(and(eq(job.companyId, scope.companyId), eq(job.dealId, scope.dealId))).limit(1);
  return row?.installDate ?? null;
}

async function offersOf(scope: DealScope, where: ReturnType<typeof and>): Promise<OfferRecord[]> {
  const rows = await db().select(offerColumns).from(offer).where(where).orderBy(asc(offer.position));
  const now = await currentInputs(
    scope,
    rows.map((r) => offerInputsSchema.safeParse(jsonValue(r.inputs)).data?.ratePlanId ?? null),
  );
  return rows.map((r) => toRecord(r, now));
}

export async function listOffers(scope: DealScope): Promise<OfferRecord[]> {
  return offersOf(scope, and(eq(offer.companyId, scope.companyId), eq(offer.dealId, scope.dealId)));
}

/** An offer by id with its deal's scope; reps only on deals they own (another company's: not found). */
export async function openOffer(member: Member, offerId: string): Promise<{ scope: DealScope; offer: OfferRecord }> {
  const [row] = await db().select({ dealId: offer.dealId }).from(offer).where(and(eq(offer.id, offerId), eq(offer.companyId, member.companyId))).limit(1);
  if (!row) throw notFound("Offer");
  const scope = await openDealOf(member, row.dealId, "Offer");
  const [found] = await offersOf(scope, and(eq(offer.companyId, member.companyId), eq(offer.id, offerId)));
  if (!found) throw notFound("Offer");
  return { scope, offer: found };
}

export async function getOfferOrThrow(member: Member, offerId: string): Promise<OfferRecord> {
  return (await openOffer(member, offerId)).offer;
}

// ── Computing an offer (always on the server, from stored data) ──────────────────────────


function engineError(err: unknown): never {
  if (err instanceof PricingInputError) throw fieldError(err.path === "discountCents" ? "inputs.discountCents" : `inputs.${err.path}`, err.message.replace(/^[^:]+: /, ""));
  if (err instanceof EngineInputError) {
    const first = err.issues[0];
    throw new HttpError(422, "cannot_compute", `The figures cannot be computed: ${first ? `${first.path}: ${first.message}` : err.message}`);
  }
  throw err;
}

/**
 * Every figure of an offer from its inputs and the deal's stored design, usage year, rate plan,
 * price book and savings assumptions, with the basis: which versions of those it used, and the
 * usage and design figures a proposal later copies.
 */
export async function computeOffer(scope: DealScope, inputs: OfferInputs, role: Role = scope.member.role): Promise<{ figures: OfferFigures; basis: OfferBasis; foreignPlan: ForeignPlan | null }> {
  const { member } = scope;
  const saved = await getDesignForDeal(scope);
  if (!saved) throw new HttpError(422, "no_design", "Save a design on the Design tab before making offers.");
  const doc = saved.document;
  const { mod, inv } = await designEquipment(member, inputs.moduleId ?? doc.moduleId, inputs.inverterId ?? doc.inverterId, "inputs.");

  const counts = doc.faces.map((f) => {
    const own = inputs.faceCounts?.find((c) => c.faceId === f.id);
    return own ? own.moduleCount : f.moduleCount;
  });
  (inputs.faceCounts ?? []).forEach((c, i) => {
    const face = doc.faces.find((f) => f.id === c.faceId);
    if (!face) throw fieldError(`inputs.faceCounts.${i}.faceId`, "This roof face is no longer in the design");
    if (c.moduleCount > face.usableSlots) throw fieldError(`inputs.faceCounts.${i}.moduleCount`, `${c.moduleCount} modules do not fit in ${face.usableSlots} usable slots on ${face.name}`);
  });
  const moduleCount = counts.reduce((a, b) => a + b, 0);
  if (moduleCount === 0) throw fieldError("inputs.faceCounts", "Place at least one module");

  const ratePlanId = inputs.ratePlanId ?? scope.deal.ratePlanId;
  if (!ratePlanId) throw fieldError("inputs.ratePlanId", "The deal has no rate plan: pick the household's rate plan");
  const plan = await getRatePlanOrThrow(member.companyId, ratePlanId).catch((err: unknown) => {
    throw err instanceof HttpError && err.status === 404 ? fieldError("inputs.ratePlanId", "Pick a rate plan from the list") : err;
  });
  const foreignPlan = foreignPlanOf(scope, plan, inputs);

  const site = { latitude: scope.household.latitude, longitude: scope.household.longitude };
  const [production, usage, bookRecord, installDate] = await Promise.all([
    productionForDesign(member, site, doc, counts, mod, inv),
    getDealUsage(scope),
    getPriceBookRecord(member.companyId),
    plannedInstallDate(scope),
  ]);
  if (!(usage.annualKwh > 0) || !usage.hourlyKwh) throw new HttpError(422, "no_usage", "This deal has no usage yet. Add bills or interval data on the Energy tab first.");
  // Only the household's utility's own rebates (with no utility on the deal yet: the plan's).
  const book = bookForUtility(bookRecord?.document ?? emptyPriceBook(), scope.deal.utilityId ?? plan.utilityId);
  const basis: OfferBasis = {
    usage: {
      version: usage.version,
      monthlyKwh: usage.monthlyKwh,
      annualKwh: usage.annualKwh,
      source: usage.source,
      estimatedMonths: usage.estimatedMonths.filter(Boolean).length,
      fillMethod: usage.fillMethod,
    },
    design: { revision: saved.revision, lossesPct: doc.lossesPct, faces: doc.faces.map(({ id, name, tiltDeg, azimuthDeg, solarAccessPct, moduleCount: count }) => ({ id, name, tiltDeg, azimuthDeg, solarAccessPct, moduleCount: count })) },
    ratePlan: { id: plan.id, version: plan.version },
    priceBook: { version: bookRecord?.version ?? 0, incentivesVersion: bookRecord?.incentivesVersion ?? 0, document: book },
    assumptionsVersion: scope.settings.financeVersion,
    module: { manufacturer: mod.manufacturer, model: mod.model, stcWatts: mod.stcWatts },
    inverter: { manufacturer: inv.manufacturer, model: inv.model, kind: inv.kind, acWatts: inv.acWatts },
    utilityId: scope.deal.utilityId ?? plan.utilityId,
  };
  try {
    const figures = computeOfferFigures({
      book,
      role,
      asOf: todayInZone(scope.settings.timeZone), // incentive windows open and close on the company's days
      ...(installDate ? { expectedInstallDate: installDate } : {}),
      moduleCount,
      moduleWatts: mod.stcWatts,
      productionHourlyKwh: production.hourlyKwh,
      usageHourlyKwh: usage.hourlyKwh,
      ratePlan: plan.plan,
      timeZone: plan.utilityTimeZone, // the plan's hours are its utility's clock; the rows are the site's standard time
      siteTimeZone: siteTimeZone(site.latitude, site.longitude),
      payment: inputs.payment,
      adderIds: inputs.adderIds,
      lineItemIds: inputs.lineItemIds,
      discountCents: inputs.discountCents,
      assumptions: scope.settings.finance,
      notes: [`Weather: ${production.label}.`, ...production.notes],
    });
    // Only offers whose credits count at installation depend on (and go stale with) the install date.
    const countsOnInstall = book.incentives.some((r) => r.countsOn === "installation");
    return { figures: { ...figures, weatherStation: production.station /* the snapshot names it with its distance */ }, basis: { ...basis, installDate: countsOnInstall ? figures.assumptions.installDate : null }, foreignPlan };
  } catch (err) {
    engineError(err);
  }
}

/** A plan of another utility than the household's, used on purpose: who, which and why. */
type ForeignPlan = { planName: string; planUtility: string; householdUtility: string; reason: string };

/**
 * Offers bill with the household's utility's plans. Another utility's plan (a customer moving,
 * a plan not entered yet under the right utility) needs a reason, which the Timeline keeps.
 */
function foreignPlanOf(scope: DealScope, plan: RatePlanRow, inputs: OfferInputs): ForeignPlan | null {
  const own = scope.deal.utilityId;
  if (!own || plan.utilityId === own) return null;
  const householdUtility = scope.deal.utilityName ?? "the household's utility";
  if (inputs.ratePlanOverrideReason.length < 3) {
    throw fieldError("inputs.ratePlanOverrideReason", `"${plan.name}" is a plan of ${plan.utilityName}, not of ${householdUtility}: pick one of ${householdUtility}'s plans, or say why this one applies`);
  }
  return { planName: plan.name, planUtility: plan.utilityName, householdUtility, reason: inputs.ratePlanOverrideReason };
}

async function recordForeignPlan(tx: Tx, member: Member, dealId: string, offerId: string, offerName: string, foreign: ForeignPlan | null): Promise<void> {
  if (!foreign) return;
  await recordEvent(tx, {
    companyId: member.companyId,
    dealId,
    kind: "offer.foreign_rate_plan",
    summary: `${member.name} priced "${offerName}" with ${foreign.planUtility}'s plan "${foreign.planName}", not ${foreign.householdUtility}'s: ${foreign.reason}`,
    actorUserId: member.userId,
    data: { offerId },
  });
}

// ── Discount requests ────────────────────────────────────────────────────────────────────

type DiscountOutcome = { status: DiscountStatus; requestId: string | null; mailNeeded: boolean };

/**
 * Decides the offer's discount status inside the save's transaction. A discount beyond the
 * saver's limit becomes (or updates) a pending request, unless an approved request already
 * covers at least this amount.
 */
async function settleDiscount(tx: Tx, member: Member, dealId: string, offerId: string, inputs: OfferInputs, figures: OfferFigures): Promise<DiscountOutcome> {
  if (inputs.discountCents === 0) {
    await tx.delete(discountRequest).where(and(eq(discountRequest.companyId, member.companyId), eq(discountRequest.offerId, offerId), eq(discountRequest.status, "pending")));
    return { status: "none", requestId: null, mailNeeded: false };
  }
  if (!figures.discountNeedsApproval) return { status: "within_limit", requestId: null, mailNeeded: false };
  const requests = await tx
    .select({ id: discountRequest.id, status: discountRequest.status, amountCents: discountRequest.amountCents, reason: discountRequest.reason })
    .from(discountRequest)
    .where(and(eq(discountRequest.companyId, member.companyId), eq(discountRequest.offerId, offerId)))
    .orderBy(desc(discountRequest.createdAt));
  const approved = requests.find((r) => r.status === "approved" && r.amountCents >= inputs.discountCents);
  if (approved) return { status: "approved", requestId: approved.id, mailNeeded: false };
  const pending = requests.find((r) => r.status === "pending");
  if (pending) {
    if (pending.amountCents === inputs.discountCents && pending.reason === inputs.discountReason) return { status: "pending", requestId: pending.id, mailNeeded: false };
    await tx
      .update(discountRequest)
      .set({ amountCents: inputs.discountCents, reason: inputs.discountReason })
      .where(and(eq(discountRequest.id, pending.id), eq(discountRequest.companyId, member.companyId)));
    return { status: "pending", requestId: pending.id, mailNeeded: true };
  }
  const id = crypto.randomUUID();
  await tx.insert(discountRequest).values({
    id,
    companyId: member.companyId,
    dealId,
    offerId,
    amountCents: inputs.discountCents,
    reason: inputs.discountReason,
    status: "pending",
    requestedByUserId: member.userId,
  });
  await recordEvent(tx, {
    companyId: member.companyId,
    dealId,
    kind: "discount.requested",
    summary: `${member.name} asked for a ${formatCents(inputs.discountCents)} discount on "${inputs.name}" (limit ${formatCents(figures.discountLimitCents)})`,
    actorUserId: member.userId,
    data: { offerId, discountRequestId: id, amountCents: inputs.discountCents },
  });
  return { status: "pending", requestId: id, mailNeeded: true };
}

/**
 * People who may decide this discount (discountDecisionRefusal): the office managers among them,
 * or the owners and admins when no office manager may.
 */
async function approverEmails(companyId: string, request: { requestedByUserId: string; amountCents: number; grossCents: number }): Promise<string[]> {
  const rows = await db()
    .select({ userId: membership.userId, email: user.email, role: membership.role })
    .from(membership)
    .innerJoin(user, eq(user.id, membership.userId))
    .where(and(eq(membership.companyId, companyId), eq(membership.status, "active"), inArray(membership.role, ["office_manager", "owner", "admin"])));
  const book = await getPriceBook(companyId);
  const deciders = rows.filter((r) => discountDecisionRefusal(book, r, request) === null);
  const managers = deciders.filter((r) => r.role === "office_manager");
  return (managers.length ? managers : deciders).map((r) => r.email);
}

const offersUrl = (dealId: string) => `${env().APP_URL}/deals/${dealId}/offers`;

/** The e-mail to those who may decide, written in the request's transaction (outbox); null when nobody may. */
async function queueDiscountRequest(tx: Tx, member: Member, dealId: string, householdName: string, requestId: string, inputs: OfferInputs, figures: OfferFigures): Promise<string | null> {
  const to = await approverEmails(member.companyId, { requestedByUserId: member.userId, amountCents: inputs.discountCents, grossCents: figures.summary.grossCents });
  if (to.length === 0) return null;
  return queueMail(tx, {
    companyId: member.companyId,
    kind: "discount-request",
    to,
    subject: `Discount to review: ${formatCents(inputs.discountCents)} for the ${householdName}`,
    react: createElement(DiscountRequestEmail, {
      repName: member.name,
      householdName,
      offerName: inputs.name,
      discount: formatCents(inputs.discountCents),
      limit: formatCents(figures.discountLimitCents ?? 0),
      contractBefore: formatCents(figures.summary.grossCents),
      reason: inputs.discountReason,
      reviewUrl: offersUrl(dealId),
    }),
    idempotencyKey: `discount-request-${requestId}-${inputs.discountCents}`,
  });
}

// ── Writes ───────────────────────────────────────────────────────────────────────────────

/**
 * The rep picked a rate plan for a deal that had none: it becomes the deal's, and its utility
 * the household's when none was set (never a plan used by override).
 */
async function setDealRatePlanIfMissing(tx: Tx, member: Member, dealId: string, ratePlanId: string | null, current: string | null, foreign: ForeignPlan | null): Promise<void> {
  if (current || !ratePlanId || foreign) return;
  const planUtility = tx.select({ id: ratePlan.utilityId }).from(ratePlan).where(and(eq(ratePlan.id, ratePlanId), eq(ratePlan.companyId, member.companyId)));
  await tx
    .update(deal)
    .set({ ratePlanId, utilityId: sql`COALESCE(${deal.utilityId}, (${planUtility}))` })
    .where(and(eq(deal.id, dealId), eq(deal.companyId, member.companyId)));
}

type CreateOfferInput = { dealId: string; inputs: OfferInputs };

/** What the offer form shows before saving: the same figures a save would store, minus the yearly rows. */
export type OfferPreview = Pick<OfferFigures, "summary" | "discountNeedsApproval" | "discountLimitCents" | "assumptions">;

/**
 * An offer's figures for inputs not yet saved (the rep trying a discount, a loan, fewer
 * modules): computed exactly as createOffer would, written nowhere.
 */
export async function previewOffer(member: Member, input: CreateOfferInput): Promise<OfferPreview> {
  const { figures } = await computeOffer(await openDeal(member, input.dealId), input.inputs);
  return { summary: figures.summary, discountNeedsApproval: figures.discountNeedsApproval, discountLimitCents: figures.discountLimitCents, assumptions: figures.assumptions };
}

export async function createOffer(member: Member, input: unknown): Promise<OfferRecord> {
  const parsed = createOfferSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const { dealId, inputs } = parsed.data;
  const scope = await openDeal(member, dealId);
  const { figures, basis, foreignPlan } = await computeOffer(scope, inputs);
  if (figures.discountNeedsApproval && inputs.discountReason.length < 3) throw fieldError("inputs.discountReason", "Say why: this discount needs the office's approval");
  const id = crypto.randomUUID();
  const mailIds: string[] = [];
  await transaction(async (tx) => {
    const taken = await tx
      .select({ position: offer.position })
      .from(offer)
      .where(and(eq(offer.companyId, member.companyId), eq(offer.dealId, dealId)));
    if (taken.length >= MAX_OFFERS_PER_DEAL) throw new HttpError(409, "too_many_offers", `A deal has at most ${MAX_OFFERS_PER_DEAL} offers. Change or delete one.`);
    const position = [1, 2, 3].find((p) => !taken.some((t) => t.position === p)) ?? taken.length + 1;
    await tx.insert(offer).values({ id, companyId: member.companyId, dealId, position, name: inputs.name, inputs, results: figures, basis, discountCents: inputs.discountCents, discountStatus: "none" });
    const outcome = await settleDiscount(tx, member, dealId, id, inputs, figures);
    await tx.update(offer).set({ discountStatus: outcome.status }).where(and(eq(offer.id, id), eq(offer.companyId, member.companyId)));
    if (outcome.mailNeeded && outcome.requestId) {
      const mailId = await queueDiscountRequest(tx, member, dealId, scope.household.name, outcome.requestId, inputs, figures);
      if (mailId) mailIds.push(mailId);
    }
    await setDealRatePlanIfMissing(tx, member, dealId, inputs.ratePlanId, scope.deal.ratePlanId, foreignPlan);
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId,
      kind: "offer.created",
      summary: `Offer "${inputs.name}" created by ${member.name}: ${figures.summary.kwDc.toFixed(2)} kW DC, ${formatCents(figures.summary.contractCents)}`,
      actorUserId: member.userId,
      data: { offerId: id },
    });
    await recordForeignPlan(tx, member, dealId, id, inputs.name, foreignPlan);
  });
  await sendQueuedNow(mailIds);
  return (await offersOf(scope, and(eq(offer.companyId, member.companyId), eq(offer.id, id))))[0];
}

export async function updateOffer(member: Member, offerId: string, input: unknown): Promise<OfferRecord> {
  const { scope, offer: existing } = await openOffer(member, offerId);
  const parsed = updateOfferSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const { inputs } = parsed.data;
  const { figures, basis, foreignPlan } = await computeOffer(scope, inputs);
  if (figures.discountNeedsApproval && inputs.discountReason.length < 3) throw fieldError("inputs.discountReason", "Say why: this discount needs the office's approval");
  const mailIds: string[] = [];
  await transaction(async (tx) => {
    const outcome = await settleDiscount(tx, member, existing.dealId, offerId, inputs, figures);
    if (outcome.mailNeeded && outcome.requestId) {
      const mailId = await queueDiscountRequest(tx, member, existing.dealId, scope.household.name, outcome.requestId, inputs, figures);
      if (mailId) mailIds.push(mailId);
    }
    await tx
      .update(offer)
      .set({ name: inputs.name, inputs, results: figures, basis, discountCents: inputs.discountCents, discountStatus: outcome.status })
      .where(and(eq(offer.id, offerId), eq(offer.companyId, member.companyId)));
    await setDealRatePlanIfMissing(tx, member, existing.dealId, inputs.ratePlanId, scope.deal.ratePlanId, foreignPlan);
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: existing.dealId,
      kind: "offer.updated",
      summary: `Offer "${inputs.name}" changed by ${member.name}: ${figures.summary.kwDc.toFixed(2)} kW DC, ${formatCents(figures.summary.contractCents)}`,
      actorUserId: member.userId,
      data: { offerId },
    });
    await recordForeignPlan(tx, member, existing.dealId, offerId, inputs.name, foreignPlan);
  });
  await sendQueuedNow(mailIds);
  return (await offersOf(scope, and(eq(offer.companyId, member.companyId), eq(offer.id, offerId))))[0];
}

export async function deleteOffer(member: Member, offerId: string): Promise<{ id: string }> {
  const existing = await getOfferOrThrow(member, offerId);
  await transaction(async (tx) => {
    await tx.delete(offer).where(and(eq(offer.id, offerId), eq(offer.companyId, member.companyId)));
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: existing.dealId,
      kind: "offer.deleted",
      summary: `Offer "${existing.name}" deleted by ${member.name}`,
      actorUserId: member.userId,
      data: { offerId },
    });
  });
  return { id: offerId };
}

// ── Reading and deciding discount requests ───────────────────────────────────────────────

export type DiscountRequestRow = {
  id: string;
  dealId: string;
  offerId: string;
  offerName: string;
  householdName: string;
  amountCents: number;
  reason: string;
  status: "pending" | "approved" | "declined";
  requestedByName: string | null;
  requestedByUserId: string | null;
  decidedByUserId: string | null;
  decidedAt: Date | null;
  decisionNote: string | null;
  createdAt: Date;
};

function requestQuery(companyId: string) {
  return db()
    .select({
      id: discountRequest.id,
      dealId: discountRequest.dealId,
      offerId: discountRequest.offerId,
      offerName: offer.name,
      householdName: household.name,
      amountCents: discountRequest.amountCents,
      reason: discountRequest.reason,
      status: discountRequest.status,
      requestedByName: user.name,
      requestedByUserId: discountRequest.requestedByUserId,
      decidedByUserId: discountRequest.decidedByUserId,
      decidedAt: discountRequest.decidedAt,
      decisionNote: discountRequest.decisionNote,
      createdAt: discountRequest.createdAt,
      dealOwnerUserId: deal.ownerUserId,
      /** The offer's price before discount, which the decider's own limit is measured on. */
      grossCents: sql<number>`CAST(JSON_VALUE(${offer.results}, '$.summary.grossCents') AS SIGNED)`.mapWith(Number),
    })
    .from(discountRequest)
    .innerJoin(offer, and(eq(offer.id, discountRequest.offerId), eq(offer.companyId, discountRequest.companyId)))
    .innerJoin(deal, and(eq(deal.id, discountRequest.dealId), eq(deal.companyId, discountRequest.companyId)))
    .innerJoin(household, and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId)))
    .leftJoin(user, eq(user.id, discountRequest.requestedByUserId))
    .$dynamic()
    .where(eq(discountRequest.companyId, companyId));
}

type RequestQueryRow = DiscountRequestRow & { dealOwnerUserId: string | null; grossCents: number };
const stripOwner = ({ dealOwnerUserId: _owner, grossCents: _gross, ...row }: RequestQueryRow): DiscountRequestRow => row;

export async function getDiscountRequestOrThrow(member: Member, requestId: string): Promise<DiscountRequestRow> {
  const found = await db()
    .select({ dealId: discountRequest.dealId })
    .from(discountRequest)
    .where(and(eq(discountRequest.id, requestId), eq(discountRequest.companyId, member.companyId)))
    .limit(1);
  await inDealOrThrow(member, "Discount request", found);
  const [full] = await requestQuery(member.companyId).where(and(eq(discountRequest.companyId, member.companyId), eq(discountRequest.id, requestId)));
  if (!full) throw notFound("Discount request");
  return stripOwner(full);
}

export async function listDiscountRequestsForDeal(scope: DealScope): Promise<DiscountRequestRow[]> {
  const { member, dealId } = scope;
  const rows = await requestQuery(member.companyId)
    .where(and(eq(discountRequest.companyId, member.companyId), eq(discountRequest.dealId, dealId)))
    .orderBy(desc(discountRequest.createdAt));
  return rows.map(stripOwner);
}

/**
 * Pending discount requests for a person's Today: every pending one of the company for those
 * who approve discounts; a rep's own pending requests (on deals they own) otherwise.
 */
export async function listPendingDiscountRequests(member: Member): Promise<DiscountRequestRow[]> {
  const pending = and(eq(discountRequest.companyId, member.companyId), eq(discountRequest.status, "pending"));
  const approver = can(member.role, "discounts:approve");
  const rows = await requestQuery(member.companyId)
    .where(approver ? pending : and(pending, eq(deal.ownerUserId, member.userId)))
    .orderBy(asc(discountRequest.createdAt));
  if (!approver) return rows.map(stripOwner);
  // An approver's queue holds only what they may decide (not their own, not above their limit).
  const book = await getPriceBook(member.companyId);
  return rows.filter((r) => discountDecisionRefusal(book, member, r) === null).map(stripOwner);
}

/**
 * An office manager grants or declines a pending discount. Declining prices the offer again
 * without the discount. The rep gets an e-mail either way.
 */
export async function decideDiscountRequest(member: Member, requestId: string, input: unknown): Promise<DiscountRequestRow> {
  if (!can(member.role, "discounts:approve")) throw forbidden("deciding discounts");
  const parsed = discountDecisionSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const { decision, note } = parsed.data;
  const request = await getDiscountRequestOrThrow(member, requestId);
  if (request.status !== "pending") throw new HttpError(409, "already_decided", `This discount was already ${request.status}.`);
  const { scope, offer: current } = await openOffer(member, request.offerId);
  const refusal = discountDecisionRefusal(await getPriceBook(member.companyId), member, {
    requestedByUserId: request.requestedByUserId,
    amountCents: request.amountCents,
    grossCents: current.results.summary.grossCents,
  });
  if (refusal) throw new HttpError(403, "not_your_decision", refusal);

  let declinedFigures: OfferFigures | undefined;
  const inputsWithout: OfferInputs = { ...current.inputs, discountCents: 0, discountReason: "" };
  let declinedBasis: OfferBasis | null = null;
  if (decision === "decline") ({ figures: declinedFigures, basis: declinedBasis } = await computeOffer(scope, inputsWithout));

  const mailIds = await transaction(async (tx): Promise<string[]> => {
    const changed = await tx
      .update(discountRequest)
      .set({ status: decision === "approve" ? "approved" : "declined", decidedByUserId: member.userId, decidedAt: new Date(), decisionNote: note || null })
      .where(and(eq(discountRequest.id, requestId), eq(discountRequest.companyId, member.companyId), eq(discountRequest.status, "pending")));
    if (changed[0].affectedRows !== 1) throw new HttpError(409, "already_decided", "Someone decided this discount a moment ago.");
    if (decision === "approve") {
      await tx.update(offer).set({ discountStatus: "approved" }).where(and(eq(offer.id, current.id), eq(offer.companyId, member.companyId)));
    } else {
      await tx
        .update(offer)
        .set({ inputs: inputsWithout, results: declinedFigures, basis: declinedBasis, discountCents: 0, discountStatus: "declined" })
        .where(and(eq(offer.id, current.id), eq(offer.companyId, member.companyId)));
    }
    await recordEvent(tx, {
      companyId: member.companyId,
      dealId: current.dealId,
      kind: decision === "approve" ? "discount.approved" : "discount.declined",
      summary: `${member.name} ${decision === "approve" ? "approved" : "declined"} the ${formatCents(request.amountCents)} discount on "${current.name}"${note ? `: ${note}` : ""}`,
      actorUserId: member.userId,
      data: { offerId: current.id, discountRequestId: requestId },
    });
    // The requester hears either way; the e-mail is written with the decision (outbox).
    if (!request.requestedByUserId) return [];
    const [rep] = await tx.select({ email: user.email }).from(user).where(eq(user.id, request.requestedByUserId)).limit(1);
    if (!rep) return [];
    return [
      await queueMail(tx, {
        companyId: member.companyId,
        kind: "discount-decision",
        to: rep.email,
        subject: `Discount ${decision === "approve" ? "approved" : "declined"}: ${formatCents(request.amountCents)} for the ${request.householdName}`,
        react: createElement(DiscountDecisionEmail, {
          deciderName: member.name,
          householdName: request.householdName,
          offerName: current.name,
          discount: formatCents(request.amountCents),
          approved: decision === "approve",
          note,
          offersUrl: offersUrl(current.dealId),
        }),
        idempotencyKey: `discount-decision-${requestId}`,
      }),
    ];
  });
  await sendQueuedNow(mailIds);
  return getDiscountRequestOrThrow(member, requestId);
}
