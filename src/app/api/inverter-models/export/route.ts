import { exportInvertersCsv } from "@/server/catalog";
import { csvDownload, withMember } from "@/server/route";

/** The company's inverters as CSV (columns documented on the Catalog page). */
export const GET = withMember("catalog:read", async ({ member }) => csvDownload("inverters.csv", await exportInvertersCsv(member.companyId)));
