"use client";
import { useLocale, useTranslations } from "next-intl";
import { usePathname, useRouter } from "next/navigation";
import { useEffect, useState, type FormEvent } from "react";
import { FieldShell, FormMessage } from "@/components/ui/field";
import { useSave } from "@/components/ui/use-save";
import { ApiError } from "@/lib/api-client";
import type { Locale } from "@/lib/i18n/locales";
import { MAX_VERIFY_FILE_BYTES } from "@/lib/schemas/proposal";

type Answer = { match: true; label: string; signedOn: string; locale: Locale } | { match: false };

/** As the server checks. */
const MAX_BYTES = MAX_VERIFY_FILE_BYTES;

/** The server's refusals by code, in the page's language. */
const BY_CODE = { empty_file: "empty", file_too_large: "tooLarge", not_pdf: "notPdf", validation_failed: "chooseFile" } as const;

export function VerifyClient() {
  const t = useTranslations("page.verify");
  const locale = useLocale() as Locale;
  const router = useRouter();
  const path = usePathname();
  const [file, setFile] = useState<File | null>(null);
  const [answer, setAnswer] = useState<Answer | null>(null);
  const [error, setError] = useState<string | null>(null);
  // Nothing on this page changes: the answer is shown, no refresh.
  const check = useSave<File, Answer>({
    request: (pdf) => {
      const body = new FormData();
      body.set("file", pdf);
      return { url: "/api/public/verify", method: "POST", body };
    },
    refresh: false,
    onError: (err) => {
      if (err instanceof ApiError && err.status === 429) return setError(t("tooMany"));
      const key = err instanceof ApiError ? BY_CODE[err.code as keyof typeof BY_CODE] : undefined;
      setError(key ? t(key) : t("failed"));
    },
    onSaved: setAnswer,
  });
  // A matching document in another language: the page follows it (the answer stays; only the words change).
  useEffect(() => {
    if (answer?.match && answer.locale !== locale) router.replace(`${path}?lang=${answer.locale}`, { scroll: false });
  }, [answer, locale, path, router]);

  function submit(e: FormEvent) {
    e.preventDefault();
    setAnswer(null);
    setError(null);
    if (!file) return setError(t("chooseFile"));
    if (file.size > MAX_BYTES) return setError(t("tooLarge"));
    check.save(file);
  }

  return (
    <form className="card mt-6 space-y-4 p-4" onSubmit={submit} noValidate>
      <FieldShell id="verify-file" label={t("fileLabel")}>
        <input
          id="verify-file"
          type="file"
          accept="application/pdf,.pdf"
          className="block w-full text-sm file:mr-3 file:min-h-touch file:rounded-md file:border file:border-paper-line file:bg-white file:px-4"
          onChange={(e) => {
            setFile(e.target.files?.[0] ?? null);
            setAnswer(null);
            setError(null);
          }}
        />
      </FieldShell>
      <button type="submit" className="btn-primary w-full" disabled={check.pending}>
        {check.pending ? t("checking") : t("check")}
      </button>
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      {answer ? (
        answer.match ? (
          <FormMessage tone="success">
            <span data-testid="verify-answer">{t("match", { label: answer.label, signedOn: answer.signedOn })}</span>
          </FormMessage>
        ) : (
          <FormMessage tone="info">
            <span data-testid="verify-answer">{t("noMatch")}</span>
          </FormMessage>
        )
      ) : null}
    </form>
  );
}
