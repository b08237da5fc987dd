import type { FieldValues, Path, UseFormSetError } from "react-hook-form";

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
