import { exportModulesCsv } from "@/server/catalog";
import { withMember } from "@/server/route";

/** The company's modules as CSV (columns documented on the Catalog page). */
export const GET = withMember("catalog:read", async ({ member }) => {
  const csv = await exportModulesCsv(member.companyId);
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": 'attachment; filename="modules.csv"',
      "Cache-Control": "no-store",
    },
  });
});
