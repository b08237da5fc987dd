// Starting points for the editor: a new plan, and each energy or compensation kind when the
// admin switches to it. Pure, usable by server pages and the client editor.
import type { RatePlan } from "@/engine/rates";
import type { RatePlanRecord } from "@/lib/schemas/rate-plan";
import type { FieldLabels } from "@/lib/validation-messages";

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

const rangeLabels = (dayType: "weekday" | "weekend", title: string): FieldLabels => ({
  [`plan.energy.seasons.#.${dayType}.#`]: `${title} hours {n}`,
  [`plan.energy.seasons.#.${dayType}.#.startHour`]: "from",
  [`plan.energy.seasons.#.${dayType}.#.endHour`]: "until",
  [`plan.energy.seasons.#.${dayType}.#.periodId`]: "period",
});

/** The editor's labels by the record's paths, for the messages that name a field. */
export const RATE_PLAN_LABELS: FieldLabels = {
  utilityId: "Utility",
  "plan.name": "Plan name",
  "plan.fixedMonthlyCents": "Fixed charge ($ / month)",
  "plan.minimumBillCents": "Minimum bill ($ / month)",
  "plan.energy.centsPerKwh": "Price (¢/kWh)",
  "plan.energy.tiers": "Tiers",
  "plan.energy.tiers.#": "Tier {n}",
  "plan.energy.tiers.#.upToKwh": "Up to (kWh / month)",
  "plan.energy.tiers.#.centsPerKwh": "Price (¢/kWh)",
  "plan.energy.periods": "Periods",
  "plan.energy.periods.#": "Period {n}",
  "plan.energy.periods.#.id": "Name",
  "plan.energy.periods.#.label": "Name",
  "plan.energy.periods.#.centsPerKwh": "Price (¢/kWh)",
  "plan.energy.seasons": "Seasons",
  "plan.energy.seasons.#": "Season {n}",
  "plan.energy.seasons.#.name": "Name",
  "plan.energy.seasons.#.months": "Months",
  "plan.energy.seasons.#.otherHoursPeriodId": "Other hours",
  ...rangeLabels("weekday", "Weekday"),
  ...rangeLabels("weekend", "Weekend"),
  "plan.compensation.trueUpMonth": "True-up month",
  "plan.compensation.surplusCentsPerKwh": "Surplus paid at true-up (¢/kWh)",
  "plan.compensation.exportCentsPerKwh": "Export credit (¢/kWh)",
};
