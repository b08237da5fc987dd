import { exportModulesCsv } from "@/server/catalog";
import { csvDownload, withMember } from "@/server/route";

/** The company's modules as CSV (columns documented on the Catalog page). */
export const GET = withMember("catalog:read", async ({ member }) => csvDownload("modules.csv", await exportModulesCsv(member.companyId)));
