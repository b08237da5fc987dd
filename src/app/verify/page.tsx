import type { Metadata } from "next";
import { HomeownerIntl } from "@/components/homeowner-intl";
import { LanguageSwitch } from "@/components/language-switch";
import { Wordmark } from "@/components/wordmark";
import { DEFAULT_LOCALE, LOCALES, type Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { VerifyClient } from "./verify-client";

type Props = { searchParams: Promise<{ lang?: string | string[] }> };

/** The page's language: `?lang=` (the homeowner's page links here in its own language; the switch sets it), else English. */
async function pageLocale(searchParams: Props["searchParams"]): Promise<Locale> {
  const lang = (await searchParams).lang;
  return LOCALES.find((l) => l === lang) ?? DEFAULT_LOCALE;
}

export async function generateMetadata({ searchParams }: Props): Promise<Metadata> {
  return { title: translator(await pageLocale(searchParams), "page.verify")("metaTitle") };
}

/** Public: anyone can learn whether a PDF is a signed Kilowright record, and which, without learning anything else. */
export default async function VerifyPage({ searchParams }: Props) {
  const locale = await pageLocale(searchParams);
  const t = translator(locale, "page.verify");
  return (
    // No company here, so no company clock: the answer's date comes formatted from the server.
    <HomeownerIntl locale={locale} timeZone="UTC">
      <main lang={locale} className="mx-auto max-w-xl px-4 pb-16 pt-8">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <Wordmark className="text-lg" />
          <LanguageSwitch path="/verify" />
        </div>
        <h1 className="mt-6 text-2xl font-semibold">{t("heading")}</h1>
        <p className="mt-2 text-graphite-soft">{t("intro")}</p>
        <VerifyClient />
      </main>
    </HomeownerIntl>
  );
}
