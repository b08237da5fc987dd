"use client";
// One offer of the snapshot as the customer reads it: the system, production against their
// usage, the money (price, incentives, net cost, payment, deposit), the savings and the
// cumulative cash flow. Every figure comes from the frozen snapshot.
import { useLocale, useTranslations } from "next-intl";
import type { ReactNode } from "react";
import { figureDefinitions, figureMeanings } from "@/lib/figure-definitions";
import { formatCents, formatCentsExact, formatSignedCents } from "@/lib/format";
import { formatAprPct } from "@/lib/plain-words";
import type { Locale } from "@/lib/i18n/locales";
import type { ProposalSnapshot, ProposalSnapshotOffer } from "@/lib/schemas/proposal";
import { snapshotText } from "@/lib/snapshot-text";
import { CashflowChart, UsageProductionChart } from "./charts";

type OfferTexts = NonNullable<ProposalSnapshot["texts"]>["offers"][number];

const kwh = (x: number) => `${Math.round(x).toLocaleString("en-US")} kWh`;
/** Payback in years; none within the years the figures cover says how many years those are. */
export function usePaybackText(): (y: number | null, years: number) => string {
  const t = useTranslations("page.offer");
  return (y, years) => (y === null ? t("paybackNone", { years }) : t("paybackYears", { years: y.toFixed(1) }));
}
const roiText = (r: number | null) => (r === null ? "—" : `${(r * 100).toFixed(0)} %`);
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

