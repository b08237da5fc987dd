// Starting points for the editor: a new plan, and each energy or compensation kind when the
// admin switches to it. Pure, usable by server pages and the client editor.
import type { RatePlan } from "@/engine/rates";
import type { RatePlanRecord } from "@/lib/schemas/rate-plan";

export type EditorRecord = Omit<RatePlanRecord, "plan"> & { plan: RatePlan };

export function newRatePlanRecord(): EditorRecord {
  return {
    utilityId: "",
    active: true,
    plan: {
      name: "",
      fixedMonthlyCents: 1_400,
      minimumBillCents: 0,
      energy: energyTemplate("flat"),
      compensation: compensationTemplate("net-metering"),
    },
  };
}

export const ALL_MONTHS = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];

export function energyTemplate(kind: RatePlan["energy"]["kind"]): RatePlan["energy"] {
  if (kind === "flat") return { kind, centsPerKwh: 14 };
  if (kind === "tiered") {
    return {
      kind,
      tiers: [
        { upToKwh: 800, centsPerKwh: 13 },
        { upToKwh: null, centsPerKwh: 15 },
      ],
    };
  }
  return {
    kind,
    periods: [
      { id: "on-peak", label: "On-peak", centsPerKwh: 18 },
      { id: "off-peak", label: "Off-peak", centsPerKwh: 11 },
    ],
    seasons: [{ name: "All year", months: [...ALL_MONTHS], otherHoursPeriodId: "off-peak", weekday: [{ startHour: 16, endHour: 21, periodId: "on-peak" }], weekend: [] }],
  };
}

export function compensationTemplate(kind: RatePlan["compensation"]["kind"]): RatePlan["compensation"] {
  if (kind === "net-metering") return { kind, trueUpMonth: 12, surplusCentsPerKwh: 0 };
  if (kind === "net-billing") return { kind, exportCentsPerKwh: 5, trueUpMonth: 12 };
  return { kind };
}
