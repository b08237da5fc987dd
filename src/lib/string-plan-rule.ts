// A string-inverter system is sold with its strings laid out: the string plan is what the code
// checks (NEC 690.7 voltage, 690.8 current) run on and what the crew wires. Pure: the server
// refuses to freeze such an offer into a proposal and the Proposal tab says why before sending.

export type SoldInverter = { kind: "string" | "micro"; manufacturer: string; model: string };

/** Why an offer on this inverter cannot go into a proposal with this design's string plan, or null. */
export function missingStringPlanReason(inverter: SoldInverter, stringPlan: { stringSizes: readonly number[] } | null | undefined): string | null {
  if (inverter.kind !== "string") return null;
  if (stringPlan && stringPlan.stringSizes.length > 0) return null;
  return `The design uses a string inverter (${inverter.manufacturer} ${inverter.model}) but has no string plan: lay out the strings on the Design tab and save the design first`;
}
