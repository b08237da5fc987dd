import "server-only";
import { NextResponse, type NextRequest } from "next/server";
import { z } from "zod";
import type { Permission } from "@/lib/permissions";
import { EngineInputError } from "@/engine/errors";
import { BODY_CAPS, readCappedForm, readCappedText, type BodyCap } from "@/server/body-limit";
import { engineFields, HttpError, isDatabaseDown, notFound } from "@/server/errors";
import { TooManyRequests } from "@/server/limits";
import { DEFAULT_BODY_TYPES, guardCookieMutation, guardPublicMutation } from "@/server/request-guard";
import { requireMember, type Member } from "@/server/session";
// Also installs the plain-words error map for every zod parse on the server.
import { namedMessage } from "@/lib/validation-messages";

export type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };

export function errorResponse(status: number, code: string, message: string, fields?: Record<string, string[]>) {
  const body: ErrorBody = { error: { code, message, ...(fields ? { fields } : {}) } };
  return NextResponse.json(body, { status });
}

/** Turns any thrown error into the JSON error body; unexpected ones are logged, not leaked. */
export function toErrorResponse(err: unknown): NextResponse {
  if (err instanceof TooManyRequests) {
    const res = errorResponse(err.status, err.code, err.message);
    res.headers.set("Retry-After", String(err.retryAfterSeconds));
    return res;
  }
  if (err instanceof HttpError) return errorResponse(err.status, err.code, err.message, err.fields);
  if (err instanceof EngineInputError) return errorResponse(422, "invalid_input", err.message, engineFields(err));
  if (isDatabaseDown(err)) {
    return errorResponse(503, "database_unavailable", "The database cannot be reached right now. Try again shortly.");
  }
  console.error(err);
  return errorResponse(500, "internal_error", "Something went wrong on our side. It has been logged.");
}

type RouteContext<P> = { params: Promise<P> };
type Handler<P> = (args: { req: NextRequest; member: Member; params: P }) => Promise<Response>;

/**
 * The one wrapper for route handlers: loads the person, their company and role, checks
 * the named permission (401/403 with a JSON body), then runs the handler. A mutation sent
 * with a cookie must come from the app's own origin with a JSON or multipart body (403/415,
 * src/server/request-guard.ts); `bodyTypes` names others a route accepts (e.g. text/csv).
 */
export function withMember<P = Record<string, never>>(permission: Permission, handler: Handler<P>, options: { bodyTypes?: readonly string[] } = {}) {
  const bodyTypes = options.bodyTypes ?? DEFAULT_BODY_TYPES;
  return async (req: NextRequest, ctx: RouteContext<P>): Promise<Response> => {
    try {
      guardCookieMutation(req, bodyTypes);
      const member = await requireMember(permission, req.headers);
      return await handler({ req, member, params: await ctx.params });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

/**
 * The wrapper for the few routes anyone may call without a session (sign-up, accepting an
 * invitation): a mutation must come from the app's own origin with a JSON or multipart body
 * whether or not a cookie came with it (403/415), because each one signs a browser up or in.
 */
export function publicRoute(handler: (args: { req: NextRequest }) => Promise<Response>) {
  return async (req: NextRequest): Promise<Response> => {
    try {
      guardPublicMutation(req);
      return await handler({ req });
    } catch (err) {
      return toErrorResponse(err);
    }
  };
}

/**
 * Reads a JSON body within its cap (BODY_CAPS.json, 413 past it) and validates it: 400 for
 * malformed JSON, 422 naming each bad field.
 */
export async function readJson<S extends z.ZodType>(req: Request, schema: S, cap: BodyCap = BODY_CAPS.json): Promise<z.output<S>> {
  const text = await readCappedText(req, cap);
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new HttpError(400, "invalid_json", "The request body is not valid JSON.");
  }
  const parsed = schema.safeParse(raw);
  if (!parsed.success) throw validationError(parsed.error);
  return parsed.data;
}

/**
 * Reads a multipart form body (file uploads) within the cap of its kind (BODY_CAPS: 413 past
 * it, before formData() parses anything): 400 naming what to send when it is not a form.
 */
export async function readForm(req: Request, cap: BodyCap, what = "the file"): Promise<FormData> {
  return readCappedForm(req, cap, what);
}

export function validationError(error: z.ZodError): HttpError {
  const fields: Record<string, string[]> = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "_";
    (fields[key] ??= []).push(issue.message);
  }
  // The message names the field in words ("Period 2 — cents per kWh must be at least 0"), never
  // its dotted path: forms show it, and name the field again with their own labels.
  const first = Object.entries(fields)[0];
  const message = first ? namedMessage(first[0], first[1][0]) : "The input is not valid.";
  return new HttpError(422, "validation_failed", message, fields);
}

/** Path ids are validated like every other input (a malformed id is simply not found). */
export const idSchema = z.string().uuid();

// ── One record by its path id: the routes under /api/<things>/[id] ──

type ById = { id: string };

/** The id from the path; a malformed one is simply not found (404 naming what was asked for). */
export function recordId(id: string, what: string): string {
  if (!idSchema.safeParse(id).success) throw notFound(what);
  return id;
}

/** GET /api/<things>/<id>: `{ data }` of one record the member may read. */
export function readById<T>(permission: Permission, what: string, read: (member: Member, id: string) => Promise<T>) {
  return withMember<ById>(permission, async ({ member, params }) => NextResponse.json({ data: await read(member, recordId(params.id, what)) }));
}

/** PATCH or PUT /api/<things>/<id>: the JSON body checked by `schema`, then `{ data }` of the change. */
export function writeById<S extends z.ZodType, T>(permission: Permission, what: string, schema: S, write: (member: Member, id: string, input: z.output<S>) => Promise<T>) {
  return withMember<ById>(permission, async ({ req, member, params }) => {
    const id = recordId(params.id, what);
    return NextResponse.json({ data: await write(member, id, await readJson(req, schema)) });
  });
}

/** DELETE /api/<things>/<id>: 204 when the removal answers nothing, else `{ data }` of what it answered. */
export function deleteById(permission: Permission, what: string, remove: (member: Member, id: string) => Promise<unknown>) {
  return withMember<ById>(permission, async ({ member, params }) => {
    const answer = await remove(member, recordId(params.id, what));
    return answer === undefined ? new Response(null, { status: 204 }) : NextResponse.json({ data: answer });
  });
}

/** A CSV file to download (never cached). */
export function csvDownload(fileName: string, csv: string): Response {
  return new Response(csv, {
    headers: { "Content-Type": "text/csv; charset=utf-8", "Content-Disposition": `attachment; filename="${fileName}"`, "Cache-Control": "no-store" },
  });
}
