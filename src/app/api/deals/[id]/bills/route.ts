import { NextResponse } from "next/server";
import { billsTableSchema } from "@/lib/schemas/energy";
import { getDealUsage, listBills, saveBills } from "@/server/energy";
import { notFound } from "@/server/errors";
import { idSchema, readJson, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("deals:read-own", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  return NextResponse.json({ data: await listBills(member, params.id) });
});

/** Replaces the deal's bills with the table as the rep sees it; answers with the new usage year. */
export const PUT = withMember<Params>("deals:write", async ({ req, member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Deal");
  const input = await readJson(req, billsTableSchema);
  const bills = await saveBills(member, params.id, input);
  return NextResponse.json({ data: { bills, usage: await getDealUsage(member, params.id) } });
});
