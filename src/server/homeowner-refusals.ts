import "server-only";
// The homeowner's routes refuse in the homeowner's words and language (issue #18): no field
// paths, no schema wording. The message is the proposal's language (`proposal.locale`, which the
// page's switch sets), from the catalogs' "refusals" namespace; a 422 also names each field's
// message, so the page puts it beside the field.
import type { ZodError } from "zod";
import type { Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import { HttpError } from "@/server/errors";

export type RefusalKey = Parameters<ReturnType<typeof translator<"refusals">>>[0];

/** A refusal in the homeowner's language; with `field`, a 422-style field message too. */
export function refusal(locale: Locale, status: number, code: string, key: RefusalKey, field?: string): HttpError {
  const message = translator(locale, "refusals")(key);
  return new HttpError(status, code, message, field ? { [field]: [message] } : undefined);
}

/** A schema's refusal in the homeowner's words: each field's own message (`keys`), else "check what you entered". */
export function homeownerInvalid(locale: Locale, error: ZodError, keys: Partial<Record<string, RefusalKey>>): HttpError {
  const t = translator(locale, "refusals");
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const field = String(issue.path[0] ?? "");
    const message = t(keys[field] ?? "invalid");
    if (!fields[field]?.includes(message)) (fields[field] ??= []).push(message);
  }
  const first = Object.values(fields)[0]?.[0] ?? t("invalid");
  return new HttpError(422, "validation_failed", first, fields);
}
