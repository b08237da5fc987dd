/**
 * Rapid shutdown (NEC 690.12, 2017 and later) and the labels the code asks for, in our own words.
 * Section numbers and wording requirements are from memory; the AHJ may ask for more.
 *
 * 690.12(B)(1): outside the array boundary (1 ft from the array), controlled conductors fall to
 * 30 V or less within 30 s of starting the shutdown. 690.12(B)(2): inside the boundary, 80 V or less
 * within 30 s (module-level electronics), or a listed PV hazard control system.
 */
import type { CheckStatus, ElectricalCheck } from "./circuit";
import type { NecEdition } from "./nec-tables";

export const MODULE_LEVEL_ELECTRONICS = ["none", "rapid-shutdown-device", "optimizer", "microinverter"] as const;
export type ModuleLevelElectronics = (typeof MODULE_LEVEL_ELECTRONICS)[number];

export type RapidShutdownResult = { status: CheckStatus; check: ElectricalCheck; initiator: string };

export function checkRapidShutdown(edition: NecEdition, mlpe: ModuleLevelElectronics, onBuilding: boolean): RapidShutdownResult {
  const initiator = "Rapid shutdown initiator at a readily accessible place outside the building (for one- and two-family dwellings), 690.12(C); the service disconnect may serve as it.";
  if (!onBuilding) {
    return { status: "pass", initiator, check: { id: "rapid-shutdown", status: "pass", rule: "690.12", detail: "Not on or in a building: rapid shutdown does not apply" } };
  }
  const inside: Record<ModuleLevelElectronics, { status: CheckStatus; detail: string }> = {
    none: { status: "fail", detail: "A string inverter without module-level electronics leaves the array at string voltage: add a rapid-shutdown device per module (or a listed PV hazard control system)" },
    "rapid-shutdown-device": { status: "pass", detail: "A rapid-shutdown device at each module brings conductors inside the array boundary to ≤ 80 V within 30 s (check the device's listing with the inverter)" },
    optimizer: { status: "pass", detail: "Module-level optimizers bring conductors inside the array boundary to ≤ 80 V within 30 s when listed with the inverter as a rapid shutdown system" },
    microinverter: { status: "pass", detail: "Microinverters leave only AC conductors, de-energized when the grid or the AC disconnect opens; the units' listing covers 690.12" },
  };
  const r = inside[mlpe];
  return {
    status: r.status,
    initiator,
    check: { id: "rapid-shutdown", status: r.status, rule: `NEC ${edition} 690.12(B): ≤ 30 V outside and ≤ 80 V inside the array boundary within 30 s (from memory)`, detail: r.detail },
  };
}

export type RequiredLabel = { id: string; section: string; where: string; wording: string };

/** The labels a residential PV system usually needs, with what each must say, in our words (from memory). */
export function requiredLabels(edition: NecEdition, opts: { kind: "string" | "micro"; rule120: boolean; maxDcVoltageV: number | null }): RequiredLabel[] {
  const raceway = edition === "2017" ? "690.31(G)(3)" : "690.31(D)(2)";
  const labels: RequiredLabel[] = [
    {
      id: "rapid-shutdown-sign",
      section: "690.56(C)",
      where: "At the service equipment, or where the rapid shutdown switch is, within sight of it",
      wording: "States that the PV system has rapid shutdown, with a simple roof plan shading the parts that stay energized after the switch is turned off; reflective, with a title in capital letters at least 3/8 in. high.",
    },
    {
      id: "rapid-shutdown-switch",
      section: edition === "2017" ? "690.56(C)(3)" : "690.56(C)(2)",
      where: "On or beside the rapid shutdown initiator",
      wording: "Names the switch as the rapid shutdown switch for the solar system; white capital letters at least 3/8 in. high on red.",
    },
    {
      id: "pv-disconnect",
      section: "690.13(B)",
      where: "On each PV system disconnect",
      wording: "Identifies it as the PV system disconnect and, where both sides can stay energized when it is open, warns of electric shock with the words that line and load sides may be energized.",
    },
    {
      id: "sources-directory",
      section: "705.10 and 690.56(B)",
      where: "At the service equipment",
      wording: "A permanent plaque or directory showing where every power source on the premises and its disconnect is.",
    },
    {
      id: "multiple-sources",
      section: edition === "2017" ? "705.12(B)(3)" : "705.12(C)",
      where: "On the panel fed by both the utility and the PV system",
      wording: "Says the equipment is fed from more than one source and names them.",
    },
    {
      id: "labels-durable",
      section: "110.21(B)",
      where: "Every label above",
      wording: "Permanently fixed, suited to the place (sunlight, weather), not handwritten; warnings use the hazard words and colours of ANSI Z535.4.",
    },
  ];
  if (opts.kind === "string") {
    labels.push(
      {
        id: "dc-source",
        section: "690.53",
        where: "At the DC PV system disconnect (or the inverter)",
        wording: `States the maximum DC voltage of the PV system${opts.maxDcVoltageV ? ` (${opts.maxDcVoltageV} V by 690.7)` : ""}${edition === "2017" ? ", and in the 2017 edition also the rated operating current and voltage and the maximum circuit current" : ""}.`,
      },
      {
        id: "dc-raceway",
        section: raceway,
        where: "On DC raceways, enclosures and boxes: every 10 ft, at turns, and above and below walls, floors and roofs they pass",
        wording: "Marks the contents as a photovoltaic power source; white capital letters at least 3/8 in. high on red, reflective.",
      },
    );
  }
  if (opts.rule120) {
    labels.push({
      id: "backfed-breaker",
      section: edition === "2017" ? "705.12(B)(2)(3)(b)" : "705.12(B)(3)(2)",
      where: "On the panel, beside the back-fed breaker",
      wording: "Warns that the breaker is the connection of a power source and must not be moved to another place on the busbar.",
    });
  }
  return labels;
}
