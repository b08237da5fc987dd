// The Energy tab's bills table: one schema for the table in the browser and the server.
import { z } from "zod";
import { BILL_SOURCES } from "@/lib/enums";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a date like 2026-01-31");

export const billRowSchema = z
  .object({
    periodStart: isoDate,
    periodEnd: isoDate,
    kwh: z.number({ error: "Enter the kWh on the bill" }).positive("kWh must be more than 0").max(100_000, "More than 100,000 kWh in one bill is not a home"),
    costCents: z.number({ error: "Enter the amount in cents" }).int("The amount is whole cents").min(0, "The amount cannot be negative").max(10_000_000).nullable().optional(),
    uploadId: z.uuid().nullable().optional(),
    /** Where the row came from (a bill's history marks its months); typed when not said. */
    source: z.enum(BILL_SOURCES).optional(),
    periodEstimated: z.boolean().optional(),
  })
  .refine((b) => b.periodEnd > b.periodStart, { path: ["periodEnd"], message: "The end must be after the start" });

export const billsTableSchema = z.object({ bills: z.array(billRowSchema).max(36, "Keep to the last 36 bills") });

export const MAX_BILL_FILE_BYTES = 10 * 1024 * 1024;
/** Interval data (Green Button XML, CSV) may be larger than a bill: a year of 15-minute readings. */
export const MAX_INTERVAL_FILE_BYTES = 20 * 1024 * 1024;
