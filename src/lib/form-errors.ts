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
