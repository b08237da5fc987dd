import type { Metadata } from "next";
import Link from "next/link";
import { STAGES } from "@/lib/enums";
import { can } from "@/lib/permissions";
import { STAGE_LABELS } from "@/lib/stages";
import { daysSince, formatCalendarDate, formatCents, formatDate, formatDateTime, formatKwFromWatts } from "@/lib/format";
import { listPendingDiscountRequests } from "@/server/offers";
import { listPendingInvitations } from "@/server/people";
import { getMember } from "@/server/session";
import { getTodayQueues, getTodaySummary, type CrewVisit, type StalledDeal, type TodayQueues, type TodaySummary } from "@/server/today";
import { QueueItem, QueueSection } from "./queue-section";

export const metadata: Metadata = { title: "Today" };

type PendingDiscount = Awaited<ReturnType<typeof listPendingDiscountRequests>>[number];

// wrap-anywhere: a name with no spaces breaks instead of widening the page.
const linkClass = "font-medium wrap-anywhere underline-offset-2 hover:text-copper hover:underline";
const day = (iso: string) => formatCalendarDate(iso);
const VISIT_LABELS: Record<CrewVisit["kind"], string> = { install: "Install", survey: "Site survey", inspection: "Inspection" };

function StalledItem({ d }: { d: StalledDeal }) {
  return (
    <QueueItem
      aside={
        <>
          {STAGE_LABELS[d.stage]} for <span className="figure">{daysSince(d.stageChangedAt)}</span> days (limit <span className="figure">{d.limitDays}</span>)
        </>
      }
    >
      <Link href={`/deals/${d.dealId}`} className={linkClass}>
        {d.householdName}
      </Link>
    </QueueItem>
  );
}

function VisitItem({ v, withDate }: { v: CrewVisit; withDate: boolean }) {
  return (
    <QueueItem aside={withDate ? day(v.date) : undefined}>
      <Link href={`/jobs/${v.jobId}`} className={linkClass}>
        {VISIT_LABELS[v.kind]}: {v.householdName}
      </Link>
      <span className="block text-sm text-graphite-soft">
        {v.street}, {v.city}
      </span>
    </QueueItem>
  );
}

export default async function TodayPage() {
  const member = await getMember();
  if (!member) return null; // the layout has already sent the person to sign in
  const first = member.name.split(" ")[0];
  const q = await getTodayQueues(member);

  if (member.role === "crew") {
    return <CrewToday first={first} today={q.today} crew={q.crew ?? { crewId: null, today: [], thisWeek: [] }} />;
  }

  const office = can(member.role, "deals:read-all");
  const [summary, invitations, discounts] = await Promise.all([
    getTodaySummary(member),
    can(member.role, "people:read") ? listPendingInvitations(member.companyId) : Promise.resolve([]),
    listPendingDiscountRequests(member),
  ]);
  const approver = can(member.role, "discounts:approve");
  const scope = office ? "The company's deals" : "Your deals";
  return (
    <>
      <h1 className="text-2xl font-semibold">Good day, {first}</h1>
      <p className="mt-1 text-graphite-soft">
        {scope}: <span className="figure">{summary.open}</span> open, worth <span className="figure">{formatCents(summary.pipelineCents)}</span> in
        signed and priced contracts.
      </p>

      <DiscountsWaiting discounts={discounts} approver={approver} />

      <QuestionsQueue questions={q.questions} timeZone={q.timeZone} />

      <ProposalsOpenedQueue proposalsOpened={q.proposalsOpened} timeZone={q.timeZone} />

      {q.followUps ? (
        <QueueSection id="follow-ups" title="Your follow-ups" total={q.followUps.total} shown={q.followUps.items.length}>
          {q.followUps.items.map((d) => (
            <StalledItem key={d.dealId} d={d} />
          ))}
        </QueueSection>
      ) : null}

      <DepositsFlaggedQueue depositsFlagged={q.depositsFlagged} />

      <RefundsDueQueue refundsDue={q.refundsDue} />

      <JobsToScheduleQueue jobsToSchedule={q.jobsToSchedule} />

      {q.stalled ? (
        <QueueSection
          id="stalled-deals"
          title={office ? "Stalled deals" : "Your stalled deals"}
          total={q.stalled.total}
          shown={q.stalled.items.length}
          more={
            <Link href="/board" className="link">
              See them all on the Board
            </Link>
          }
        >
          {q.stalled.items.map((d) => (
            <StalledItem key={d.dealId} d={d} />
          ))}
        </QueueSection>
      ) : null}

      <DealSummary summary={summary} />
      {invitations.length > 0 ? (
        <section className="mt-8">
          <h2 className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">Waiting to join</h2>
          <p className="mt-1 text-graphite-soft">
            {invitations.length} invitation{invitations.length === 1 ? "" : "s"} not yet accepted.{" "}
            <Link href="/settings/people" className="link">
              People
            </Link>
          </p>
        </section>
      ) : null}
    </>
  );
}

