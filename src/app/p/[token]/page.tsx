// The customer's proposal page: public, no account, phone first. Outside the (office) group,
// so no app navigation. The link's token is the only key; every state of the link (live,
// expired, revoked, replaced, signed, cancelled) has its own clear page, and only a live link
// can be signed.
import type { Metadata, Viewport } from "next";
import { headers } from "next/headers";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { HomeownerIntl } from "@/components/homeowner-intl";
import { LanguageSwitch } from "@/components/language-switch";
import { Wordmark } from "@/components/wordmark";
import { figureDefinitions } from "@/lib/figure-definitions";
import { formatCalendarDate, formatCents, formatDate, formatDateTime } from "@/lib/format";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { plainAssumptions, weatherSourcePlace } from "@/lib/plain-words";
import { proposalLinkState } from "@/lib/proposal-snapshot";
import { snapshotTexts } from "@/lib/snapshot-text";
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

export async function generateMetadata({ params }: { params: Promise<{ token: string }> }): Promise<Metadata> {
  const p = await findProposalByToken((await params).token);
  return {
    title: translator(p?.locale ?? "en", "page.meta")("title"),
    robots: { index: false, follow: false },
    // The token is in the address: never send it on to other sites.
    referrer: "no-referrer",
  };
}

/** The page's messages on the server, in the proposal's language. */
type T = ReturnType<typeof translator<"page">>;

/** Rich-text tags the page's messages use. */
const tags = {
  figure: (chunks: ReactNode) => <span className="figure font-semibold">{chunks}</span>,
  b: (chunks: ReactNode) => <strong>{chunks}</strong>,
  strong: (chunks: ReactNode) => <strong>{chunks}</strong>,
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
  // The homeowner's language for this proposal: the household's, or their choice on this page.
  const locale = p.locale;
  const t = translator(locale, "page");
  const rep = { rep: s.rep.name, email: s.rep.email, company: s.company.name };
  const at = (d: Date) => formatDateTime(d, timeZone, "minutes", locale);

  return (
    <HomeownerIntl locale={locale} timeZone={timeZone}>
      <Shell snapshot={s} label={label} token={token} t={t} locale={locale}>
        {state === "live" ? <LivePage p={p} token={token} label={label} timeZone={timeZone} t={t} /> : null}
        {state === "signed" ? <SignedPage p={p} token={token} timeZone={timeZone} t={t} /> : null}
        {state === "cancelled" ? <CancelledPage p={p} token={token} timeZone={timeZone} t={t} /> : null}
        {state === "expired" ? (
          <Notice title={t("states.expiredTitle")} testId="state-expired">
            {t("states.expired", { until: at(p.expiresAt), ...rep })}
          </Notice>
        ) : null}
        {state === "revoked" ? (
          <Notice title={t("states.revokedTitle")} testId="state-revoked">
            {p.revokedAt ? t("states.revokedOn", { date: formatDate(p.revokedAt, timeZone, locale), ...rep }) : t("states.revoked", rep)}
          </Notice>
        ) : null}
        {state === "replaced" ? (
          <Notice title={t("states.replacedTitle")} testId="state-replaced">
            {t("states.replaced", rep)}
          </Notice>
        ) : null}
      </Shell>
    </HomeownerIntl>
  );
}

