import "server-only";
// Cross-site request defences for route handlers (issue #14, item 5). A browser attaches our
// session cookie to a request another site makes (a form post, a no-cors fetch), so a mutation
// that trusts the cookie must also check where the request came from — the rule better-auth
// applies to its own routes (origin-check middleware): with a cookie, the Origin (or, without
// it, the Referer's origin) must be the app's own; none at all is refused. "Simple" requests a
// foreign page can send without a CORS preflight carry text/plain, form-urlencoded or multipart
// bodies (Fetch standard, CORS-safelisted request-header), so a JSON body type is a second
// line: a text/plain form from another site cannot create a lead even if the Origin were lost.
import { env } from "@/env";
import { HttpError } from "@/server/errors";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);
/** Body types a mutation may carry unless the route names others (our choice: JSON, and multipart for uploads). */
export const DEFAULT_BODY_TYPES = ["application/json", "multipart/form-data"] as const;

function appOrigin(): string {
  return new URL(env().APP_URL).origin;
}

/** The request's claimed origin: Origin, else the Referer's origin (better-auth's order); null when neither. */
function requestOrigin(headers: Headers): string | null {
  const origin = headers.get("origin");
  if (origin && origin !== "null") return origin;
  const referer = headers.get("referer");
  if (!referer) return null;
  try {
    return new URL(referer).origin;
  } catch {
    return null;
  }
}

/** 403 unless the request says it comes from the app's own origin. */
export function requireSameOrigin(headers: Headers): void {
  const origin = requestOrigin(headers);
  if (origin === null) throw new HttpError(403, "origin_required", "This request has no Origin header; changes are accepted only from Kilowright's own pages.");
  if (origin !== appOrigin()) throw new HttpError(403, "cross_origin", `Changes are accepted only from Kilowright's own pages (${appOrigin()}), not from ${origin.slice(0, 200)}.`);
}

/** 415 when a request with a body sends it as anything but the allowed types. */
export function requireBodyType(headers: Headers, allowed: readonly string[]): void {
  const type = headers.get("content-type")?.split(";")[0]?.trim().toLowerCase() ?? "";
  const length = headers.get("content-length");
  const hasBody = type !== "" || headers.has("transfer-encoding") || (length !== null && length !== "0");
  if (!hasBody) return;
  if (!allowed.includes(type)) {
    throw new HttpError(415, "unsupported_media_type", `Send the body as ${allowed.join(" or ")}${type ? ` (got ${type.slice(0, 100)})` : " (no Content-Type was given)"}.`);
  }
}

/**
 * The check every cookie-authenticated mutation runs before anything else (withMember): same
 * origin, and a body of an allowed type. Requests without a cookie cannot be signed in, so the
 * session check answers them (401), as in better-auth.
 */
export function guardCookieMutation(req: Request, bodyTypes: readonly string[] = DEFAULT_BODY_TYPES): void {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return;
  if (!req.headers.has("cookie")) return;
  requireSameOrigin(req.headers);
  requireBodyType(req.headers, bodyTypes);
}

/**
 * Public customer mutations on /p/<token> (question, code, sign, cancel, pay): no cookie, the
 * link token is the key; a page of another site holding a leaked link must not act with the
 * homeowner's browser, so the origin is checked always.
 */
export function guardPublicMutation(req: Request): void {
  if (SAFE_METHODS.has(req.method.toUpperCase())) return;
  requireSameOrigin(req.headers);
  requireBodyType(req.headers, DEFAULT_BODY_TYPES);
}
