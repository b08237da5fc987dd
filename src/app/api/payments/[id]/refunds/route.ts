import { NextResponse } from "next/server";
import { refundPaymentSchema } from "@/lib/schemas/refund";
import { notFound } from "@/server/errors";
import { refundPayment } from "@/server/payments";
import { idSchema, readJson, withMember } from "@/server/route";

/** Office roles refund all or part of a paid deposit through the provider: { amountCents, reason }. */
export const POST = withMember<{ id: string }>("payments:refund", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Payment");
  const body = await readJson(req, refundPaymentSchema);
  return NextResponse.json({ data: await refundPayment(member, params.id, body) }, { status: 201 });
});