function Shell({ snapshot: s, label, token, t, locale, children }: { snapshot: ProposalSnapshot; label: string; token: string; t: T; locale: Locale; children: ReactNode }) {
  return (
    <div lang={locale} className="mx-auto max-w-2xl px-4 pb-16 pt-5">
      <header className="border-b border-paper-line pb-4">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <p className="text-lg font-semibold">{s.company.name}</p>
          <LanguageSwitch token={token} />
        </div>
        {s.company.licenseNumber ? <p className="text-xs text-graphite-soft">{t("shell.license", { number: s.company.licenseNumber })}</p> : null}
        <h1 className="mt-3 text-2xl font-semibold">{t("shell.title", { household: s.household.name })}</h1>
        <p className="text-sm text-graphite-soft">{t.rich("shell.prepared", { label, rep: s.rep.name, email: s.rep.email, figure: (chunks) => <span className="figure">{chunks}</span> })}</p>
      </header>
      <main className="mt-5 space-y-5">{children}</main>
      <footer className="mt-10 flex items-center justify-between gap-3 border-t border-paper-line pt-4 text-xs text-graphite-soft">
        <Wordmark className="text-sm" />
        <a href={`/verify?lang=${locale}`} className="underline underline-offset-2">
          {t("shell.verifyLink")}
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

/** A station's name as a place ("GREENSBORO PIEDMONT TRIAD INT, NC" → "Greensboro Piedmont Triad Int, NC"). */
function stationPlace(name: string): string {
  const w = weatherSourcePlace(name);
  return w && "place" in w ? w.place : name;
}

function HouseholdCard({ s, t }: { s: ProposalSnapshot; t: T }) {
  const h = s.household;
  const annual = Math.round(s.usage.monthlyKwh.reduce((a, b) => a + b, 0));
  return (
    <section aria-labelledby="household-heading" className="card p-4">
      <h2 id="household-heading" className="text-lg font-semibold">
        {t("home.heading")}
      </h2>
      <p className="mt-1">{h.contactName ?? h.name}</p>
      <p className="text-sm text-graphite-soft">
        {h.street}, {h.city}, {h.region} {h.postalCode}
      </p>
      {s.utilityName ? <p className="text-sm text-graphite-soft">{t("home.utility", { name: s.utilityName })}</p> : null}
      {s.station ? (
        <p className="text-sm text-graphite-soft" data-testid="weather-station">
          {t("home.station", { place: stationPlace(s.station.name), km: s.station.distanceKm })}
        </p>
      ) : null}
      <p className="mt-2 text-sm">{t.rich("home.usage", { kwh: annual.toLocaleString("en-US"), figure: tags.figure })}</p>
    </section>
  );
}

/**
 * How the figures were made, in words: the assumption sentences without station ids or method
 * citations (src/lib/plain-words.ts), then the methods named the way a homeowner can look them up.
 * A snapshot's stored messages print in the page's language; an older snapshot's sentences as stored.
 */
function AssumptionsCard({ s, t, locale }: { s: ProposalSnapshot; t: T; locale: Locale }) {
  return (
    <section aria-labelledby="assumptions-heading" className="card p-4">
      <h2 id="assumptions-heading" className="text-lg font-semibold">
        {t("assumptions.heading")}
      </h2>
      <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
        {(s.texts ? snapshotTexts(s.texts.assumptions, locale) : plainAssumptions(s.assumptions, s.offers)).map((a) => (
          <li key={a}>{a}</li>
        ))}
        {s.offers.map((o) => {
          const simple = figureDefinitions(o.figures, o.inputs.payment.kind, locale).simplePayback;
          return simple ? <li key={`simple-${o.position}`}>{s.offers.length > 1 ? `${o.name}: ${simple}` : simple}</li> : null;
        })}
      </ul>
      <p className="mt-3 text-sm text-graphite-soft">{t("assumptions.method")}</p>
      {locale !== "en" && !s.texts ? <p className="mt-1 text-xs text-graphite-soft">{t("assumptions.dataNote")}</p> : null}
      <h3 className="mt-4 font-semibold">{t("assumptions.note")}</h3>
      <ul className="mt-2 list-disc space-y-1 rounded-md bg-caution-light py-2 pl-8 pr-3 text-sm">
        {(s.texts ? snapshotTexts(s.texts.cautions, locale) : s.cautions).map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}

/** The PDFs to keep; `signed` adds the signed copy (the signed page offers it in its confirmation instead). */
function Downloads({ token, signed, t }: { token: string; signed: boolean; t: T }) {
  return (
    <section aria-labelledby="downloads-heading" className="card p-4">
      <h2 id="downloads-heading" className="text-lg font-semibold">
        {t("downloads.heading")}
      </h2>
      <div className="mt-3 flex flex-col gap-2">
        {signed ? (
          <a href={`/api/public/proposals/${token}/signed-pdf`} className="btn-primary" download>
            {t("downloads.signed")}
          </a>
        ) : null}
        <a href={`/api/public/proposals/${token}/pdf`} className={signed ? "btn-quiet" : "btn-primary"} download>
          {t("downloads.proposal")}
        </a>
      </div>
    </section>
  );
}

function LivePage({ p, token, label, timeZone, t }: { p: ProposalRow; token: string; label: string; timeZone: string; t: T }) {
  const s = p.snapshot;
  return (
    <>
      <p className="text-sm">{t.rich("live.open", { until: formatDateTime(p.expiresAt, timeZone, "minutes", p.locale), b: tags.b })}</p>
      <HouseholdCard s={s} t={t} />
      <ProposalView token={token} label={label} snapshot={s} />
      <AssumptionsCard s={s} t={t} locale={p.locale} />
      <QuestionForm token={token} repName={s.rep.name} />
      <Downloads token={token} signed={false} t={t} />
    </>
  );
}

async function SignedPage({ p, token, timeZone, t }: { p: ProposalRow; token: string; timeZone: string; t: T }) {
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
          {t.rich("signed.text", {
            signer: p.signerName ?? "",
            date: p.signedAt ? formatDateTime(p.signedAt, timeZone, "minutes", p.locale) : "—",
            offer: offer.name,
            price: formatCents(offer.figures.summary.contractCents, p.locale),
            figure: tags.figure,
          })}
        </p>
        <a href={`/api/public/proposals/${token}/signed-pdf`} className="btn-primary mt-3 w-full" download>
          {t("downloads.signed")}
        </a>
        {depositDue && deposit ? (
          <div className="mt-4 border-t border-sage/40 pt-3">
            <p className="font-semibold">{t("signed.nextDeposit")}</p>
            <p className="mt-1 text-sm">{t.rich("signed.depositAsk", { company: s.company.name, amount: deposit.amountText, figure: (chunks) => <span className="figure">{chunks}</span> })}</p>
            <a href="#deposit-panel" className="btn-quiet mt-2 w-full">
              {t("signed.payDeposit", { amount: deposit.amountText })}
            </a>
          </div>
        ) : null}
        <p className="mt-3 break-all text-xs text-graphite-soft">
          {t.rich("signed.fingerprint", {
            sha256: p.signedSha256 ?? "",
            figure: (chunks) => <span className="figure">{chunks}</span>,
            verify: (chunks) => (
              <a href={`/verify?lang=${p.locale}`} className="underline">
                {chunks}
              </a>
            ),
          })}
        </p>
      </section>
      <Downloads token={token} signed={false} t={t} />
      <DepositPanel token={token} />
      <ProjectPanel token={token} />
      {cancelWindow ? <RightToCancel p={p} token={token} cancelWindow={cancelWindow} t={t} /> : null}
      <section aria-label={t("signed.offerRegion", { name: offer.name })}>
        <h2 className="mb-3 text-xl font-semibold">{offer.name}</h2>
        <OfferDetails offer={offer} usageKwh={s.usage.monthlyKwh} texts={s.texts?.offers.find((x) => x.position === offer.position)} />
      </section>
      <AssumptionsCard s={s} t={t} locale={p.locale} />
      <QuestionForm token={token} repName={s.rep.name} />
    </>
  );
}

function RightToCancel({ p, token, cancelWindow, t }: { p: ProposalRow; token: string; cancelWindow: { deadline: string; timeZone: string; open: boolean }; t: T }) {
  const deadlineText = formatCalendarDate(cancelWindow.deadline, "full", p.locale);
  return (
    <section aria-labelledby="cancel-heading" className="card p-4" data-testid="right-to-cancel">
      <h2 id="cancel-heading" className="text-lg font-semibold">
        {t("cancel.heading")}
      </h2>
      <LegalInTranslation locale={p.locale} t={t}>
        {(lt, l) => <CancelNotice p={p} cancelWindow={cancelWindow} t={lt} locale={l} testIds={l === p.locale} />}
      </LegalInTranslation>
      <div className="mt-3">
        {cancelWindow.open ? (
          <CancelForm token={token} deadlineText={deadlineText} />
        ) : (
          <p className="text-sm text-graphite-soft" data-testid="cancel-closed">
            {t("cancel.closed", { deadline: deadlineText })}
          </p>
        )}
      </div>
    </section>
  );
}

/**
 * Legal text in the homeowner's language; in a translation it says so and keeps the English
 * text, which prevails (our choice), one tap away.
 */
function LegalInTranslation({ locale, t, children }: { locale: Locale; t: T; children: (t: T, locale: Locale) => ReactNode }) {
  if (locale === "en") return <>{children(t, locale)}</>;
  return (
    <>
      <p className="mt-2 text-xs font-semibold text-copper-dark">{translator(locale, "legal")("translationNotice")}</p>
      {children(t, locale)}
      <details className="mt-3 text-sm" lang="en">
        <summary className="min-h-touch cursor-pointer py-2 underline" lang={locale}>
          {t("esign.englishText")}
        </summary>
        {children(translator("en", "page"), "en")}
      </details>
    </>
  );
}

/** The rule's explanation and the notice of cancellation (16 CFR 429.1), with this sale's dates. */
function CancelNotice({ p, cancelWindow, t, locale, testIds }: { p: ProposalRow; cancelWindow: { deadline: string; timeZone: string }; t: T; locale: Locale; testIds: boolean }) {
  const s = p.snapshot;
  const deadline = formatCalendarDate(cancelWindow.deadline, "full", locale);
  const signedOn = p.signedAt ? formatCalendarDate(dateInZone(p.signedAt, cancelWindow.timeZone), "full", locale) : "—";
  return (
    <>
      <p className="mt-2 text-sm">
        {t.rich("cancel.intro", {
          deadline,
          company: s.company.name,
          b: (chunks) => <strong data-testid={testIds ? "cancel-deadline" : undefined}>{chunks}</strong>,
        })}
      </p>
      <div className="mt-3 rounded-md border border-paper-line p-3 text-sm">
        <h3 className="text-center font-semibold tracking-wide">{t("cancel.noticeTitle")}</h3>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
          <dt className="text-graphite-soft">{t("cancel.transactionDate")}</dt>
          <dd>{signedOn}</dd>
          <dt className="text-graphite-soft">{t("cancel.lastDay")}</dt>
          <dd>{deadline}</dd>
        </dl>
        <p className="mt-2 font-semibold">{t("cancel.s1")}</p>
        <p className="mt-2 font-semibold">{t("cancel.s2")}</p>
        <p className="mt-2">{t("cancel.how", { company: s.company.name, email: s.rep.email, deadline })}</p>
      </div>
    </>
  );
}

function CancelledPage({ p, token, timeZone, t }: { p: ProposalRow; token: string; timeZone: string; t: T }) {
  const s = p.snapshot;
  const who = { company: s.company.name, rep: s.rep.name, email: s.rep.email };
  return (
    <>
      <Notice title={t("states.cancelledTitle")} testId="state-cancelled">
        {p.cancelledAt ? t("states.cancelledOn", { date: formatDateTime(p.cancelledAt, timeZone, "minutes", p.locale), ...who }) : t("states.cancelled", who)}
      </Notice>
      {p.signedStorageKey ? <Downloads token={token} signed t={t} /> : null}
      <DepositPanel token={token} />
    </>
  );
}
