// One offer's inputs (table offer, column inputs): its system (the design's module counts or its
// own per face), equipment, price-book adders and line items, discount and payment. Shared by
// the Offers tab's form and the server, which recomputes every figure on save.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";

export const MAX_OFFERS_PER_DEAL = 3;

const num = (label: string) => z.number({ error: `${label} must be a number` }).finite(`${label} must be a number`);

export const paymentInputSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("cash") }),
  z.object({
    kind: z.literal("loan"),
    aprPct: num("APR").min(0, "APR must be 0–40 %").max(40, "APR must be 0–40 %"),
    termMonths: z.number({ error: "Term must be a number" }).int("Term must be whole months").min(12, "Term must be 12–360 months").max(360, "Term must be 12–360 months"),
    dealerFeePct: num("Dealer fee").min(0, "Dealer fee must be 0–40 %").max(40, "Dealer fee must be 0–40 %").default(0),
    /** Paid at signing and taken off the amount borrowed, cents; null = the deposit the price book asks at signing. */
    downPaymentCents: z.number({ error: "Down payment must be a number" }).int("Down payment must be whole cents").min(0, "Down payment must not be negative").max(100_000_000).nullable().default(null),
  }),
]);
export type PaymentInput = z.output<typeof paymentInputSchema>;

export const offerInputsSchema = z
  .object({
    name: plainText().trim().min(1, "Give the offer a name").max(100),
    /** Module counts per design face (by face id); null = the design's own counts. */
    faceCounts: z
      .array(z.object({ faceId: z.string().min(1).max(40), moduleCount: z.number().int("Modules must be a whole number").min(0).max(1000) }))
      .max(24)
      .nullable()
      .default(null),
    /** Other equipment than the design's; null = the design's. */
    moduleId: z.string().uuid("Pick a module from the catalog").nullable().default(null),
    inverterId: z.string().uuid("Pick an inverter from the catalog").nullable().default(null),
    adderIds: z.array(z.string().min(1).max(60)).max(100).default([]),
    lineItemIds: z.array(z.string().min(1).max(60)).max(100).default([]),
    discountCents: z.number({ error: "Discount must be a number" }).int("Discount must be whole cents").min(0, "Discount must not be negative").max(100_000_000).default(0),
    /** Why the discount is given (required when it needs approval). */
    discountReason: plainText({ multiline: true }).trim().max(500).default(""),
    payment: paymentInputSchema.default({ kind: "cash" }),
    /** Rate plan for the bills; null = the deal's. */
    ratePlanId: z.string().uuid("Pick a rate plan from the list").nullable().default(null),
    /** Why a plan of another utility than the household's is used (required then; shown on the Timeline). */
    ratePlanOverrideReason: plainText({ multiline: true }).trim().max(300, "Keep the reason under 300 characters").default(""),
  })
  .superRefine((o, ctx) => {
    const seen = new Set<string>();
    (o.faceCounts ?? []).forEach((f, i) => {
      if (seen.has(f.faceId)) ctx.addIssue({ code: "custom", path: ["faceCounts", i, "faceId"], message: "This face is listed twice" });
      seen.add(f.faceId);
    });
    if (new Set(o.adderIds).size !== o.adderIds.length) ctx.addIssue({ code: "custom", path: ["adderIds"], message: "An adder is listed twice" });
    if (new Set(o.lineItemIds).size !== o.lineItemIds.length) ctx.addIssue({ code: "custom", path: ["lineItemIds"], message: "A line item is listed twice" });
  });
export type OfferInputs = z.output<typeof offerInputsSchema>;
export type OfferInputsInput = z.input<typeof offerInputsSchema>;

/** POST /api/offers */
export const createOfferSchema = z.object({ dealId: z.string().uuid("Unknown deal"), inputs: offerInputsSchema });
/** PUT /api/offers/[id] */
export const updateOfferSchema = z.object({ inputs: offerInputsSchema });

/** POST /api/discount-requests/[id]/decision */
export const discountDecisionSchema = z
  .object({
    decision: z.enum(["approve", "decline"], { error: "Choose approve or decline" }),
    note: plainText({ multiline: true }).trim().max(1000).default(""),
  })
  .refine((d) => d.decision === "approve" || d.note.length >= 3, { path: ["note"], message: "Say why the discount is declined" });
