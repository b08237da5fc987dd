import { NextResponse } from "next/server";
import { dealTableQuerySchema, searchParamsObject } from "@/lib/schemas/deal-table";
import { dealTablePageJson } from "@/server/deal-table";
import { validationError, withMember } from "@/server/route";

/**
 * One page of the deals table: ?page=&pageSize=&sort=column:dir&stage=&owner=&source=&q=&from=&to=.
 * Paged, sorted and filtered in the database; `{ data: { rows, total, page, pageSize } }`.
 */
export const GET = withMember("deals:read-own", async ({ req, member }) => {
  const parsed = dealTableQuerySchema.safeParse(searchParamsObject(req.nextUrl.searchParams));
  if (!parsed.success) throw validationError(parsed.error);
  // The page's JSON text is kept with the page (deal-table.ts), so it is wrapped, not serialized again.
  return new NextResponse(`{"data":${await dealTablePageJson(member, parsed.data)}}`, { headers: { "content-type": "application/json" } });
});
