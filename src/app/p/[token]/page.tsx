// The customer's proposal page: public, no account, phone first. Outside the (office) group,
// so no app navigation. The link's token is the only key; every state of the link (live,
// expired, revoked, replaced, signed, cancelled) has its own clear page, and only a live link
// can be signed.
import type { Metadata, Viewport } from "next";
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/wordmark";
import { figureDefinitions } from "@/lib/figure-definitions";
import { formatCents, formatDate, formatDateTime } from "@/lib/format";
import { plainAssumptions } from "@/lib/plain-words";
import { formatIsoDateLong, proposalLinkState } from "@/lib/proposal-snapshot";
import { dateInZone } from "@/lib/zoned-time";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import { clientMeta } from "@/server/client-address";
import { getCompanySettings } from "@/server/company-settings";
import { depositForProposal } from "@/server/payments";
import { cancelWindowOf, findProposalByToken, labelOf, recordProposalView, type ProposalRow } from "@/server/proposals";
import { CancelForm } from "./cancel-form";
import { DepositPanel } from "./deposit-panel";
import { OfferDetails } from "./offer-details";
import { ProjectPanel } from "./project-panel";
import { ProposalView } from "./proposal-view";
import { QuestionForm } from "./question-form";
import { SignedHeading } from "./signed-heading";

export const metadata: Metadata = {
  title: "Your solar proposal",
  robots: { index: false, follow: false },
  // The token is in the address: never send it on to other sites.
  referrer: "no-referrer",
};
export const viewport: Viewport = { width: "device-width", initialScale: 1, themeColor: "#FAF7F2" };

export default async function CustomerProposalPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const p = await findProposalByToken(token);
  if (!p) notFound();
  try {
    await recordProposalView(p, clientMeta(await headers()));
  } catch (err) {
    console.error("could not record a proposal view", p.id, err); // the customer still reads the page
  }
  const s = p.snapshot;
  const label = labelOf(p);
  const state = proposalLinkState(p);
  const { timeZone } = await getCompanySettings(p.companyId); // every time on this page is on the company's clock

  return (
    <Shell snapshot={s} label={label}>
      {state === "live" ? <LivePage p={p} token={token} label={label} timeZone={timeZone} /> : null}
      {state === "signed" ? <SignedPage p={p} token={token} timeZone={timeZone} /> : null}
      {state === "cancelled" ? <CancelledPage p={p} token={token} timeZone={timeZone} /> : null}
      {state === "expired" ? (
        <Notice title="This proposal has expired" testId="state-expired">
          Its link worked until {formatDateTime(p.expiresAt, timeZone)}. Prices and incentives change, so ask {s.rep.name} ({s.rep.email}) for an up-to-date proposal.
        </Notice>
      ) : null}
      {state === "revoked" ? (
        <Notice title="This proposal was withdrawn" testId="state-revoked">
          {s.company.name} withdrew this proposal{p.revokedAt ? ` on ${formatDate(p.revokedAt, timeZone)}` : ""}, so it can no longer be read or signed. Ask {s.rep.name} ({s.rep.email}) if you
          expected it.
        </Notice>
      ) : null}
      {state === "replaced" ? (
        <Notice title="This proposal was replaced by a newer version" testId="state-replaced">
          {s.company.name} sent you a newer version of this proposal. Use the link in the newest e-mail from {s.rep.name}; this one can no longer be signed.
        </Notice>
      ) : null}
    </Shell>
  );
}

function Shell({ snapshot: s, label, children }: { snapshot: ProposalSnapshot; label: string; children: ReactNode }) {
  return (
    <div className="mx-auto max-w-2xl px-4 pb-16 pt-5">
      <header className="border-b border-paper-line pb-4">
        <p className="text-lg font-semibold">{s.company.name}</p>
        {s.company.licenseNumber ? <p className="text-xs text-graphite-soft">License {s.company.licenseNumber}</p> : null}
        <h1 className="mt-3 text-2xl font-semibold">Solar proposal for the {s.household.name}</h1>
        <p className="text-sm text-graphite-soft">
          Proposal <span className="figure">{label}</span> · prepared by {s.rep.name} ({s.rep.email})
        </p>
      </header>
      <main className="mt-5 space-y-5">{children}</main>
      <footer className="mt-10 flex items-center justify-between gap-3 border-t border-paper-line pt-4 text-xs text-graphite-soft">
        <Wordmark className="text-sm" />
        <a href="/verify" className="underline underline-offset-2">
          Check a signed PDF
        </a>
      </footer>
    </div>
  );
}

function Notice({ title, children, testId }: { title: string; children: ReactNode; testId: string }) {
  return (
    <section className="card p-5" role="status" data-testid={testId}>
      <h2 className="text-xl font-semibold">{title}</h2>
      <p className="mt-2">{children}</p>
    </section>
  );
}

