import "server-only";
import { gte, lt, type SQL } from "drizzle-orm";
import type { AnyMySqlColumn } from "drizzle-orm/mysql-core";
import { dayRangeInZone } from "@/lib/zoned-time";
import { getCompanySettings } from "@/server/company-settings";

/** The company's time zone, read only when a filter names calendar days. */
export async function zoneForDays(companyId: string, range: { from?: string; to?: string }): Promise<string | null> {
  return range.from || range.to ? (await getCompanySettings(companyId)).timeZone : null;
}

/** `column` within the calendar days from..to as the company's clock reads them (not UTC days). */
export function withinDays(column: AnyMySqlColumn, range: { from?: string; to?: string }, timeZone: string | null): SQL[] {
  if (!timeZone) return [];
  const { start, end } = dayRangeInZone(range, timeZone);
  return [...(start ? [gte(column, start)] : []), ...(end ? [lt(column, end)] : [])];
}
