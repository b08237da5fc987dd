// Demo batteries for Tallgrass Bright Energy's catalog. Manufacturers and models are invented;
// the figures are in the range of current residential datasheets.
import { batteryModel } from "../../../src/db/schema";
import type { SeedContext } from "../seed-demo";

export const order = 11;

/** Fixed ids (seeding is idempotent): batteries …001021–001023. */
const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;
const DEMO_BATTERY_IDS = { ac13: uid(1021), dc10: uid(1022), ac5: uid(1023) } as const;

export async function seed(ctx: SeedContext): Promise<void> {
  const common = { companyId: ctx.companyId, active: true };
  await ctx.tx.insert(batteryModel).values([
    { ...common, id: DEMO_BATTERY_IDS.ac13, manufacturer: "Stillwater Storage", model: "SW-13.5AC", usableKwh: 13.5, continuousKw: 5, peakKw: 7, roundTripEfficiencyPct: 90, depthOfDischargePct: 100, warrantyYears: 10, warrantyThroughputMwh: 37.8, coupling: "ac" },
    { ...common, id: DEMO_BATTERY_IDS.dc10, manufacturer: "Kettle Creek Energy", model: "KC-10DC", usableKwh: 10, continuousKw: 5, peakKw: 7.6, roundTripEfficiencyPct: 94.5, depthOfDischargePct: 95, warrantyYears: 10, warrantyThroughputMwh: 30, coupling: "dc" },
    { ...common, id: DEMO_BATTERY_IDS.ac5, manufacturer: "Stillwater Storage", model: "SW-5AC", usableKwh: 5, continuousKw: 3.8, peakKw: 5.7, roundTripEfficiencyPct: 89, depthOfDischargePct: 100, warrantyYears: 12, warrantyThroughputMwh: null, coupling: "ac" },
  ]);
}
