import "server-only";
import { addDaysToDate, todayInZone } from "@/lib/zoned-time";
import { and, asc, count, desc, eq, gt, gte, isNotNull, isNull, lte, ne, notInArray, or, sql, sum, type SQL } from "drizzle-orm";
import { deal, household, job, membership, payment, proposal, proposalEvent, STAGES, type Stage } from "@/db/schema";
import { can } from "@/lib/permissions";
import { getCompanySettings } from "@/server/company-settings";
import { crewIdOfMember } from "@/server/crews";
import { db } from "@/server/db";
import type { Member } from "@/server/session";

/** Early stages where the rep is the one to chase the customer (a rep's follow-ups). */
export const FOLLOW_UP_STAGES: readonly Stage[] = ["lead", "bills_in", "designing"];
/** Deals that are finished or closed: not part of anyone's queue. */
const CLOSED_STAGES: Stage[] = ["live", "lost", "cancelled"];
/** How far back customers' questions stay on the rep's queue. */
export const QUESTION_DAYS = 30;
/** Longest list shown per queue (each says how many more there are). */
export const QUEUE_LIMIT = 50;

const DAY_MS = 86_400_000;

type Queue<T> = { items: T[]; total: number };

export type StalledDeal = { dealId: string; householdName: string; stage: Stage; stageChangedAt: Date; limitDays: number; ownerUserId: string | null };
export type OpenedProposal = {
  proposalId: string;
  dealId: string;
  householdName: string;
  number: number;
  version: number;
  firstOpenedAt: Date;
  lastViewedAt: Date | null;
  expiresAt: Date;
};
export type CustomerQuestion = { eventId: string; dealId: string; householdName: string; proposalNumber: number; body: string; askedAt: Date };
export type PaymentItem = {
  paymentId: string;
  dealId: string;
  householdName: string;
  amountCents: number;
  paidCents: number | null;
  refundedCents: number;
  status: string;
  flagReason: string | null;
};
export type JobToSchedule = { jobId: string; dealId: string; householdName: string; city: string; installDate: string | null; hasCrew: boolean; createdAt: Date };
export type CrewVisit = { jobId: string; householdName: string; street: string; city: string; kind: "survey" | "install" | "inspection"; date: string };

export type TodayQueues = {
  /** The company's calendar day (its time zone) the queues were read for. */
  today: string;
  /** The company's zone, for the times the queues show. */
  timeZone: string;
  followUps: Queue<StalledDeal> | null;
  proposalsOpened: Queue<OpenedProposal> | null;
  questions: Queue<CustomerQuestion> | null;
  stalled: Queue<StalledDeal> | null;
  depositsFlagged: Queue<PaymentItem> | null;
  refundsDue: Queue<PaymentItem> | null;
  jobsToSchedule: Queue<JobToSchedule> | null;
  crew: { crewId: string | null; today: CrewVisit[]; thisWeek: CrewVisit[] } | null;
};


const householdJoin = and(eq(household.id, deal.householdId), eq(household.companyId, deal.companyId));

/**
 * Deals stalled by the company's limits, in SQL: a deal is stalled when its whole days in the
 * stage exceed the limit (src/lib/stage-rules.ts isStalled), i.e. it changed stage at least
 * limit + 1 days ago.
 */
async function stalledDeals(
  member: Member,
  limits: Partial<Record<Stage, number>>,
  scope: { ownOnly: boolean; stages?: readonly Stage[] },
  now: Date,
): Promise<Queue<StalledDeal>> {
  const entries = Object.entries(limits).filter(([stage]) => !scope.stages || scope.stages.includes(stage as Stage)) as [Stage, number][];
  if (entries.length === 0) return { items: [], total: 0 };
  const overdue = or(...entries.map(([stage, days]) => and(eq(deal.stage, stage), lte(deal.stageChangedAt, new Date(now.getTime() - (days + 1) * DAY_MS))))) as SQL;
  const where = and(eq(deal.companyId, member.companyId), scope.ownOnly ? eq(deal.ownerUserId, member.userId) : undefined, overdue);
  const [rows, [{ n }]] = await Promise.all([
    db()
      .select({ dealId: deal.id, householdName: household.name, stage: deal.stage, stageChangedAt: deal.stageChangedAt, ownerUserId: deal.ownerUserId })
      .from(deal)
      .innerJoin(household, householdJoin)
      .where(where)
      .orderBy(asc(deal.stageChangedAt), asc(deal.id))
      .limit(QUEUE_LIMIT),
    db().select({ n: count() }).from(deal).where(where),
  ]);
  return { items: rows.map((r) => ({ ...r, limitDays: limits[r.stage] ?? 0 })), total: Number(n) };
}

