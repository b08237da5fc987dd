import { dealTableFiltersSchema, searchParamsObject } from "@/lib/schemas/deal-table";
import { dealTableCsvStream } from "@/server/deal-table";
import { validationError, withMember } from "@/server/route";

/** The whole filtered, sorted view of the deals table as CSV (same filters as /api/deals/table). */
export const GET = withMember("deals:read-own", async ({ req, member }) => {
  const parsed = dealTableFiltersSchema.safeParse(searchParamsObject(req.nextUrl.searchParams));
  if (!parsed.success) throw validationError(parsed.error);
  const day = new Date().toISOString().slice(0, 10);
  return new Response(dealTableCsvStream(member, parsed.data), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="kilowright-deals-${day}.csv"`,
      "Cache-Control": "no-store",
    },
  });
});
