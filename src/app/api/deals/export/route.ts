import { dealTableFiltersSchema, searchParamsObject } from "@/lib/schemas/deal-table";
import { todayInZone } from "@/lib/zoned-time";
import { getCompanySettings } from "@/server/company-settings";
import { dealTableCsvStream } from "@/server/deal-table";
import { validationError, withMember } from "@/server/route";

/** The whole filtered, sorted view of the deals table as CSV (same filters as /api/deals/table). */
export const GET = withMember("deals:read-own", async ({ req, member }) => {
  const parsed = dealTableFiltersSchema.safeParse(searchParamsObject(req.nextUrl.searchParams));
  if (!parsed.success) throw validationError(parsed.error);
  const { timeZone } = await getCompanySettings(member.companyId);
  const day = todayInZone(timeZone);
  return new Response(dealTableCsvStream(member, parsed.data, timeZone), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="kilowright-deals-${day}.csv"`,
      "Cache-Control": "no-store",
    },
  });
});
