import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getPaymentOrThrow } from "@/server/payments";
import { idSchema, withMember } from "@/server/route";

/** One ledger payment of the member's company (reps: of their own deals). */
export const GET = withMember<{ id: string }>("payments:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Payment");
  return NextResponse.json({ data: await getPaymentOrThrow(member, params.id) });
});
