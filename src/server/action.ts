import "server-only";
import { z } from "zod";
import type { Permission } from "@/lib/permissions";
import { EngineInputError } from "@/engine/errors";
import { engineFields, HttpError, isDatabaseDown } from "@/server/errors";
import { validationError } from "@/server/route";
import { requireMember, type Member } from "@/server/session";

export type ActionResult<T> =
  | { ok: true; data: T }
  | { ok: false; code: string; message: string; fieldErrors?: Record<string, string[]> };

export function actionError(err: unknown): Extract<ActionResult<never>, { ok: false }> {
  if (err instanceof HttpError) return { ok: false, code: err.code, message: err.message, fieldErrors: err.fields };
  if (err instanceof EngineInputError) return { ok: false, code: "invalid_input", message: err.message, fieldErrors: engineFields(err) };
  if (isDatabaseDown(err)) {
    return { ok: false, code: "database_unavailable", message: "The database cannot be reached right now. Nothing was saved; try again shortly." };
  }
  console.error(err);
  return { ok: false, code: "internal_error", message: "Something went wrong on our side. Nothing was saved." };
}

/**
 * The one wrapper for server actions of signed-in staff: the same schema as the form
 * validates the input, then the member, company and role are loaded and the permission
 * checked before the body runs.
 */
export function memberAction<S extends z.ZodType, T>(
  permission: Permission,
  schema: S,
  body: (input: z.output<S>, member: Member) => Promise<T>,
) {
  return async (input: z.input<S>): Promise<ActionResult<T>> => {
    try {
      const member = await requireMember(permission);
      const parsed = schema.safeParse(input);
      if (!parsed.success) throw validationError(parsed.error);
      return { ok: true, data: await body(parsed.data, member) };
    } catch (err) {
      return actionError(err);
    }
  };
}
