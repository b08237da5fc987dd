// Input schema for home batteries in the equipment catalog, shared by the route handlers and the
// CSV import (the same machinery as modules and inverters: src/server/catalog.ts). The ranges
// catch typing slips in datasheet values; they are sanity ranges, not a replacement for the datasheet.
import { z } from "zod";
import { label, measure, MODULE_CSV_COLUMNS, type CsvColumn } from "@/lib/schemas/catalog";

const BATTERY_COUPLINGS = ["ac", "dc"] as const;

const range = (min: number, max: number, label: string, unit = "") => ({ min, max, label, unit });
/** Plausible ranges for residential batteries (our choice, wide on both sides of today's datasheets). */
const BATTERY_LIMITS = {
  usableKwh: range(1, 200, "Usable energy", "kWh"),
  continuousKw: range(0.5, 100, "Continuous power", "kW"),
  peakKw: range(0.5, 200, "Peak power", "kW"),
  roundTripEfficiencyPct: range(50, 100, "Round-trip efficiency", "%"),
  depthOfDischargePct: range(10, 100, "Depth of discharge", "%"),
  warrantyYears: range(1, 30, "Warranty years"),
  warrantyThroughputMwh: range(1, 2000, "Warranty throughput", "MWh"),
};

export const batteryModelSchema = z
  .object({
    manufacturer: label("manufacturer"),
    model: label("model"),
    usableKwh: measure(BATTERY_LIMITS.usableKwh),
    continuousKw: measure(BATTERY_LIMITS.continuousKw),
    peakKw: measure(BATTERY_LIMITS.peakKw),
    roundTripEfficiencyPct: measure(BATTERY_LIMITS.roundTripEfficiencyPct),
    depthOfDischargePct: measure(BATTERY_LIMITS.depthOfDischargePct),
    warrantyYears: measure(BATTERY_LIMITS.warrantyYears, { integer: true }),
    warrantyThroughputMwh: measure(BATTERY_LIMITS.warrantyThroughputMwh).nullable().default(null),
    coupling: z.enum(BATTERY_COUPLINGS, { error: "Coupling must be ac or dc" }),
  })
  .superRefine((b, ctx) => {
    if (b.peakKw < b.continuousKw) ctx.addIssue({ code: "custom", path: ["peakKw"], message: `Peak power (${b.peakKw} kW) cannot be below the continuous power (${b.continuousKw} kW)` });
  });
export type BatteryModelValues = z.output<typeof batteryModelSchema>;

/** Fields a partial update may carry; the merged record is then checked with the full schema. */
export const batteryPatchSchema = z
  .object({
    manufacturer: z.string(),
    model: z.string(),
    usableKwh: z.number(),
    continuousKw: z.number(),
    peakKw: z.number(),
    roundTripEfficiencyPct: z.number(),
    depthOfDischargePct: z.number(),
    warrantyYears: z.number(),
    warrantyThroughputMwh: z.number().nullable(),
    coupling: z.enum(BATTERY_COUPLINGS, { error: "Coupling must be ac or dc" }),
    active: z.boolean(),
  })
  .partial()
  .strict();

export const BATTERY_CSV_COLUMNS: readonly CsvColumn[] = [
  // manufacturer and model: the same identifying columns as the modules' file
  ...MODULE_CSV_COLUMNS.slice(0, 2),
  { name: "usable_kwh", field: "usableKwh", type: "number", required: true, meaning: "Usable energy, kWh" },
  { name: "continuous_kw", field: "continuousKw", type: "number", required: true, meaning: "Continuous power, kW" },
  { name: "peak_kw", field: "peakKw", type: "number", required: true, meaning: "Peak (short-term) power, kW; at least the continuous power" },
  { name: "round_trip_efficiency_pct", field: "roundTripEfficiencyPct", type: "number", required: true, meaning: "Round-trip efficiency, %" },
  { name: "depth_of_discharge_pct", field: "depthOfDischargePct", type: "number", required: true, meaning: "Depth of discharge, %" },
  { name: "warranty_years", field: "warrantyYears", type: "integer", required: true, meaning: "Warranty, years" },
  { name: "warranty_throughput_mwh", field: "warrantyThroughputMwh", type: "number", required: false, meaning: "Energy the warranty covers, MWh; may be empty" },
  { name: "coupling", field: "coupling", type: "enum", required: true, meaning: BATTERY_COUPLINGS.join(" | ") },
  { name: "active", field: "active", type: "boolean", required: false, meaning: "true or false; empty keeps an existing row's status, new rows are active" },
];
