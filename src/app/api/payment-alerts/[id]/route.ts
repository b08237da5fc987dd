import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getPaymentAlertOrThrow } from "@/server/payments";
import { idSchema, withMember } from "@/server/route";

/** One payment alert of the member's company (the office's reconciliation roles). */
export const GET = withMember<{ id: string }>("payments:reconcile", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Payment alert");
  return NextResponse.json({ data: await getPaymentAlertOrThrow(member, params.id) });
});