/** Proposals of the person's own deals that the customer opened and has not signed. */
async function openedProposals(member: Member): Promise<Queue<OpenedProposal>> {
  const where = and(
    eq(proposal.companyId, member.companyId),
    eq(proposal.status, "sent"),
    isNotNull(proposal.firstOpenedAt),
    eq(deal.ownerUserId, member.userId),
    notInArray(deal.stage, CLOSED_STAGES),
  );
  const from = () =>
    db()
      .select({
        proposalId: proposal.id,
        dealId: deal.id,
        householdName: household.name,
        number: proposal.number,
        version: proposal.version,
        firstOpenedAt: proposal.firstOpenedAt,
        lastViewedAt: proposal.lastViewedAt,
        expiresAt: proposal.expiresAt,
      })
      .from(proposal)
      .innerJoin(deal, and(eq(deal.id, proposal.dealId), eq(deal.companyId, proposal.companyId)))
      .innerJoin(household, householdJoin);
  const [rows, [{ n }]] = await Promise.all([
    from()
      .where(where)
      .orderBy(desc(sql`coalesce(${proposal.lastViewedAt}, ${proposal.firstOpenedAt})`), asc(proposal.id))
      .limit(QUEUE_LIMIT),
    db()
      .select({ n: count() })
      .from(proposal)
      .innerJoin(deal, and(eq(deal.id, proposal.dealId), eq(deal.companyId, proposal.companyId)))
      .where(where),
  ]);
  return { items: rows.map((r) => ({ ...r, firstOpenedAt: r.firstOpenedAt as Date })), total: Number(n) };
}

/** Questions customers asked on the person's own deals' proposals in the last QUESTION_DAYS days. */
async function customerQuestions(member: Member, now: Date): Promise<Queue<CustomerQuestion>> {
  const where = and(
    eq(proposalEvent.companyId, member.companyId),
    eq(proposalEvent.kind, "question"),
    gte(proposalEvent.createdAt, new Date(now.getTime() - QUESTION_DAYS * DAY_MS)),
    eq(deal.ownerUserId, member.userId),
    notInArray(deal.stage, CLOSED_STAGES),
  );
  const base = () =>
    db()
      .select({
        eventId: proposalEvent.id,
        dealId: deal.id,
        householdName: household.name,
        proposalNumber: proposal.number,
        body: proposalEvent.body,
        askedAt: proposalEvent.createdAt,
      })
      .from(proposalEvent)
      .innerJoin(proposal, and(eq(proposal.id, proposalEvent.proposalId), eq(proposal.companyId, proposalEvent.companyId)))
      .innerJoin(deal, and(eq(deal.id, proposal.dealId), eq(deal.companyId, proposal.companyId)))
      .innerJoin(household, householdJoin);
  const [rows, [{ n }]] = await Promise.all([
    base()
      .where(where)
      .orderBy(desc(proposalEvent.createdAt), asc(proposalEvent.id))
      .limit(QUEUE_LIMIT),
    db()
      .select({ n: count() })
      .from(proposalEvent)
      .innerJoin(proposal, and(eq(proposal.id, proposalEvent.proposalId), eq(proposal.companyId, proposalEvent.companyId)))
      .innerJoin(deal, and(eq(deal.id, proposal.dealId), eq(deal.companyId, proposal.companyId)))
      .where(where),
  ]);
  return { items: rows.map((r) => ({ ...r, body: r.body ?? "" })), total: Number(n) };
}

const paymentColumns = {
  paymentId: payment.id,
  dealId: deal.id,
  householdName: household.name,
  amountCents: payment.amountCents,
  paidCents: payment.paidCents,
  refundedCents: payment.refundedCents,
  status: payment.status,
  flagReason: payment.flagReason,
};

