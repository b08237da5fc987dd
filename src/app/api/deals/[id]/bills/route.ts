import { NextResponse } from "next/server";
import { billsTableSchema } from "@/lib/schemas/energy";
import { withDeal } from "@/server/deal-route";
import { getDealUsage, listBills, saveBills } from "@/server/energy";
import { readJson } from "@/server/route";

export const GET = withDeal("deals:read-own", async ({ scope }) => NextResponse.json({ data: await listBills(scope) }));

/** Replaces the deal's bills with the table as the rep sees it; answers with the new usage year. */
export const PUT = withDeal("deals:write", async ({ req, scope }) => {
  const bills = await saveBills(scope, await readJson(req, billsTableSchema));
  return NextResponse.json({ data: { bills, usage: await getDealUsage(scope) } });
});