function HouseholdCard({ s }: { s: ProposalSnapshot }) {
  const h = s.household;
  const annual = Math.round(s.usage.monthlyKwh.reduce((a, b) => a + b, 0));
  return (
    <section aria-labelledby="household-heading" className="card p-4">
      <h2 id="household-heading" className="text-lg font-semibold">
        Your home
      </h2>
      <p className="mt-1">{h.contactName ?? h.name}</p>
      <p className="text-sm text-graphite-soft">
        {h.street}, {h.city}, {h.region} {h.postalCode}
      </p>
      {s.utilityName ? <p className="text-sm text-graphite-soft">Utility: {s.utilityName}</p> : null}
      <p className="mt-2 text-sm">
        You use about <span className="figure font-semibold">{annual.toLocaleString("en-US")} kWh</span> of electricity a year.
      </p>
    </section>
  );
}

/**
 * How the figures were made, in words: the assumption sentences without station ids or method
 * citations (src/lib/plain-words.ts), then the methods named the way a homeowner can look them up.
 */
function AssumptionsCard({ s }: { s: ProposalSnapshot }) {
  return (
    <section aria-labelledby="assumptions-heading" className="card p-4">
      <h2 id="assumptions-heading" className="text-lg font-semibold">
        How we estimated this
      </h2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
        {plainAssumptions(s.assumptions, s.offers).map((a) => (
          <li key={a}>{a}</li>
        ))}
        {s.offers.map((o) => {
          const simple = figureDefinitions(o.figures, o.inputs.payment.kind).simplePayback;
          return simple ? <li key={`simple-${o.position}`}>{s.offers.length > 1 ? `${o.name}: ${simple}` : simple}</li> : null;
        })}
      </ul>
      <p className="mt-3 text-sm text-graphite-soft">
        Production is estimated hour by hour over a typical year with the method of the U.S. National Renewable Energy Laboratory&apos;s free PVWatts calculator; bills with and
        without solar follow your utility&apos;s published rates.
      </p>
      <h3 className="mt-4 font-semibold">Please note</h3>
      <ul className="mt-2 list-disc space-y-1 rounded-md bg-caution-light py-2 pl-8 pr-3 text-sm">
        {s.cautions.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}

/** The PDFs to keep; `signed` adds the signed copy (the signed page offers it in its confirmation instead). */
function Downloads({ token, signed }: { token: string; signed: boolean }) {
  return (
    <section aria-labelledby="downloads-heading" className="card p-4">
      <h2 id="downloads-heading" className="text-lg font-semibold">
        Keep a copy
      </h2>
      <div className="mt-3 flex flex-col gap-2">
        {signed ? (
          <a href={`/api/public/proposals/${token}/signed-pdf`} className="btn-primary" download>
            Download the signed PDF
          </a>
        ) : null}
        <a href={`/api/public/proposals/${token}/pdf`} className={signed ? "btn-quiet" : "btn-primary"} download>
          Download the proposal PDF
        </a>
      </div>
    </section>
  );
}

function LivePage({ p, token, label, timeZone }: { p: ProposalRow; token: string; label: string; timeZone: string }) {
  const s = p.snapshot;
  return (
    <>
      <p className="text-sm">
        This proposal is open until <strong>{formatDateTime(p.expiresAt, timeZone)}</strong>. Read it at your own pace, ask a question, and sign when you are ready.
      </p>
      <HouseholdCard s={s} />
      <ProposalView token={token} label={label} snapshot={s} />
      <AssumptionsCard s={s} />
      <QuestionForm token={token} repName={s.rep.name} />
      <Downloads token={token} signed={false} />
    </>
  );
}

async function SignedPage({ p, token, timeZone }: { p: ProposalRow; token: string; timeZone: string }) {
  const s = p.snapshot;
  const offer = s.offers.find((o) => o.position === p.chosenPosition) ?? s.offers[0];
  const cancelWindow = await cancelWindowOf(p);
  const deposit = await depositForProposal(p);
  const depositDue = !!deposit && deposit.canPay && ["due", "open", "failed", "expired"].includes(deposit.status);
  return (
    <>
      <section aria-labelledby="signed-heading" className="card border-sage/40 bg-sage-light p-4" data-testid="state-signed">
        <SignedHeading token={token} />
        <p className="mt-1">
          {p.signerName} signed on {p.signedAt ? formatDateTime(p.signedAt, timeZone) : "—"}, choosing &ldquo;{offer.name}&rdquo; at{" "}
          <span className="figure font-semibold">{formatCents(offer.figures.summary.contractCents)}</span>. A copy was also e-mailed to you.
        </p>
        <a href={`/api/public/proposals/${token}/signed-pdf`} className="btn-primary mt-3 w-full" download>
          Download the signed PDF
        </a>
        {depositDue && deposit ? (
          <div className="mt-4 border-t border-sage/40 pt-3">
            <p className="font-semibold">Next: the deposit</p>
            <p className="mt-1 text-sm">
              {s.company.name} asks for a deposit of <span className="figure">{deposit.amountText}</span> to start your project. It counts toward the price.
            </p>
            <a href="#deposit-panel" className="btn-quiet mt-2 w-full">
              Pay the deposit: {deposit.amountText}
            </a>
          </div>
        ) : null}
        <p className="mt-3 break-all text-xs text-graphite-soft">
          Fingerprint (SHA-256) of the signed PDF: <span className="figure">{p.signedSha256}</span>. Anyone can check a copy on the{" "}
          <a href="/verify" className="underline">
            verify page
          </a>
          .
        </p>
      </section>
      <Downloads token={token} signed={false} />
      <DepositPanel token={token} />
      <ProjectPanel token={token} />
      {cancelWindow ? <RightToCancel p={p} token={token} cancelWindow={cancelWindow} /> : null}
      <section aria-label={`Your offer ${offer.name}`}>
        <h2 className="mb-3 text-xl font-semibold">{offer.name}</h2>
        <OfferDetails offer={offer} usageKwh={s.usage.monthlyKwh} />
      </section>
      <AssumptionsCard s={s} />
      <QuestionForm token={token} repName={s.rep.name} />
    </>
  );
}

function RightToCancel({ p, token, cancelWindow }: { p: ProposalRow; token: string; cancelWindow: { deadline: string; timeZone: string; open: boolean } }) {
  const s = p.snapshot;
  const deadlineText = formatIsoDateLong(cancelWindow.deadline);
  const signedOn = p.signedAt ? formatIsoDateLong(dateInZone(p.signedAt, cancelWindow.timeZone)) : "—";
  return (
    <section aria-labelledby="cancel-heading" className="card p-4" data-testid="right-to-cancel">
      <h2 id="cancel-heading" className="text-lg font-semibold">
        Your right to cancel
      </h2>
      <p className="mt-2 text-sm">
        You signed this agreement in your home, so U.S. law (the Federal Trade Commission&apos;s rule, 16 CFR Part 429) lets you cancel it without any penalty or obligation
        until midnight at the end of <strong data-testid="cancel-deadline">{deadlineText}</strong>. {s.company.name} counts business days as Monday to Friday without federal
        holidays, which never gives you less time than the rule.
      </p>
      <div className="mt-3 rounded-md border border-paper-line p-3 text-sm">
        <h3 className="text-center font-semibold tracking-wide">NOTICE OF CANCELLATION</h3>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
          <dt className="text-graphite-soft">Date of transaction</dt>
          <dd>{signedOn}</dd>
          <dt className="text-graphite-soft">Last day to cancel</dt>
          <dd>{deadlineText}</dd>
        </dl>
        <p className="mt-2 font-semibold">You may CANCEL this transaction, without any Penalty or Obligation, within THREE BUSINESS DAYS from the above date.</p>
        <p className="mt-2 font-semibold">
          If you cancel, any property traded in, any payments made by you under the contract or sale, and any negotiable instrument executed by you will be returned within TEN
          BUSINESS DAYS following receipt by the seller of your cancellation notice, and any security interest arising out of the transaction will be cancelled.
        </p>
        <p className="mt-2">
          To cancel, use the button below, or mail or deliver a signed and dated copy of the notice in your signed PDF (or any other written notice) to {s.company.name}, or e-mail{" "}
          {s.rep.email}, not later than midnight of {deadlineText}.
        </p>
      </div>
      <div className="mt-3">
        {cancelWindow.open ? (
          <CancelForm token={token} deadlineText={deadlineText} />
        ) : (
          <p className="text-sm text-graphite-soft" data-testid="cancel-closed">
            The time to cancel ended with {deadlineText}.
          </p>
        )}
      </div>
    </section>
  );
}

function CancelledPage({ p, token, timeZone }: { p: ProposalRow; token: string; timeZone: string }) {
  const s = p.snapshot;
  return (
    <>
      <Notice title="This agreement was cancelled" testId="state-cancelled">
        You cancelled the agreement{p.cancelledAt ? ` on ${formatDateTime(p.cancelledAt, timeZone)}` : ""}, inside the time the law gives you. {s.company.name} returns any payment you made,
        including a deposit, within ten business days. Questions: {s.rep.name} ({s.rep.email}).
      </Notice>
      {p.signedStorageKey ? <Downloads token={token} signed /> : null}
      <DepositPanel token={token} />
    </>
  );
}