/** The installer's day: their crew's visits today and in the next six days. */
function CrewToday({ first, today, crew }: { first: string; today: string; crew: NonNullable<TodayQueues["crew"]> }) {
  return (
    <>
      <h1 className="text-2xl font-semibold">Good day, {first}</h1>
      <p className="mt-1 text-graphite-soft">{day(today)}</p>
      {crew.crewId ? (
        <>
          <QueueSection id="crew-today" title="Your jobs today" total={crew.today.length} shown={crew.today.length} empty="Nothing is booked for your crew today.">
            {crew.today.map((v) => (
              <VisitItem key={`${v.jobId}-${v.kind}`} v={v} withDate={false} />
            ))}
          </QueueSection>
          <QueueSection
            id="crew-week"
            title="This week"
            total={crew.thisWeek.length}
            shown={crew.thisWeek.length}
            empty="Nothing else is booked for your crew in the next six days."
          >
            {crew.thisWeek.map((v) => (
              <VisitItem key={`${v.jobId}-${v.kind}-${v.date}`} v={v} withDate />
            ))}
          </QueueSection>
          <Link href="/jobs" className="mt-4 inline-block text-sm text-copper underline-offset-2 hover:underline">
            All your crew&apos;s jobs
          </Link>
        </>
      ) : (
        <section className="card mt-6 p-5">
          <h2 className="font-semibold">Your jobs</h2>
          <p className="mt-1 text-graphite-soft">
            You are not on a crew yet, so no jobs reach you here. The office adds you to a crew; its jobs then show here with their dates.
          </p>
        </section>
      )}
    </>
  );
}

/** Discount requests over a rep's limit: the approver's to decide, or the rep's own still waiting. */
function DiscountsWaiting({ discounts, approver }: { discounts: PendingDiscount[]; approver: boolean }) {
  if (discounts.length === 0) return null;
  return (
    <QueueSection
      id="pending-discounts"
      title={approver ? "Discounts waiting for your decision" : "Your discounts waiting for the office"}
      total={discounts.length}
      shown={discounts.length}
      tone="caution"
    >
      {discounts.map((d) => (
        <QueueItem key={d.id} aside={<span className="figure text-graphite">{formatCents(d.amountCents)}</span>}>
          <Link href={`/deals/${d.dealId}/offers`} className={linkClass}>
            {d.householdName}
          </Link>
          <span className="block text-sm text-graphite-soft">
            {d.offerName} · asked by {d.requestedByName ?? "a former colleague"}: “{d.reason}”
          </span>
        </QueueItem>
      ))}
    </QueueSection>
  );
}

function QuestionsQueue({ questions, timeZone }: { questions: TodayQueues["questions"]; timeZone: string }) {
  if (!questions) return null;
  return (
    <QueueSection id="customer-questions" title="Questions from your customers" total={questions.total} shown={questions.items.length} tone="caution">
      {questions.items.map((x) => (
        <QueueItem key={x.eventId} aside={formatDateTime(x.askedAt, timeZone)}>
          <Link href={`/deals/${x.dealId}/proposal`} className={linkClass}>
            {x.householdName}
          </Link>
          <span className="block max-w-xl text-sm text-graphite-soft">
            Proposal <span className="figure">{x.proposalNumber}</span>: “{x.body.length > 200 ? `${x.body.slice(0, 199)}…` : x.body}”
          </span>
        </QueueItem>
      ))}
    </QueueSection>
  );
}

function ProposalsOpenedQueue({ proposalsOpened, timeZone }: { proposalsOpened: TodayQueues["proposalsOpened"]; timeZone: string }) {
  if (!proposalsOpened) return null;
  const now = new Date();
  return (
    <QueueSection id="proposals-opened" title="Proposals opened, not signed" total={proposalsOpened.total} shown={proposalsOpened.items.length}>
      {proposalsOpened.items.map((p) => (
        <QueueItem
          key={p.proposalId}
          aside={
            <>
              opened {formatDate(p.firstOpenedAt, timeZone)}
              {p.lastViewedAt ? <>, last seen {formatDate(p.lastViewedAt, timeZone)}</> : null}
              {p.expiresAt < now ? <span className="text-danger"> · link expired</span> : <> · link until {formatDate(p.expiresAt, timeZone)}</>}
            </>
          }
        >
          <Link href={`/deals/${p.dealId}/proposal`} className={linkClass}>
            {p.householdName}
          </Link>
          <span className="block text-sm text-graphite-soft">
            Proposal <span className="figure">{p.number}</span>, version <span className="figure">{p.version}</span>
          </span>
        </QueueItem>
      ))}
    </QueueSection>
  );
}

