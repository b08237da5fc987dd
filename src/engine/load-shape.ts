/**
 * Spreading monthly kWh over the 8760 hours of the typical year by an hourly shape.
 *
 * Default shape: the reference residential load from NREL/ssc's test inputs (BSD-3-Clause,
 * Alliance for Sustainable Energy; see data/reference-load-8760.ts). Each month's hours are
 * scaled so they add up to that month's kWh; the result is an estimate, never measured data.
 */
import { z } from "zod";
import { parseOrThrow } from "./errors";
import { REFERENCE_LOAD_HOURLY_KWH } from "./data/reference-load-8760";
import { HOURS_PER_YEAR, HOUR_MONTH, MONTH_DAYS, monthlySums } from "./year-calendar";

export const monthlyKwhSchema = z.array(z.number().finite().min(0)).length(12);
export const hourlyShapeSchema = z.array(z.number().finite().min(0)).length(HOURS_PER_YEAR);

/** Monthly kWh (Jan–Dec) of the reference load: about 375, 331, 334, 369, 479, 693, 842, 773, 622, 500, 325, 377. */
export function referenceMonthlyKwh(): number[] {
  return monthlySums(REFERENCE_LOAD_HOURLY_KWH);
}

/** The reference load's monthly shape as fractions of its annual total (sums to 1). */
export function referenceMonthlyShape(): number[] {
  const monthly = referenceMonthlyKwh();
  const total = monthly.reduce((a, b) => a + b, 0);
  return monthly.map((v) => v / total);
}

export type HourlyUsage = {
  hourlyKwh: number[];
  monthlyKwh: number[];
  annualKwh: number;
  /** Always "estimated": the hours come from a shape, not from a meter. */
  quality: "estimated";
  shape: "reference-residential" | "custom";
};

/**
 * Spread 12 monthly kWh over 8760 hours: hour h of month m gets monthlyKwh[m] · shape[h] / Σ shape over m.
 * A month whose shape sums to 0 is spread evenly over its hours.
 */
export function spreadMonthlyToHourly(monthlyKwh: readonly number[], shapeHourly?: readonly number[]): HourlyUsage {
  const monthly = parseOrThrow(monthlyKwhSchema, monthlyKwh, "monthly kWh");
  const shape = shapeHourly ? parseOrThrow(hourlyShapeSchema, shapeHourly, "hourly shape") : REFERENCE_LOAD_HOURLY_KWH;
  const shapeMonthly = monthlySums(shape);
  const hourlyKwh = new Array<number>(HOURS_PER_YEAR);
  for (let h = 0; h < HOURS_PER_YEAR; h++) {
    const m = HOUR_MONTH[h];
    hourlyKwh[h] = shapeMonthly[m] > 0 ? (monthly[m] * shape[h]) / shapeMonthly[m] : monthly[m] / (MONTH_DAYS[m] * 24);
  }
  return {
    hourlyKwh,
    monthlyKwh: [...monthly],
    annualKwh: monthly.reduce((a, b) => a + b, 0),
    quality: "estimated",
    shape: shapeHourly ? "custom" : "reference-residential",
  };
}