async function paymentQueue(member: Member, condition: SQL): Promise<Queue<PaymentItem>> {
  const where = and(eq(payment.companyId, member.companyId), condition);
  const [rows, [{ n }]] = await Promise.all([
    db()
      .select(paymentColumns)
      .from(payment)
      .innerJoin(deal, and(eq(deal.id, payment.dealId), eq(deal.companyId, payment.companyId)))
      .innerJoin(household, householdJoin)
      .where(where)
      .orderBy(asc(payment.updatedAt), asc(payment.id))
      .limit(QUEUE_LIMIT),
    db()
      .select({ n: count() })
      .from(payment)
      .innerJoin(deal, and(eq(deal.id, payment.dealId), eq(deal.companyId, payment.companyId)))
      .where(where),
  ]);
  return { items: rows, total: Number(n) };
}

/** Deposits the payment checks flagged (amount or currency not as asked…): the office looks at each. */
const flaggedDeposits = (member: Member) => paymentQueue(member, eq(payment.status, "flagged"));

/** Cancelled deals with money paid and not all of it refunded yet. */
const refundsDue = (member: Member) =>
  paymentQueue(member, and(eq(deal.stage, "cancelled"), isNotNull(payment.paidCents), gt(payment.paidCents, payment.refundedCents)) as SQL);

/** Jobs of open deals not yet installed that miss an install date or a crew. */
async function jobsToSchedule(member: Member): Promise<Queue<JobToSchedule>> {
  const where = and(
    eq(job.companyId, member.companyId),
    isNull(job.installedAt),
    isNull(job.cancelledAt),
    or(isNull(job.installDate), isNull(job.crewId)),
    notInArray(deal.stage, CLOSED_STAGES),
  );
  const [rows, [{ n }]] = await Promise.all([
    db()
      .select({
        jobId: job.id,
        dealId: deal.id,
        householdName: household.name,
        city: household.city,
        installDate: job.installDate,
        crewId: job.crewId,
        createdAt: job.createdAt,
      })
      .from(job)
      .innerJoin(deal, and(eq(deal.id, job.dealId), eq(deal.companyId, job.companyId)))
      .innerJoin(household, householdJoin)
      .where(where)
      .orderBy(asc(job.createdAt), asc(job.id))
      .limit(QUEUE_LIMIT),
    db()
      .select({ n: count() })
      .from(job)
      .innerJoin(deal, and(eq(deal.id, job.dealId), eq(deal.companyId, job.companyId)))
      .where(where),
  ]);
  return { items: rows.map(({ crewId, ...r }) => ({ ...r, hasCrew: crewId !== null })), total: Number(n) };
}

/** A crew member's visits (survey, install, inspection) from `from` to `to`, both days included. */
async function crewVisits(member: Member, crewId: string, from: string, to: string): Promise<CrewVisit[]> {
  const within = (col: typeof job.surveyDate | typeof job.installDate | typeof job.inspectionOn) => and(gte(col, from), lte(col, to));
  const rows = await db()
    .select({
      jobId: job.id,
      householdName: household.name,
      street: household.street,
      city: household.city,
      surveyDate: job.surveyDate,
      installDate: job.installDate,
      inspectionOn: job.inspectionOn,
    })
    .from(job)
    .innerJoin(deal, and(eq(deal.id, job.dealId), eq(deal.companyId, job.companyId)))
    .innerJoin(household, householdJoin)
    .where(
      and(
        eq(job.companyId, member.companyId),
        eq(job.crewId, crewId),
        isNull(job.cancelledAt),
        ne(deal.stage, "cancelled"),
        ne(deal.stage, "lost"),
        or(within(job.surveyDate), within(job.installDate), within(job.inspectionOn)),
      ),
    );
  const visits: CrewVisit[] = [];
  for (const r of rows) {
    const base = { jobId: r.jobId, householdName: r.householdName, street: r.street, city: r.city };
    const add = (kind: CrewVisit["kind"], date: string | null) => {
      if (date && date >= from && date <= to) visits.push({ ...base, kind, date });
    };
    add("survey", r.surveyDate);
    add("install", r.installDate);
    add("inspection", r.inspectionOn);
  }
  const order: Record<CrewVisit["kind"], number> = { install: 0, survey: 1, inspection: 2 };
  return visits.sort((a, b) => a.date.localeCompare(b.date) || order[a.kind] - order[b.kind] || a.householdName.localeCompare(b.householdName));
}

