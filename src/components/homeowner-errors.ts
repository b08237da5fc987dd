"use client";
// The server words its refusals in English (they also reach logs and the office). On the
// homeowner's page in another language, a refusal is told from its code in the page's catalog;
// in English the server's own sentence stays (it names the exact wait or count).
import { useLocale, useTranslations } from "next-intl";
import { ApiError } from "@/lib/api-client";

const BY_CODE = {
  code_locked: "codeLocked",
  code_expired: "codeExpired",
  no_code: "noCode",
  code_required: "codeRequired",
  not_live: "notLive",
  already_signed: "alreadySigned",
  already_paid: "alreadyPaid",
  mail_failed: "mailFailed",
  validation_failed: "invalid",
} as const;

export function useHomeownerError(): (err: Error) => string {
  const t = useTranslations("page.errors");
  const locale = useLocale();
  return (err) => {
    if (locale === "en") return err.message || t("generic");
    if (!(err instanceof ApiError)) return t("generic");
    if (err.code === "code_wrong") return t("codeWrong", { left: Number(err.message.match(/(\d+)/)?.[1] ?? 0) });
    if (err.status === 429) return t("tooMany");
    const key = BY_CODE[err.code as keyof typeof BY_CODE];
    return key ? t(key) : t("generic");
  };
}
