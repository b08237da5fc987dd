import type { IncomingMessage, ServerResponse } from "node:http";
import { checkCardFields, type CardDecline } from "./cards";
import { formatAmount, type CheckoutSession } from "./objects";
import { checkoutPage, statusPage, type FormState } from "./page";
import { AUTOMATIC, type FakeContext, type RequestInfo } from "./context";
import { parseParams, readBody, redirect, sendHtml } from "./http";
import { pay } from "./paying";
import { armExpiry, sweepExpired } from "./sessions";

// ── The hosted checkout page ──────────────────────────────────────────────

function successUrlOf(session: CheckoutSession): string | null {
  return session.success_url ? session.success_url.replaceAll("{CHECKOUT_SESSION_ID}", session.id) : null;
}

function closedPage(res: ServerResponse, session: CheckoutSession): void {
  if (session.status === "complete") {
    const back = successUrlOf(session);
    return sendHtml(res, 200, statusPage("This payment is complete", `${formatAmount(session.amount_total, session.currency)} was paid. You can close this page.`, back ? { href: back, label: "Return to the site" } : null));
  }
  return sendHtml(
    res,
    410,
    statusPage("This checkout has expired", "Nothing was charged. Ask for a new payment link.", session.cancel_url ? { href: session.cancel_url, label: "Go back" } : null),
  );
}

export async function handlePage(ctx: FakeContext, req: IncomingMessage, res: ServerResponse, sessionId: string): Promise<void> {
  const method = req.method ?? "GET";
  if (sweepExpired(ctx)) {
    armExpiry(ctx);
    await ctx.store.save();
    ctx.sender.schedule();
  }
  const session = ctx.store.sessions.get(sessionId);
  if (!session) return sendHtml(res, 404, statusPage("Payment link not found", "This payment link is not valid. Check the link you were sent.", null));
  if (method === "GET" || method === "HEAD") {
    if (session.status !== "open") return closedPage(res, session);
    return sendHtml(res, 200, checkoutPage(session));
  }
  if (method !== "POST") {
    res.writeHead(405, { allow: "GET, POST" });
    return void res.end();
  }
  const form = parseParams(await readBody(req));
  const field = (name: string) => (typeof form[name] === "string" ? (form[name] as string) : "");
  if (session.status !== "open") {
    // A second press of Pay after the payment went through goes where the first one went.
    const back = successUrlOf(session);
    if (session.status === "complete" && back) return redirect(res, back);
    return closedPage(res, session);
  }
  const state: FormState = { number: field("number"), exp: field("exp"), cvc: field("cvc"), postal: field("postal"), email: field("email") };
  const result = attemptFromFields(ctx, session, { number: state.number!, exp: state.exp!, cvc: state.cvc!, postal: state.postal!, email: state.email || null });
  if (result.kind === "field") return sendHtml(res, 400, checkoutPage(session, { ...state, error: { message: result.message, field: result.field } }));
  await ctx.store.save();
  ctx.sender.schedule();
  if (result.kind === "declined") {
    return sendHtml(res, 402, checkoutPage(session, { ...state, error: { message: result.decline.message, field: null } }));
  }
  const back = successUrlOf(session);
  if (back) return redirect(res, back);
  return closedPage(res, session);
}

type Attempt =
  | { kind: "field"; field: "number" | "exp" | "cvc" | "postal" | "email"; message: string }
  | { kind: "declined"; decline: CardDecline }
  | { kind: "paid" };

export function attemptFromFields(ctx: FakeContext, session: CheckoutSession, f: { number: string; exp: string; cvc: string; postal: string; email: string | null }, request: RequestInfo = AUTOMATIC): Attempt {
  if (!session.customer_email) {
    const email = (f.email ?? "").trim();
    if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email)) return { kind: "field", field: "email", message: "Enter a valid e-mail address for the receipt." };
  }
  const checked = checkCardFields({ number: f.number, exp: f.exp, cvc: f.cvc, postalCode: f.postal });
  if (!checked.ok) return { kind: "field", field: checked.field, message: checked.message };
  const outcome = pay(ctx, session, checked.card, f.email?.trim() || null, request);
  return outcome.ok ? { kind: "paid" } : { kind: "declined", decline: outcome.decline };
}
