"use client";
// The homeowner's language switch (issue #18 item 6): stores the choice for this proposal
// (POST /api/public/proposals/<token>/language) and re-renders the page in place; client state
// (a typed name, a drawn signature, a confirmed code) stays as it is.
import { useLocale, useTranslations } from "next-intl";
import { useState, type ReactNode } from "react";
import { ApiError } from "@/lib/api-client";
import { FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { LOCALES, LOCALE_NAMES, type Locale } from "@/lib/i18n/locales";

/**
 * With `token`, the homeowner's choice is stored for their proposal; with `path`, a page with no
 * proposal (/verify) takes the language from its address (`path?lang=es`).
 */
export function LanguageSwitch(props: { token: string } | { path: string }) {
  return "token" in props ? <StoredSwitch token={props.token} /> : <LinkSwitch path={props.path} />;
}

function SwitchGroup({ children }: { children: ReactNode }) {
  const t = useTranslations("page.language");
  return (
    <div role="group" aria-label={t("label")} className="inline-flex overflow-hidden rounded-md border border-paper-line" data-testid="language-switch">
      {children}
    </div>
  );
}

const optionClass = (on: boolean) => `inline-flex min-h-touch items-center px-3 ${on ? "bg-graphite text-white" : "bg-white text-graphite"}`;

function LinkSwitch({ path }: { path: string }) {
  const current = useLocale();
  return (
    <div className="text-sm">
      <SwitchGroup>
        {LOCALES.map((locale) => (
          <a key={locale} href={`${path}?lang=${locale}`} lang={locale} hrefLang={locale} aria-current={locale === current ? "page" : undefined} className={optionClass(locale === current)}>
            {LOCALE_NAMES[locale]}
          </a>
        ))}
      </SwitchGroup>
    </div>
  );
}

function StoredSwitch({ token }: { token: string }) {
  const t = useTranslations("page.language");
  const current = useLocale();
  // Too many switches: the server says so in the page's language, with the wait.
  const [tooMany, setTooMany] = useState<string | null>(null);
  const save = useSave<Locale, { locale: Locale }>({
    request: (locale) => ({ url: `/api/public/proposals/${token}/language`, method: "POST", json: { locale } }),
    onError: (err) => setTooMany(err instanceof ApiError && err.status === 429 ? err.message : null),
  });
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm">
      <SwitchGroup>
        {LOCALES.map((locale) => (
          <button
            key={locale}
            type="button"
            lang={locale}
            aria-pressed={locale === current}
            disabled={save.pending}
            onClick={() => locale !== current && save.save(locale)}
            className={optionClass(locale === current)}
          >
            {LOCALE_NAMES[locale]}
          </button>
        ))}
      </SwitchGroup>
      {save.notice?.tone === "error" ? <FormMessage tone="error">{tooMany ?? t("failed")}</FormMessage> : null}
    </div>
  );
}
