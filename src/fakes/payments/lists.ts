import { invalidParam, invalidRequest, noSuch } from "./errors";
import { publicView, type CheckoutSession } from "./objects";
import type { FakeContext } from "./context";
import { createdFilter, int, type Params, str } from "./params";

// ── Lists and expansion ──────────────────────────────────────────────

type Kind = "checkout.session" | "payment_intent" | "charge" | "refund" | "event" | "item";

function lookup(ctx: FakeContext, kind: Kind, id: string): object | undefined {
  switch (kind) {
    case "checkout.session":
      return ctx.store.sessions.get(id);
    case "payment_intent":
      return ctx.store.paymentIntents.get(id);
    case "charge":
      return ctx.store.charges.get(id);
    case "refund":
      return ctx.store.refunds.get(id);
    case "event":
      return ctx.store.events.get(id);
    default:
      return undefined;
  }
}

const EXPANDABLE: Partial<Record<Kind, Record<string, Kind>>> = {
  "checkout.session": { payment_intent: "payment_intent" },
  payment_intent: { latest_charge: "charge" },
  charge: { payment_intent: "payment_intent" },
  refund: { charge: "charge", payment_intent: "payment_intent" },
};

function lineItemsList(session: CheckoutSession, url: string) {
  return { object: "list", data: structuredClone(session._line_items), has_more: false, url };
}

/** Replaces id fields by their objects along each `a.b.c` path. */
function expand(ctx: FakeContext, kind: Kind, source: object, paths: string[]): Record<string, unknown> {
  const out = publicView(source) as Record<string, unknown>;
  for (const p of paths) {
    const [head, ...rest] = p.split(".");
    if (kind === "checkout.session" && head === "line_items" && rest.length === 0) {
      out.line_items = lineItemsList(source as CheckoutSession, `/v1/checkout/sessions/${(source as CheckoutSession).id}/line_items`);
      continue;
    }
    const target = EXPANDABLE[kind]?.[head];
    if (!target) throw invalidParam("expand", `This property cannot be expanded (${head}).`);
    const current = out[head];
    let child: object | undefined;
    if (typeof current === "string") child = lookup(ctx, target, current);
    else if (current && typeof current === "object") child = current;
    if (!child) continue; // null stays null
    out[head] = rest.length > 0 ? expand(ctx, target, child, [rest.join(".")]) : publicView(child);
  }
  return out;
}

function expandParam(params: Params): string[] {
  const v = params.expand;
  if (v === undefined || v === "") return [];
  const items = Array.isArray(v) ? v : [v];
  return items.map((x, i) => {
    if (typeof x !== "string") throw invalidParam(`expand[${i}]`, "Invalid string: expand entries must be strings.");
    return x;
  });
}

export function one(ctx: FakeContext, kind: Kind, item: object, params: Params): Record<string, unknown> {
  return expand(ctx, kind, item, expandParam(params));
}

export function listOf<T extends { id: string; created: number }>(ctx: FakeContext, kind: Kind, all: T[], params: Params, url: string, filter: (item: T) => boolean = () => true) {
  const limit = int(params, "limit", { min: 1, max: 100 }) ?? 10;
  const after = str(params, "starting_after");
  const before = str(params, "ending_before");
  if (after !== null && before !== null) throw invalidRequest("You may only specify one of these parameters: ending_before, starting_after.", "starting_after");
  const created = createdFilter(params);
  const expandPaths = expandParam(params).map((p, i) => {
    if (!p.startsWith("data.")) throw invalidParam(`expand[${i}]`, `This property cannot be expanded (${p}). You may want to try expanding 'data.${p}' instead.`);
    return p.slice("data.".length);
  });
  const position = new Map(all.map((item, i) => [item.id, i]));
  const matching = all.filter((item) => created(item.created) && filter(item)); // newest first
  let page: T[];
  let hasMore: boolean;
  if (after !== null) {
    const at = position.get(after);
    if (at === undefined) throw noSuch(kind, after, "starting_after");
    const rest = matching.filter((item) => position.get(item.id)! > at);
    page = rest.slice(0, limit);
    hasMore = rest.length > limit;
  } else if (before !== null) {
    const at = position.get(before);
    if (at === undefined) throw noSuch(kind, before, "ending_before");
    const rest = matching.filter((item) => position.get(item.id)! < at);
    page = rest.slice(Math.max(0, rest.length - limit));
    hasMore = rest.length > limit;
  } else {
    page = matching.slice(0, limit);
    hasMore = matching.length > limit;
  }
  return { object: "list", data: page.map((item) => expand(ctx, kind, item, expandPaths)), has_more: hasMore, url };
}
