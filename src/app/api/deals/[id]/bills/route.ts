import { NextResponse } from "next/server";
import { billsTableSchema } from "@/lib/schemas/energy";
import { getDealUsage, listBills, saveBills } from "@/server/energy";
import { openDeal } from "@/server/deal-scope";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: await listBills(await openDeal(member, params.id)) });
});

/** Replaces the deal's bills with the table as the rep sees it; answers with the new usage year. */
export const PUT = withMember<Params>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const scope = await openDeal(member, params.id);
  const input = await readJson(req, billsTableSchema);
  const bills = await saveBills(scope, input);
  return NextResponse.json({ data: { bills, usage: await getDealUsage(scope) } });
});