/**
 * Each person's own queue (issue #7, "Today"): a rep's follow-ups, opened proposals and
 * customers' questions on their own deals; the office's stalled deals, flagged deposits,
 * refunds due and jobs to schedule; a crew member's visits today and in the coming week.
 * Queues a role does not have are null. Every query is scoped to the member's company.
 */
export async function getTodayQueues(member: Member, now = new Date()): Promise<TodayQueues> {
  const settings = await getCompanySettings(member.companyId);
  const today = todayInZone(settings.timeZone, now);
  const seller = can(member.role, "deals:read-own");
  const office = can(member.role, "deals:read-all");
  const isCrew = member.role === "crew";

  const [followUps, proposalsOpened, questions, stalled, depositsFlagged, refunds, toSchedule, crew] = await Promise.all([
    seller ? stalledDeals(member, settings.stallLimits, { ownOnly: true, stages: FOLLOW_UP_STAGES }, now) : null,
    seller ? openedProposals(member) : null,
    seller ? customerQuestions(member, now) : null,
    // The office sees the company's stalled deals; a rep their own past the early stages
    // (the early ones are already their follow-ups).
    office
      ? stalledDeals(member, settings.stallLimits, { ownOnly: false }, now)
      : seller
        ? stalledDeals(member, settings.stallLimits, { ownOnly: true, stages: STAGES.filter((s) => !FOLLOW_UP_STAGES.includes(s)) }, now)
        : null,
    can(member.role, "payments:refund") ? flaggedDeposits(member) : null,
    can(member.role, "payments:refund") ? refundsDue(member) : null,
    can(member.role, "jobs:manage") ? jobsToSchedule(member) : null,
    isCrew
      ? (async () => {
          const crewId = await crewIdOfMember(member);
          if (!crewId) return { crewId: null, today: [], thisWeek: [] };
          const visits = await crewVisits(member, crewId, today, addDaysToDate(today, 6));
          return { crewId, today: visits.filter((v) => v.date === today), thisWeek: visits.filter((v) => v.date !== today) };
        })()
      : null,
  ]);
  return { today, timeZone: settings.timeZone, followUps, proposalsOpened, questions, stalled, depositsFlagged, refundsDue: refunds, jobsToSchedule: toSchedule, crew };
}

export type TodaySummary = { counts: Record<Stage, number>; open: number; pipelineCents: number; recent: { id: string; householdName: string; stage: Stage; systemDcWatts: number | null }[] };

/** Counts by stage, the open pipeline's value and the five most recently moved deals, in SQL. */
export async function getTodaySummary(member: Member): Promise<TodaySummary> {
  const visible = can(member.role, "deals:read-all") ? eq(deal.companyId, member.companyId) : and(eq(deal.companyId, member.companyId), eq(deal.ownerUserId, member.userId));
  const [byStage, recent] = await Promise.all([
    db()
      .select({ stage: deal.stage, n: count(), cents: sum(deal.contractCents) })
      .from(deal)
      .where(visible)
      .groupBy(deal.stage),
    db()
      .select({ id: deal.id, householdName: household.name, stage: deal.stage, systemDcWatts: deal.systemDcWatts })
      .from(deal)
      .innerJoin(household, householdJoin)
      .where(visible)
      .orderBy(desc(deal.stageChangedAt), desc(deal.id))
      .limit(5),
  ]);
  const counts = Object.fromEntries(STAGES.map((s) => [s, 0])) as Record<Stage, number>;
  let open = 0;
  let pipelineCents = 0;
  for (const row of byStage) {
    counts[row.stage] = Number(row.n);
    if (!CLOSED_STAGES.includes(row.stage)) {
      open += Number(row.n);
      pipelineCents += Number(row.cents ?? 0);
    }
  }
  return { counts, open, pipelineCents, recent };
}
