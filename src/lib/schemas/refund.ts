// The office's refund input, shared by the Money tab's form (zodResolver) and
// POST /api/payments/[id]/refunds. Amounts in integer cents; the form converts dollars.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";

/** The largest refund the form accepts at all ($1,000,000); the payment's own limit is checked on the server. */
export const MAX_REFUND_CENTS = 100_000_000;

export const refundPaymentSchema = z.object({
  amountCents: z
    .number({ error: "Enter an amount in dollars, e.g. 250.00" })
    .int("Enter whole cents (at most two decimals)")
    .positive("Enter an amount above $0.00")
    .max(MAX_REFUND_CENTS, "That is more than any deposit"),
  reason: plainText({ multiline: true }).trim().min(3, "Give the reason; the customer sees it").max(500, "Keep the reason under 500 characters"),
});
export type RefundPaymentInput = z.input<typeof refundPaymentSchema>;

/** "1,250.5" or "$1250.50" → 125050 cents; NaN when it is not an amount with at most two decimals. */
export function dollarsToCents(text: string): number {
  const clean = text.replace(/[$,\s]/g, "");
  if (!/^\d+(\.\d{0,2})?$/.test(clean)) return Number.NaN;
  const [whole, frac = ""] = clean.split(".");
  return Number(whole) * 100 + Number(frac.padEnd(2, "0"));
}
