"use client";
// The server words most refusals in English (they also reach logs and the office). On the
// homeowner's page in another language, a refusal is told from its code in the page's catalog;
// in English the server's own sentence stays (it names the exact wait or count). Refusals of
// what the homeowner entered, of the link's state and of the deposit come already in the
// proposal's language (src/server/homeowner-refusals.ts): their sentence is shown as sent.
import { useLocale, useTranslations } from "next-intl";
import { ApiError } from "@/lib/api-client";

const BY_CODE = {
  code_locked: "codeLocked",
  code_expired: "codeExpired",
  no_code: "noCode",
  not_live: "notLive",
  mail_failed: "mailFailed",
} as const;

/** Codes the server words in the homeowner's language. */
const WORDED_FOR_HOMEOWNER = new Set(["validation_failed", "expired", "revoked", "replaced", "already_signed", "cancelled", "code_required", "proposal_cancelled", "not_signed", "no_deposit", "already_paid"]);

export function useHomeownerError(): (err: Error) => string {
  const t = useTranslations("page.errors");
  const locale = useLocale();
  return (err) => {
    if (locale === "en") return err.message || t("generic");
    if (!(err instanceof ApiError)) return t("generic");
    if (WORDED_FOR_HOMEOWNER.has(err.code) && err.message) return err.message;
    if (err.code === "code_wrong") return t("codeWrong", { left: Number(err.message.match(/(\d+)/)?.[1] ?? 0) });
    if (err.status === 429) return t("tooMany");
    const key = BY_CODE[err.code as keyof typeof BY_CODE];
    return key ? t(key) : t("generic");
  };
}
