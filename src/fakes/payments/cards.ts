// Stripe's documented test card numbers (https://docs.stripe.com/testing) and what each does,
// plus the checks a card form makes before anything is sent (number, expiry, CVC, postal code).

export type CardBrand = "visa" | "mastercard" | "amex" | "discover" | "unknown";

export interface CardDecline {
  /** The error's `code` (card_declined, expired_card, …). */
  code: string;
  /** Set for card_declined: generic_decline, insufficient_funds, lost_card, stolen_card. */
  declineCode?: string;
  message: string;
}

/** Numbers that succeed. */
const SUCCEEDING = new Set([
  "4242424242424242", // Visa
  "4000056655665556", // Visa (debit)
  "5555555555554444", // Mastercard
  "2223003122003222", // Mastercard (2-series)
  "5200828282828210", // Mastercard (debit)
  "378282246310005", // American Express
  "371449635398431", // American Express
  "6011111111111117", // Discover
]);

const DECLINED_MESSAGE = "Your card was declined.";

/** Numbers that are declined, with the error the API gives for each. */
const DECLINING: Record<string, CardDecline> = {
  "4000000000000002": { code: "card_declined", declineCode: "generic_decline", message: DECLINED_MESSAGE },
  "4000000000009995": { code: "card_declined", declineCode: "insufficient_funds", message: "Your card has insufficient funds." },
  "4000000000009987": { code: "card_declined", declineCode: "lost_card", message: DECLINED_MESSAGE },
  "4000000000009979": { code: "card_declined", declineCode: "stolen_card", message: DECLINED_MESSAGE },
  "4000000000000069": { code: "expired_card", message: "Your card has expired." },
  "4000000000000127": { code: "incorrect_cvc", message: "Your card's security code is incorrect." },
  "4000000000000119": { code: "processing_error", message: "An error occurred while processing your card. Try again in a little bit." },
};

export const INCORRECT_NUMBER: CardDecline = { code: "incorrect_number", message: "Your card number is incorrect." };

export function digitsOf(cardNumber: string): string {
  return cardNumber.replace(/[\s-]/g, "");
}

export function brandOf(digits: string): CardBrand {
  if (/^4/.test(digits)) return "visa";
  if (/^(5[1-5]|2[2-7])/.test(digits)) return "mastercard";
  if (/^3[47]/.test(digits)) return "amex";
  if (/^6(011|5)/.test(digits)) return "discover";
  return "unknown";
}

export function luhnValid(digits: string): boolean {
  let sum = 0;
  let double = false;
  for (let i = digits.length - 1; i >= 0; i--) {
    let d = digits.charCodeAt(i) - 48;
    if (double) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
    double = !double;
  }
  return sum % 10 === 0;
}

export interface CardInput {
  number: string;
  /** "MM/YY", "MM / YY" or "MM/YYYY". */
  exp: string;
  cvc: string;
  postalCode: string;
}

export interface CheckedCard {
  digits: string;
  brand: CardBrand;
  last4: string;
  expMonth: number;
  expYear: number;
  postalCode: string;
}

export type FieldName = "number" | "exp" | "cvc" | "postal";

/**
 * The checks a card form makes in the browser before anything reaches the API. A field error
 * is not a payment attempt: no PaymentIntent is touched and no event is sent.
 */
export function checkCardFields(input: CardInput, now = new Date()): { ok: true; card: CheckedCard } | { ok: false; field: FieldName; message: string } {
  const digits = digitsOf(input.number);
  if (digits === "") return { ok: false, field: "number", message: "Enter your card number." };
  if (!/^\d+$/.test(digits) || digits.length < 13 || digits.length > 19) {
    return { ok: false, field: "number", message: "Your card number is incomplete." };
  }
  if (!luhnValid(digits)) return { ok: false, field: "number", message: INCORRECT_NUMBER.message };

  const exp = /^\s*(\d{1,2})\s*\/\s*(\d{2}|\d{4})\s*$/.exec(input.exp);
  if (!exp) return { ok: false, field: "exp", message: "Your card's expiry date is incomplete (MM / YY)." };
  const expMonth = Number(exp[1]);
  const expYear = exp[2].length === 2 ? 2000 + Number(exp[2]) : Number(exp[2]);
  if (expMonth < 1 || expMonth > 12) return { ok: false, field: "exp", message: "Your card's expiry month is invalid." };
  const thisMonth = now.getUTCFullYear() * 12 + now.getUTCMonth();
  if (expYear * 12 + (expMonth - 1) < thisMonth) return { ok: false, field: "exp", message: "Your card's expiry date is in the past." };
  if (expYear > now.getUTCFullYear() + 50) return { ok: false, field: "exp", message: "Your card's expiry year is invalid." };

  const brand = brandOf(digits);
  const cvcLength = brand === "amex" ? 4 : 3;
  if (!new RegExp(`^\\d{${cvcLength}}$`).test(input.cvc.trim())) {
    return { ok: false, field: "cvc", message: "Your card's security code is incomplete." };
  }
  const postalCode = input.postalCode.trim();
  if (postalCode.length < 3 || postalCode.length > 10 || !/^[A-Za-z0-9 -]+$/.test(postalCode)) {
    return { ok: false, field: "postal", message: "Your postal code is incomplete." };
  }
  return { ok: true, card: { digits, brand, last4: digits.slice(-4), expMonth, expYear, postalCode } };
}

/** What the API does with a card that passed the form's checks: null = the charge succeeds. */
export function outcomeOf(digits: string): CardDecline | null {
  if (SUCCEEDING.has(digits)) return null;
  return DECLINING[digits] ?? INCORRECT_NUMBER;
}