/** One figure: its label, its value and, where given, a line on what it means. */
function Row({ label, value, strong = false, testId, meaning }: { label: string; value: string; strong?: boolean; testId?: string; meaning?: string }) {
  return (
    <div className={`flex items-baseline justify-between gap-3 py-1.5 ${strong ? "font-semibold" : ""}`}>
      <dt className={strong ? "" : "text-graphite-soft"}>
        {label}
        {meaning ? <span className="block text-xs font-normal text-graphite-soft">{meaning}</span> : null}
      </dt>
      <dd className="figure whitespace-nowrap text-right" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

type T = ReturnType<typeof useTranslations<"page.offer">>;

function paymentText(o: ProposalSnapshotOffer, t: T): string {
  const p = o.inputs.payment;
  if (p.kind === "cash") return t("cash");
  const loan = { apr: formatAprPct(p.aprPct), months: p.termMonths };
  return p.dealerFeePct > 0 ? t("loanFee", { ...loan, fee: p.dealerFeePct }) : t("loan", loan);
}

const figure = (chunks: ReactNode) => <span className="figure">{chunks}</span>;

/** What payback and ROI mean for this offer (and why there is no IRR, when there is none). */
function FigureMeanings({ offer }: { offer: ProposalSnapshotOffer }) {
  const d = figureDefinitions(offer.figures, offer.inputs.payment.kind, useLocale() as Locale);
  return (
    <ul className="mt-2 space-y-1 text-xs text-graphite-soft" data-testid={`figure-definitions-${offer.position}`}>
      <li>{d.payback}</li>
      <li>{d.roi}</li>
      {d.irr ? <li>{d.irr}</li> : null}
    </ul>
  );
}

/** The system: modules, inverter, roof faces, production against usage. */
function SystemSection({ offer, usageKwh, means }: { offer: ProposalSnapshotOffer; usageKwh: number[]; means: ReturnType<typeof figureMeanings> }) {
  const t = useTranslations("page.offer");
  const f = offer.figures;
  const s = f.summary;
  const eq = offer.equipment;
  return (
    <section aria-label={t("system")} className="card p-4">
      <h3 className="font-semibold">{t("system")}</h3>
      <p className="mt-1 text-sm">
        {t.rich("modules", {
          count: eq.moduleCount,
          make: eq.module.manufacturer,
          model: eq.module.model,
          watts: eq.module.stcWatts,
          kw: s.kwDc.toFixed(2),
          figure,
          strong: (chunks) => <span className="figure font-semibold">{chunks}</span>,
        })}
      </p>
      <p className="text-sm">
        {eq.inverter.kind === "micro"
          ? t("micro", { make: eq.inverter.manufacturer, model: eq.inverter.model })
          : t("string", { make: eq.inverter.manufacturer, model: eq.inverter.model, kw: (eq.inverter.acWatts / 1000).toFixed(1) })}
      </p>
      <ul className="mt-2 space-y-0.5 text-sm text-graphite-soft">
        {eq.faces.map((face) => (
          <li key={face.name}>{t.rich("face", { name: face.name, count: face.moduleCount, tilt: face.tiltDeg, azimuth: face.azimuthDeg, access: face.solarAccessPct, figure })}</li>
        ))}
      </ul>
      <dl className="mt-3 divide-y divide-paper-line text-sm">
        <Row label={t("production")} value={kwh(s.annualProductionKwh)} meaning={means.production} />
        <Row label={t("usage")} value={kwh(sum(usageKwh))} meaning={means.usage} />
        <Row label={t("share")} value={`${s.offsetPct.toFixed(0)} %`} meaning={means.offset} />
      </dl>
      <div className="mt-3">
        <UsageProductionChart usageKwh={usageKwh} productionKwh={f.monthly.productionKwh} />
      </div>
    </section>
  );
}

/** A price line in the reader's language: our words from the snapshot's messages (a new snapshot), a price-book name as typed. */
function priceLineText(l: ProposalSnapshotOffer["figures"]["price"]["lines"][number], own: OfferTexts["priceLines"][number] | undefined, locale: Locale): string {
  const label = own ? snapshotText(own.label, locale) : l.label;
  const detail = own ? snapshotText(own.detail, locale) : l.detail;
  return detail ? `${label} (${detail})` : label;
}

/** `texts`: the offer's stored messages (absent on older snapshots, which print their English as stored). */
export function OfferDetails({ offer, usageKwh, texts }: { offer: ProposalSnapshotOffer; usageKwh: number[]; texts?: OfferTexts }) {
  const f = offer.figures;
  const s = f.summary;
  const billBefore = sum(f.monthly.billWithoutSolarCents);
  const billAfter = sum(f.monthly.billWithSolarCents);
  const t = useTranslations("page.offer");
  const locale = useLocale() as Locale;
  const money = (c: number) => formatCents(c, locale);
  const paybackText = usePaybackText();
  const years = f.assumptions.years;
  const means = figureMeanings(years, locale);
  return (
    <div className="space-y-5" data-testid={`offer-details-${offer.position}`}>
      <SystemSection offer={offer} usageKwh={usageKwh} means={means} />

      <section aria-label={t("price")} className="card p-4">
        <h3 className="font-semibold">{t("price")}</h3>
        <dl className="mt-2 divide-y divide-paper-line text-sm">
          {f.price.lines.map((l, i) => (
            <Row key={`${l.kind}-${l.id ?? i}`} label={priceLineText(l, texts?.priceLines[i], locale)} value={money(l.amountCents)} />
          ))}
          <Row label={t("priceTotal")} value={money(s.contractCents)} strong testId={`price-${offer.position}`} meaning={means.price} />
          {f.incentives.applied.map((a) => (
            <Row key={a.id} label={a.year === 0 ? t("incentiveAtSigning", { name: a.name }) : t("incentiveYear", { name: a.name, year: a.year })} value={`−${money(a.amountCents)}`} />
          ))}
          <Row label={t("netCost")} value={money(s.netCostCents)} strong meaning={means.netCost} />
          <Row label={t("payment")} value={paymentText(offer, t)} />
          {s.monthlyLoanPaymentCents !== null ? <Row label={t("monthlyLoan")} value={money(s.monthlyLoanPaymentCents)} strong meaning={means.monthlyLoan} /> : null}
          <Row label={t("deposit")} value={formatCentsExact(offer.depositCents, "usd", locale)} meaning={means.deposit} />
        </dl>
      </section>

      <section aria-label={t("saves")} className="card p-4">
        <h3 className="font-semibold">{t("saves")}</h3>
        <dl className="mt-2 divide-y divide-paper-line text-sm">
          <Row label={t("billWithout")} value={money(billBefore)} meaning={means.billWithout} />
          <Row label={t("billWith")} value={money(billAfter)} meaning={means.billWith} />
          <Row label={t("savings1")} value={money(s.year1SavingsCents)} strong meaning={means.year1Savings} />
          <Row label={t("payback")} value={paybackText(s.paybackYears, years)} strong />
          <Row label={t("roi")} value={roiText(s.simpleRoi)} />
          <Row label={t("billSavings", { years })} value={money(s.lifetimeSavingsCents)} meaning={means.lifetimeSavings} />
          <Row label={t("ahead", { years })} value={formatSignedCents(s.lifetimeNetCents, locale)} meaning={means.ahead} />
        </dl>
        <FigureMeanings offer={offer} />
        <div className="mt-3">
          <CashflowChart cumulativeCents={f.rows.map((r) => r.cumulativeCents)} />
        </div>
      </section>
    </div>
  );
}
