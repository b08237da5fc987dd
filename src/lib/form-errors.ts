import type { FieldErrors, FieldValues, Path, UseFormSetError } from "react-hook-form";
import { notSavedMessage, relabel, type FieldLabels } from "@/lib/validation-messages";

/** Puts server field errors back on the form's fields; false when none matched a field. */
export function applyFieldErrors<T extends FieldValues>(
  fieldErrors: Record<string, string[]> | undefined,
  setError: UseFormSetError<T>,
): boolean {
  if (!fieldErrors) return false;
  let applied = false;
  for (const [name, messages] of Object.entries(fieldErrors)) {
    if (name === "_" || !messages[0]) continue;
    setError(name as Path<T>, { type: "server", message: messages[0] });
    applied = true;
  }
  return applied;
}

/** Zod issues or server field errors keyed by dotted path ("bands.1.minWatts"). */
export type PathErrors = Record<string, string>;

export function issuesToErrors(issues: { path: PropertyKey[]; message: string }[]): PathErrors {
  const out: PathErrors = {};
  for (const i of issues) {
    const key = i.path.map(String).join(".") || "_";
    out[key] ??= i.message;
  }
  return out;
}

export function fieldErrorsToErrors(fields: Record<string, string[]> | undefined): PathErrors {
  const out: PathErrors = {};
  for (const [k, v] of Object.entries(fields ?? {})) if (v[0]) out[k] = v[0];
  return out;
}

/** react-hook-form's errors as [path, message] pairs, in the form's order ("finance.years"). */
export function formErrorList(errors: FieldErrors, prefix = ""): [string, string][] {
  const out: [string, string][] = [];
  for (const [key, node] of Object.entries(errors)) {
    if (!node || typeof node !== "object" || key === "ref" || key === "types") continue;
    const path = prefix ? `${prefix}.${key}` : key;
    const message = (node as { message?: unknown }).message;
    if (typeof message === "string" && message) out.push([path, message]);
    else out.push(...formErrorList(node as FieldErrors, path));
  }
  return out;
}

/** A refused client-side check: each field's message named by the form's labels, and the status line. */
export function refusedIssues(issues: { path: PropertyKey[]; message: string }[], labels: FieldLabels): { errors: PathErrors; text: string } {
  const named = issues.map((i) => ({ path: i.path, message: relabel(i.path, i.message, labels) }));
  return { errors: issuesToErrors(named), text: notSavedMessage(named.map((i) => [i.path.map(String).join("."), i.message]), labels) };
}
