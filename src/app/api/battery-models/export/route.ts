import { exportBatteriesCsv } from "@/server/battery-catalog";
import { csvDownload, withMember } from "@/server/route";

/** GET: the company's batteries as CSV (the columns of BATTERY_CSV_COLUMNS). */
export const GET = withMember("catalog:read", async ({ member }) => csvDownload("batteries.csv", await exportBatteriesCsv(member.companyId)));
