"use client";
// The live proposal: choose one of the offers, read it, and sign it.
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { formatCents } from "@/lib/format";
import type { Locale } from "@/lib/i18n/locales";
import type { ProposalSnapshot } from "@/lib/schemas/proposal";
import { OfferDetails, usePaybackText } from "./offer-details";
import { SigningPanel } from "./signing-panel";

export function ProposalView({ token, label, snapshot }: { token: string; label: string; snapshot: ProposalSnapshot }) {
  const [position, setPosition] = useState(snapshot.offers[0]?.position ?? 1);
  const t = useTranslations("page.choose");
  const locale = useLocale() as Locale;
  const paybackText = usePaybackText();
  const offer = snapshot.offers.find((o) => o.position === position) ?? snapshot.offers[0];
  if (!offer) return null;
  const many = snapshot.offers.length > 1;
  return (
    <div className="space-y-5">
      <fieldset className="card p-4">
        <legend className="float-left w-full text-lg font-semibold">{many ? t("legendMany", { count: snapshot.offers.length }) : t("legendOne")}</legend>
        <div className="clear-both space-y-2 pt-3">
          {snapshot.offers.map((o) => {
            const s = o.figures.summary;
            const selected = o.position === position;
            return (
              <label
                key={o.position}
                className={`flex min-h-touch cursor-pointer items-start gap-3 rounded-md border p-3 ${selected ? "border-copper bg-copper-light/40" : "border-paper-line bg-white"}`}
              >
                <input type="radio" name="offer" className="mt-1 h-5 w-5 accent-copper" checked={selected} onChange={() => setPosition(o.position)} />
                <span className="flex-1">
                  <span className="block font-medium">{o.name}</span>
                  <span className="block text-sm text-graphite-soft">
                    <span className="figure">{s.kwDc.toFixed(2)} kW</span> · <span className="figure">{formatCents(s.contractCents, locale)}</span> ·{" "}
                    {s.monthlyLoanPaymentCents !== null ? (
                      <>
                        <span className="figure">{t("perMonth", { amount: formatCents(s.monthlyLoanPaymentCents, locale) })}</span> ·{" "}
                      </>
                    ) : null}
                    {t("payback", { years: paybackText(s.paybackYears, o.figures.assumptions.years) })}
                  </span>
                </span>
              </label>
            );
          })}
        </div>
      </fieldset>

      <section aria-label={t("offerRegion", { name: offer.name })}>
        <h2 className="mb-3 text-xl font-semibold">{offer.name}</h2>
        <OfferDetails offer={offer} usageKwh={snapshot.usage.monthlyKwh} texts={snapshot.texts?.offers.find((x) => x.position === offer.position)} />
      </section>

      <SigningPanel
        token={token}
        label={label}
        companyName={snapshot.company.name}
        repName={snapshot.rep.name}
        repEmail={snapshot.rep.email}
        chosen={{ position: offer.position, name: offer.name, contractCents: offer.figures.summary.contractCents }}
      />
    </div>
  );
}
