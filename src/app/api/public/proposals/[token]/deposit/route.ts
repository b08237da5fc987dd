import { NextResponse } from "next/server";
import { z } from "zod";
import { notFound } from "@/server/errors";
import { getDepositForCustomer, startDepositCheckout } from "@/server/payments";
import { guardPublicMutation } from "@/server/request-guard";
import { toErrorResponse } from "@/server/route";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ token: string }> };
/** Link tokens are base64url (src/server/tokens.ts); anything else is simply not found. */
const tokenSchema = z.string().regex(/^[A-Za-z0-9_-]{20,200}$/);
const noStore = { "Cache-Control": "no-store" };

/** The customer's page polls this for the deposit's state (set only by the webhook, never by the redirect). */
export async function GET(_req: Request, ctx: Ctx): Promise<Response> {
  try {
    const { token } = await ctx.params;
    if (!tokenSchema.safeParse(token).success) throw notFound("Proposal");
    const deposit = await getDepositForCustomer(token);
    if (!deposit) throw notFound("Deposit");
    return NextResponse.json({ data: deposit }, { headers: noStore });
  } catch (err) {
    return toErrorResponse(err);
  }
}

/** The Pay button: returns the Checkout Session's url (the open one if there is one); only from our own page. */
export async function POST(req: Request, ctx: Ctx): Promise<Response> {
  try {
    guardPublicMutation(req);
    const { token } = await ctx.params;
    if (!tokenSchema.safeParse(token).success) throw notFound("Proposal");
    const { url, reused } = await startDepositCheckout(token);
    return NextResponse.json({ data: { url, reused } }, { headers: noStore });
  } catch (err) {
    return toErrorResponse(err);
  }
}
