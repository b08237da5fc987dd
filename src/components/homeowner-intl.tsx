// The homeowner's messages for the client parts of their page: next-intl's provider with the
// proposal's language (not the URL's or the browser's: the household's, or the homeowner's
// choice on the page). Everything is passed explicitly, so no request configuration is read.
import { NextIntlClientProvider } from "next-intl";
import type { ReactNode } from "react";
import type { Locale } from "@/lib/i18n/locales";
import { CATALOGS } from "@/lib/i18n/translator";

export function HomeownerIntl({ locale, timeZone, children }: { locale: Locale; timeZone: string; children: ReactNode }) {
  // Only the page's messages travel to the browser.
  return (
    <NextIntlClientProvider locale={locale} messages={{ page: CATALOGS[locale].page, legal: CATALOGS[locale].legal }} timeZone={timeZone} now={new Date()} formats={{}}>
      {children}
    </NextIntlClientProvider>
  );
}
