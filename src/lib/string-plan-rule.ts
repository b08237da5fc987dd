// A design goes into a proposal only when it can be built: a string-inverter system is sold with
// its strings laid out (the string plan is what the code checks, NEC 690.7 voltage and 690.8
// current, run on and what the crew wires), and its electrical design must be complete (the
// service panel's ratings known) and pass its NEC checks (src/engine/electrical). Pure: the
// server refuses to freeze such an offer into a proposal and the Proposal tab says why before
// sending. A design that fails may still be saved as a draft.
import type { ElectricalDesign } from "@/engine/electrical/design";
import { electricalProblems } from "@/engine/electrical/design";

export type SoldInverter = { kind: "string" | "micro"; manufacturer: string; model: string };

/** Why an offer on this inverter cannot go into a proposal with this design's string plan, or null. */
export function missingStringPlanReason(inverter: SoldInverter, stringPlan: { stringSizes: readonly number[] } | null | undefined): string | null {
  if (inverter.kind !== "string") return null;
  if (stringPlan && stringPlan.stringSizes.length > 0) return null;
  return `The design uses a string inverter (${inverter.manufacturer} ${inverter.model}) but has no string plan: lay out the strings on the Design tab and save the design first`;
}

/**
 * Why an offer cannot go into a proposal: no string plan (above), else the electrical design's
 * missing inputs or failed checks; null when it can be built as checked. `electrical` is the
 * offer's electrical design, or null when its equipment is no longer in the catalog.
 */
export function unbuildableReason(inverter: SoldInverter, stringPlan: { stringSizes: readonly number[] } | null | undefined, electrical: ElectricalDesign | null): string | null {
  const missingPlan = missingStringPlanReason(inverter, stringPlan);
  if (missingPlan) return missingPlan;
  if (!electrical) return "The offer's module or inverter is no longer in the catalog: pick current equipment and save the offer again";
  if (electrical.status === "incomplete") {
    return `The electrical design is incomplete: ${electrical.missing.join(", ")} ${electrical.missing.length > 1 ? "are" : "is"} missing (the service panel's ratings go on the Household tab)`;
  }
  const failed = electricalProblems(electrical);
  if (failed.length > 0) return `The electrical design fails ${failed.length === 1 ? "a check" : `${failed.length} checks`}: ${failed.join("; ")}. Change the design (see the Design tab's electrical checks)`;
  return null;
}
