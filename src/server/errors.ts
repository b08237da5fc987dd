import "server-only";
import { ApiError } from "@/lib/api-client";
import { namedMessage } from "@/lib/validation-messages";

/**
 * An error with an HTTP status and a stable code, shown to the person as its message: the
 * server's side of the browser's ApiError (the same fields, read back from the error body).
 */
export class HttpError extends ApiError {
  override name = "HttpError";
}

/** 422 on one field, its message naming the field in words (never its dotted path). */
export const fieldError = (field: string, message: string, also: string[] = []) =>
  new HttpError(422, "validation_failed", namedMessage(field, message), Object.fromEntries([field, ...also].map((f) => [f, [message]])));

export const unauthorized = () => new HttpError(401, "unauthorized", "Sign in to continue.");
export const forbidden = (what = "this") =>
  new HttpError(403, "forbidden", `Your role does not allow ${what}. Ask your company's owner or admin.`);
/** Also used for records of another company: they simply do not exist for this person. */
export const notFound = (what = "Record") => new HttpError(404, "not_found", `${what} not found.`);

/** True for errors meaning the database cannot be reached right now (so: 503, retry). */
export function isDatabaseDown(err: unknown): boolean {
  const codes = new Set(["ECONNREFUSED", "ECONNRESET", "PROTOCOL_CONNECTION_LOST", "ETIMEDOUT", "EPIPE", "ER_CON_COUNT_ERROR"]);
  for (let e: unknown = err, depth = 0; e && depth < 5; depth++) {
    if (typeof e === "object" && e !== null) {
      const code = (e as { code?: unknown }).code;
      if (typeof code === "string" && codes.has(code)) return true;
      if ((e as { fatal?: unknown }).fatal === true) return true;
      e = (e as { cause?: unknown }).cause;
    } else break;
  }
  return false;
}

/** True when a write broke a unique key (MariaDB's ER_DUP_ENTRY, possibly wrapped by drizzle). */
export function isDuplicateKey(err: unknown): boolean {
  for (let e: unknown = err, depth = 0; e && depth < 5; depth++) {
    if (typeof e !== "object" || e === null) break;
    if ((e as { code?: unknown }).code === "ER_DUP_ENTRY") return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/** The engine's named issues as form fields ({ "bills.2.kwh": ["…"] }). */
export function engineFields(err: { issues: { path: string; message: string }[] }): Record<string, string[]> {
  const fields: Record<string, string[]> = {};
  for (const issue of err.issues) (fields[issue.path || "_"] ??= []).push(issue.message);
  return fields;
}
