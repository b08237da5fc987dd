"use client";
// The homeowner's language switch (issue #18 item 6): stores the choice for this proposal
// (POST /api/public/proposals/<token>/language) and re-renders the page in place; client state
// (a typed name, a drawn signature, a confirmed code) stays as it is.
import { useLocale, useTranslations } from "next-intl";
import { FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { LOCALES, LOCALE_NAMES, type Locale } from "@/lib/i18n/locales";

export function LanguageSwitch({ token }: { token: string }) {
  const t = useTranslations("page.language");
  const current = useLocale();
  const save = useSave<Locale, { locale: Locale }>({
    request: (locale) => ({ url: `/api/public/proposals/${token}/language`, method: "POST", json: { locale } }),
  });
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm">
      <div role="group" aria-label={t("label")} className="inline-flex overflow-hidden rounded-md border border-paper-line" data-testid="language-switch">
        {LOCALES.map((locale) => (
          <button
            key={locale}
            type="button"
            lang={locale}
            aria-pressed={locale === current}
            disabled={save.pending}
            onClick={() => locale !== current && save.save(locale)}
            className={`min-h-touch px-3 ${locale === current ? "bg-graphite text-white" : "bg-white text-graphite"}`}
          >
            {LOCALE_NAMES[locale]}
          </button>
        ))}
      </div>
      {save.notice?.tone === "error" ? <FormMessage tone="error">{t("failed")}</FormMessage> : null}
    </div>
  );
}