function DepositsFlaggedQueue({ depositsFlagged }: { depositsFlagged: TodayQueues["depositsFlagged"] }) {
  if (!depositsFlagged) return null;
  return (
    <QueueSection id="deposits-flagged" title="Deposits flagged" total={depositsFlagged.total} shown={depositsFlagged.items.length} tone="danger">
      {depositsFlagged.items.map((p) => (
        <QueueItem key={p.paymentId} aside={<span className="figure text-graphite">{formatCents(p.paidCents ?? p.amountCents)}</span>}>
          <Link href={`/deals/${p.dealId}/money`} className={linkClass}>
            {p.householdName}
          </Link>
          <span className="block text-sm text-graphite-soft">
            Asked <span className="figure">{formatCents(p.amountCents)}</span>
            {p.flagReason ? ` · ${p.flagReason}` : ""}
          </span>
        </QueueItem>
      ))}
    </QueueSection>
  );
}

function RefundsDueQueue({ refundsDue }: { refundsDue: TodayQueues["refundsDue"] }) {
  if (!refundsDue) return null;
  return (
    <QueueSection id="refunds-due" title="Deposits to refund" total={refundsDue.total} shown={refundsDue.items.length} tone="danger">
      {refundsDue.items.map((p) => (
        <QueueItem
          key={p.paymentId}
          aside={
            <>
              <span className="figure text-graphite">{formatCents((p.paidCents ?? 0) - p.refundedCents)}</span> to refund
            </>
          }
        >
          <Link href={`/deals/${p.dealId}/money`} className={linkClass}>
            {p.householdName}
          </Link>
          <span className="block text-sm text-graphite-soft">
            Cancelled; paid <span className="figure">{formatCents(p.paidCents)}</span>, refunded <span className="figure">{formatCents(p.refundedCents)}</span>
          </span>
        </QueueItem>
      ))}
    </QueueSection>
  );
}

function JobsToScheduleQueue({ jobsToSchedule }: { jobsToSchedule: TodayQueues["jobsToSchedule"] }) {
  if (!jobsToSchedule) return null;
  return (
    <QueueSection id="jobs-to-schedule" title="Jobs to schedule" total={jobsToSchedule.total} shown={jobsToSchedule.items.length}>
      {jobsToSchedule.items.map((j) => (
        <QueueItem
          key={j.jobId}
          aside={[j.installDate ? `install ${day(j.installDate)}` : "no install date", j.hasCrew ? "crew assigned" : "no crew"].join(" · ")}
        >
          <Link href={`/jobs/${j.jobId}`} className={linkClass}>
            {j.householdName}
          </Link>
          <span className="block text-sm text-graphite-soft">{j.city}</span>
        </QueueItem>
      ))}
    </QueueSection>
  );
}

/** Open deals counted by stage, and the ones that moved last. */
function DealSummary({ summary }: { summary: TodaySummary }) {
  return (
    <>
      <section className="mt-8" aria-labelledby="stages-heading">
        <h2 id="stages-heading" className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">
          By stage
        </h2>
        <ul className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-6">
          {STAGES.map((stage) => (
            <li key={stage} className="card px-3 py-2">
              <p className="text-xs text-graphite-soft">{STAGE_LABELS[stage]}</p>
              <p className="figure text-xl">{summary.counts[stage]}</p>
            </li>
          ))}
        </ul>
      </section>
      <section className="mt-8" aria-labelledby="recent-heading">
        <h2 id="recent-heading" className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">
          Most recently moved
        </h2>
        <ul className="mt-2 divide-y divide-paper-line rounded-card border border-paper-line bg-white">
          {summary.recent.map((d) => (
            <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
              <Link href={`/deals/${d.id}`} className={linkClass}>
                {d.householdName}
              </Link>
              <span className="text-sm text-graphite-soft">
                {STAGE_LABELS[d.stage]} · <span className="figure">{formatKwFromWatts(d.systemDcWatts)}</span>
              </span>
            </li>
          ))}
          {summary.recent.length === 0 ? <li className="px-4 py-3 text-graphite-soft">No deals yet.</li> : null}
        </ul>
        <Link href="/deals" className="mt-3 inline-block text-sm text-copper underline-offset-2 hover:underline">
          All deals
        </Link>
      </section>
    </>
  );
}
