import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { resendDepositReceipt } from "@/server/payments";
import { idSchema, withMember } from "@/server/route";

/** Re-sends the deposit receipt to the customer (e.g. after a mail failure at payment time). */
export const POST = withMember<{ id: string }>("payments:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Payment");
  return NextResponse.json({ data: await resendDepositReceipt(member, params.id) });
});
