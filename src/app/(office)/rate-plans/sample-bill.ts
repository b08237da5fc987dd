// The sample household every rate plan is billed for on the Rate plans pages, through the
// engine (src/engine/rates.ts): 900 kWh each month spread over the hours by the reference
// residential load shape, no solar. Pure, so the list (server) and the editor (browser) agree.
import { spreadMonthlyToHourly } from "@/engine/load-shape";
import { makeBillCalculator, type AnnualBill, type RatePlanInput } from "@/engine/rates";
import { PREVIEW_MONTHLY_KWH } from "@/lib/schemas/rate-plan";

let usage: number[] | null = null;

export function sampleUsageHourlyKwh(): number[] {
  usage ??= spreadMonthlyToHourly(new Array<number>(12).fill(PREVIEW_MONTHLY_KWH)).hourlyKwh;
  return usage;
}

/** Twelve monthly bills of the sample household under a plan (throws EngineInputError on a bad plan). */
export function sampleBill(plan: RatePlanInput): AnnualBill {
  return makeBillCalculator(plan)(sampleUsageHourlyKwh(), null);
}
