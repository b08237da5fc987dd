import type { Metadata } from "next";
import Link from "next/link";
import { STAGES } from "@/db/schema";
import { can } from "@/lib/permissions";
import { STAGE_LABELS } from "@/lib/stages";
import { daysSince, formatCents, formatKwFromWatts } from "@/lib/format";
import { isStalled } from "@/lib/stage-rules";
import { countDealsByStage, listDeals } from "@/server/deals";
import { listPendingDiscountRequests } from "@/server/offers";
import { listPendingInvitations } from "@/server/people";
import { getMember } from "@/server/session";

export const metadata: Metadata = { title: "Today" };

export default async function TodayPage() {
  const member = await getMember();
  if (!member) return null; // the layout has already sent the person to sign in
  const first = member.name.split(" ")[0];

  if (member.role === "crew") {
    return (
      <>
        <h1 className="text-2xl font-semibold">Good day, {first}</h1>
        <section className="card mt-6 p-5">
          <h2 className="font-semibold">Your jobs</h2>
          <p className="mt-1 text-graphite-soft">
            No jobs are assigned to you. A job reaches you here once the customer has paid the deposit and the office
            assigns your crew.
          </p>
        </section>
      </>
    );
  }

  const [counts, deals, invitations, discounts] = await Promise.all([
    countDealsByStage(member),
    listDeals(member),
    can(member.role, "people:read") ? listPendingInvitations(member.companyId) : Promise.resolve([]),
    listPendingDiscountRequests(member),
  ]);
  const approver = can(member.role, "discounts:approve");
  // Flagged by the board's default day limits per stage (src/lib/stage-rules.ts).
  const stalled = deals.filter((d) => isStalled(d.stage, daysSince(d.stageChangedAt)));
  const scope = can(member.role, "deals:read-all") ? "The company's deals" : "Your deals";
  const open = deals.filter((d) => !["live", "lost", "cancelled"].includes(d.stage));
  const pipelineCents = open.reduce((sum, d) => sum + (d.contractCents ?? 0), 0);

  return (
    <>
      <h1 className="text-2xl font-semibold">Good day, {first}</h1>
      <p className="mt-1 text-graphite-soft">
        {scope}: <span className="figure">{open.length}</span> open, worth <span className="figure">{formatCents(pipelineCents)}</span> in
        signed and priced contracts.
      </p>
      {discounts.length > 0 ? (
        <section className="card mt-6 border-caution/40 p-5" aria-labelledby="discounts-heading">
          <h2 id="discounts-heading" className="font-semibold">
            {approver ? "Discounts waiting for your decision" : "Your discounts waiting for the office"}
          </h2>
          <ul className="mt-2 divide-y divide-paper-line" data-testid="pending-discounts">
            {discounts.map((d) => (
              <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <span>
                  <Link href={`/deals/${d.dealId}/offers`} className="font-medium underline-offset-2 hover:text-copper hover:underline">
                    {d.householdName}
                  </Link>
                  <span className="block text-sm text-graphite-soft">
                    {d.offerName} · asked by {d.requestedByName ?? "a former colleague"}: “{d.reason}”
                  </span>
                </span>
                <span className="figure">{formatCents(d.amountCents)}</span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {stalled.length > 0 ? (
        <section className="card mt-6 p-5" aria-labelledby="stalled-heading">
          <h2 id="stalled-heading" className="font-semibold">
            Stalled deals
          </h2>
          <ul className="mt-2 divide-y divide-paper-line" data-testid="stalled-deals">
            {stalled.map((d) => (
              <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
                <Link href={`/deals/${d.id}`} className="font-medium underline-offset-2 hover:text-copper hover:underline">
                  {d.householdName}
                </Link>
                <span className="text-sm text-graphite-soft">
                  {STAGE_LABELS[d.stage]} for <span className="figure">{daysSince(d.stageChangedAt)}</span> days
                </span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <section className="mt-6" aria-labelledby="stages-heading">
        <h2 id="stages-heading" className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">
          By stage
        </h2>
        <ul className="mt-2 grid grid-cols-2 gap-2 sm:grid-cols-4 lg:grid-cols-6">
          {STAGES.map((stage) => (
            <li key={stage} className="card px-3 py-2">
              <p className="text-xs text-graphite-soft">{STAGE_LABELS[stage]}</p>
              <p className="figure text-xl">{counts[stage]}</p>
            </li>
          ))}
        </ul>
      </section>
      <section className="mt-8" aria-labelledby="recent-heading">
        <h2 id="recent-heading" className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">
          Most recently moved
        </h2>
        <ul className="mt-2 divide-y divide-paper-line rounded-card border border-paper-line bg-white">
          {deals.slice(0, 5).map((d) => (
            <li key={d.id} className="flex flex-wrap items-center justify-between gap-2 px-4 py-3">
              <span className="font-medium">{d.householdName}</span>
              <span className="text-sm text-graphite-soft">
                {STAGE_LABELS[d.stage]} · <span className="figure">{formatKwFromWatts(d.systemDcWatts)}</span>
              </span>
            </li>
          ))}
          {deals.length === 0 ? <li className="px-4 py-3 text-graphite-soft">No deals yet.</li> : null}
        </ul>
        <Link href="/deals" className="mt-3 inline-block text-sm text-copper underline-offset-2 hover:underline">
          All deals
        </Link>
      </section>
      {invitations.length > 0 ? (
        <section className="mt-8">
          <h2 className="text-sm font-semibold uppercase tracking-wide text-graphite-soft">Waiting to join</h2>
          <p className="mt-1 text-graphite-soft">
            {invitations.length} invitation{invitations.length === 1 ? "" : "s"} not yet accepted.{" "}
            <Link href="/settings/people" className="text-copper underline-offset-2 hover:underline">
              People
            </Link>
          </p>
        </section>
      ) : null}
    </>
  );
}
