import { exportInvertersCsv } from "@/server/catalog";
import { withMember } from "@/server/route";

/** The company's inverters as CSV (columns documented on the Catalog page). */
export const GET = withMember("catalog:read", async ({ member }) => {
  const csv = await exportInvertersCsv(member.companyId);
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": 'attachment; filename="inverters.csv"',
      "Cache-Control": "no-store",
    },
  });
});
