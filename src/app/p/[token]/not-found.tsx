import { LOCALES } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";

/** An unknown link names no household, so no language: the page says it in each of the homeowner's languages. */
export default function ProposalLinkNotFound() {
  return (
    <main className="mx-auto max-w-md space-y-10 px-6 py-20">
      {LOCALES.map((locale) => {
        const t = translator(locale, "page.states");
        return (
          <section key={locale} lang={locale}>
            {locale === "en" ? <h1 className="text-2xl font-semibold">{t("notFoundTitle")}</h1> : <h2 className="text-2xl font-semibold">{t("notFoundTitle")}</h2>}
            <p className="mt-3 text-graphite-soft">{t("notFound")}</p>
          </section>
        );
      })}
    </main>
  );
}
