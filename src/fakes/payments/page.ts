// The dev payments server's hosted checkout page: plain HTML, no script, phone first. Its look
// is deliberately plain and its own, with a band that says no real money moves.
import type { CheckoutSession } from "./objects";
import { formatAmount } from "./objects";

export function escapeHtml(text: string): string {
  return text.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

const STYLE = `
*{box-sizing:border-box}
body{margin:0;font:16px/1.45 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif;background:#eef1ec;color:#1f2421}
.band{background:#2f4a3a;color:#f4f6f1;font-size:14px;padding:10px 16px;text-align:center}
main{max-width:440px;margin:0 auto;padding:20px 16px 40px}
.sheet{background:#fff;border:1px solid #cfd6cc;border-radius:10px;padding:20px}
h1{font-size:20px;margin:0 0 4px}
.total{font-size:32px;font-weight:700;font-variant-numeric:tabular-nums;margin:8px 0 4px}
.items{list-style:none;margin:0 0 16px;padding:0;color:#4a524d;font-size:15px}
.items li{display:flex;justify-content:space-between;gap:12px;padding:4px 0;border-bottom:1px dashed #dde3da}
.muted{color:#5c665f;font-size:14px}
label{display:block;font-weight:600;font-size:15px;margin:14px 0 6px}
input{width:100%;min-height:48px;font-size:18px;padding:10px 12px;border:1px solid #9aa59c;border-radius:8px;background:#fbfcfa;color:#1f2421}
input:focus{outline:3px solid #8fb89b;outline-offset:1px;border-color:#2f4a3a}
input[aria-invalid=true]{border-color:#a3261b;background:#fff6f5}
.row{display:grid;grid-template-columns:1fr 1fr;gap:12px}
.row>div{display:flex;flex-direction:column;justify-content:flex-end}
.alert{margin:16px 0 0;padding:12px 14px;border-radius:8px;background:#fdecea;border:1px solid #e2a39c;color:#7d1d14;font-weight:600}
button{margin-top:20px;width:100%;min-height:52px;font-size:18px;font-weight:700;border:0;border-radius:8px;background:#2f4a3a;color:#fff;cursor:pointer}
button:focus-visible{outline:3px solid #8fb89b;outline-offset:2px}
.back{display:inline-block;margin-top:16px;min-height:44px;line-height:44px;color:#2f4a3a}
.help{margin-top:22px;font-size:13px;color:#5c665f}
.help code{font-size:13px;white-space:nowrap}
`;

function layout(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex">
<title>${escapeHtml(title)}</title>
<style>${STYLE}</style>
</head>
<body>
<header class="band">Dev payments · test mode · no real money moves</header>
<main>
${body}
</main>
</body>
</html>`;
}

export interface FormState {
  number?: string;
  exp?: string;
  cvc?: string;
  postal?: string;
  email?: string;
  /** The message to show, and the field it is about (null: the card as a whole). */
  error?: { message: string; field: "number" | "exp" | "cvc" | "postal" | "email" | null };
}

function summary(session: CheckoutSession): string {
  const items = session._line_items
    .map(
      (li) =>
        `<li><span>${escapeHtml(li.description)}${li.quantity > 1 ? ` × ${li.quantity}` : ""}</span><span>${escapeHtml(formatAmount(li.amount_total, li.currency))}</span></li>`,
    )
    .join("");
  const title = session._payment_intent_data.description ?? session._line_items[0]?.description ?? "Payment";
  const only = session._line_items.length === 1 && session._line_items[0].quantity === 1 && session._line_items[0].description === title;
  return `<h1>${escapeHtml(title)}</h1>
<p class="total" data-testid="amount">${escapeHtml(formatAmount(session.amount_total, session.currency))}</p>
${only ? "" : `<ul class="items">${items}</ul>`}`;
}

export function checkoutPage(session: CheckoutSession, state: FormState = {}): string {
  const err = state.error;
  const invalid = (field: string) => (err && (err.field === field || (err.field === null && field === "number")) ? ' aria-invalid="true" aria-describedby="pay-error"' : "");
  const value = (v: string | undefined) => (v ? ` value="${escapeHtml(v)}"` : "");
  const email = session.customer_email
    ? `<p class="muted">Receipt to <strong>${escapeHtml(session.customer_email)}</strong></p>`
    : `<label for="email">E-mail for the receipt</label>
<input id="email" name="email" type="email" autocomplete="email" required${value(state.email)}${invalid("email")}>`;
  const cancel = session.cancel_url ? `<a class="back" href="${escapeHtml(session.cancel_url)}">Cancel and go back</a>` : "";
  const body = `<div class="sheet">
${summary(session)}
<form method="post" action="/pay/${escapeHtml(session.id)}" novalidate>
${email}
<label for="number">Card number</label>
<input id="number" name="number" inputmode="numeric" autocomplete="cc-number" placeholder="1234 1234 1234 1234" required${value(state.number)}${invalid("number")}>
<div class="row">
<div><label for="exp">Expiry (MM / YY)</label>
<input id="exp" name="exp" inputmode="numeric" autocomplete="cc-exp" placeholder="MM / YY" required${value(state.exp)}${invalid("exp")}></div>
<div><label for="cvc">Security code (CVC)</label>
<input id="cvc" name="cvc" inputmode="numeric" autocomplete="cc-csc" placeholder="123" required${value(state.cvc)}${invalid("cvc")}></div>
</div>
<label for="postal">ZIP / postal code</label>
<input id="postal" name="postal" autocomplete="postal-code" required${value(state.postal)}${invalid("postal")}>
${err ? `<p class="alert" id="pay-error" role="alert">${escapeHtml(err.message)}</p>` : ""}
<button type="submit">Pay ${escapeHtml(formatAmount(session.amount_total, session.currency))}</button>
</form>
${cancel}
<p class="help">Test cards: <code>4242 4242 4242 4242</code> is paid; <code>4000 0000 0000 0002</code> is declined;
<code>4000 0000 0000 9995</code> has insufficient funds. Any future expiry, any 3-digit CVC.</p>
</div>`;
  return layout(`Pay ${formatAmount(session.amount_total, session.currency)}`, body);
}

export function statusPage(title: string, message: string, link: { href: string; label: string } | null): string {
  const a = link ? `<a class="back" href="${escapeHtml(link.href)}">${escapeHtml(link.label)}</a>` : "";
  return layout(title, `<div class="sheet"><h1>${escapeHtml(title)}</h1><p>${escapeHtml(message)}</p>${a}</div>`);
}
