import { invalidInteger, invalidParam, missingParam, unknownParam } from "./errors";
import { type ParamObject, type ParamValue } from "./form";
import type { Metadata } from "./objects";

// ── Reading parameters ──────────────────────────────────────────────

export type Params = ParamObject;

export function str(params: Params, name: string, opts: { required?: boolean; max?: number; param?: string } = {}): string | null {
  const param = opts.param ?? name;
  const v = params[name];
  if (v === undefined || v === "") {
    if (opts.required) throw missingParam(param);
    return null;
  }
  if (typeof v !== "string") throw invalidParam(param, `Invalid string: ${param} must be a string, not an object or array.`);
  if (opts.max !== undefined && v.length > opts.max) {
    throw invalidParam(param, `Invalid string: ${v.slice(0, 20)}...; must be at most ${opts.max} characters`, "string_length_too_long");
  }
  return v;
}

export function int(params: Params, name: string, opts: { required?: boolean; min?: number; max?: number; param?: string } = {}): number | null {
  const param = opts.param ?? name;
  const v = params[name];
  if (v === undefined || v === "") {
    if (opts.required) throw missingParam(param);
    return null;
  }
  if (typeof v !== "string" || !/^-?\d{1,15}$/.test(v)) throw invalidInteger(param, typeof v === "string" ? v : JSON.stringify(v));
  const n = Number(v);
  if (opts.min !== undefined && n < opts.min) throw invalidParam(param, `This value must be greater than or equal to ${opts.min}.`, "parameter_invalid_integer");
  if (opts.max !== undefined && n > opts.max) throw invalidParam(param, `This value must be less than or equal to ${opts.max}.`, "parameter_invalid_integer");
  return n;
}

export function obj(params: Params, name: string, param = name): Params | null {
  const v = params[name];
  if (v === undefined || v === "") return null;
  if (typeof v !== "object" || Array.isArray(v)) throw invalidParam(param, `Invalid object: ${param} must be a hash.`, "parameter_invalid_object");
  return v;
}

export function list(params: Params, name: string, param = name): ParamValue[] | null {
  const v = params[name];
  if (v === undefined || v === "") return null;
  if (!Array.isArray(v)) throw invalidParam(param, `Invalid array: ${param} must be an array.`, "parameter_invalid_array");
  return v;
}

export function onlyKnown(params: Params, known: readonly string[], prefix = ""): void {
  for (const key of Object.keys(params)) {
    if (!known.includes(key)) throw unknownParam(prefix ? `${prefix}[${key}]` : key);
  }
}

/** Metadata as the API takes it: at most 50 keys, keys ≤ 40 and values ≤ 500 characters; "" unsets. */
export function metadataOf(params: Params, name: string, param = name): Metadata {
  const m = obj(params, name, param);
  const out: Metadata = {};
  if (!m) return out;
  const keys = Object.keys(m);
  if (keys.length > 50) throw invalidParam(param, "Invalid metadata: metadata can have up to 50 keys.", "parameter_invalid_object");
  for (const key of keys) {
    const value = m[key];
    if (typeof value !== "string") throw invalidParam(`${param}[${key}]`, `Invalid string: metadata values must be strings.`);
    if (key.length > 40) throw invalidParam(`${param}[${key}]`, `Invalid metadata: keys can be up to 40 characters long.`);
    if (value.length > 500) throw invalidParam(`${param}[${key}]`, `Invalid metadata: values can be up to 500 characters long.`);
    if (value !== "") out[key] = value;
  }
  return out;
}

export function currencyOf(value: string | null, param: string): string {
  if (value === null) throw missingParam(param);
  const c = value.toLowerCase();
  if (!/^[a-z]{3}$/.test(c)) throw invalidParam(param, `Invalid currency: ${value}. Stripe currently supports these currencies: usd, eur, gbp, …`, "parameter_invalid_string");
  return c;
}

export function urlOf(value: string | null, param: string): string | null {
  if (value === null) return null;
  // {CHECKOUT_SESSION_ID} is a template the service fills in; braces are not valid in a URL.
  const probe = value.replaceAll("{CHECKOUT_SESSION_ID}", "cs_test_probe");
  let parsed: URL;
  try {
    parsed = new URL(probe);
  } catch {
    throw invalidParam(param, "Not a valid URL", "url_invalid");
  }
  if (parsed.protocol !== "http:" && parsed.protocol !== "https:") throw invalidParam(param, "Not a valid URL", "url_invalid");
  return value;
}

/** `created` as a number or { gt, gte, lt, lte } (Unix seconds). */
export function createdFilter(params: Params): (created: number) => boolean {
  const v = params.created;
  if (v === undefined || v === "") return () => true;
  if (typeof v === "string") {
    const n = int(params, "created");
    return (c) => c === n;
  }
  if (Array.isArray(v)) throw invalidParam("created", "Invalid timestamp or range for created.");
  onlyKnown(v, ["gt", "gte", "lt", "lte"], "created");
  const bound = (k: string) => int(v, k, { param: `created[${k}]` });
  const gt = bound("gt");
  const gte = bound("gte");
  const lt = bound("lt");
  const lte = bound("lte");
  return (c) => (gt === null || c > gt) && (gte === null || c >= gte) && (lt === null || c < lt) && (lte === null || c <= lte);
}

/** GET /_dev answers with this list. */

export const LIST_PARAMS = ["limit", "starting_after", "ending_before", "created", "expand"];
