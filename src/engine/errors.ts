/**
 * Errors raised by the pure calculation core (src/engine).
 *
 * Every engine entry point validates its input; when anything is wrong it throws one
 * EngineInputError that lists every bad field, so a form or a route handler can map
 * the issues back onto fields (`path`) and show the `message` beside each.
 */
import type { z } from "zod";

export type EngineIssue = {
  /** Dotted path of the bad field, e.g. "faces.0.tiltDeg", or "line 42" for file input. */
  path: string;
  message: string;
};

export class EngineInputError extends Error {
  readonly issues: EngineIssue[];

  constructor(issues: EngineIssue[], context?: string) {
    const list = issues.map((i) => (i.path ? `${i.path}: ${i.message}` : i.message));
    const head = context ? `${context}: ` : "";
    super(`${head}invalid input — ${list.slice(0, 20).join("; ")}${list.length > 20 ? ` (and ${list.length - 20} more)` : ""}`);
    this.name = "EngineInputError";
    this.issues = issues;
  }

  /** Build from a failed zod parse, keeping every issue's path. */
  static fromZod(error: z.ZodError, context?: string): EngineInputError {
    return new EngineInputError(
      error.issues.map((i) => ({
        path: i.path.map((p) => String(p)).join("."),
        message: i.message,
      })),
      context,
    );
  }
}

/** Parse with a zod schema, throwing EngineInputError (every bad field named) on failure. */
export function parseOrThrow<S extends z.ZodType>(schema: S, input: unknown, context?: string): z.output<S> {
  const result = schema.safeParse(input);
  if (!result.success) throw EngineInputError.fromZod(result.error, context);
  return result.data;
}
