// A deal's electrical design: the catalog's module and inverter, the design's string plan and
// module count, the household's service panel and the company's NEC edition, handed to the
// engine (src/engine/electrical/design.ts). Pure, so the Design tab, the job packet, the PDF and
// the proposal rule all read the same result.
import { designElectrical, type ElectricalDesign, type ElectricalInput } from "@/engine/electrical/design";
import type { NecEdition } from "@/engine/electrical/nec-tables";
import type { InverterSpec, ModuleSpec } from "@/lib/offer-figures";

/** Printed on the packet beside the "checked by" line. */
export const ELECTRICAL_CAUTION =
  "The electrical design, conductor sizes and single-line diagram are computed from the NEC tables as we recall them: a licensed professional checks them, and the authority having jurisdiction (AHJ) and the utility decide what is accepted.";

export type ElectricalSources = {
  edition: NecEdition;
  module: ModuleSpec & { manufacturer: string; model: string };
  inverter: InverterSpec & { manufacturer: string; model: string };
  inverterCount: number;
  moduleCount: number;
  stringPlan: { stringSizes: readonly number[]; lowestTempC: number; highestTempC: number } | null;
  panel: { serviceBusbarA: number | null; serviceMainBreakerA: number | null; serviceVoltageV: number | null };
};

export function electricalInputOf(s: ElectricalSources): ElectricalInput {
  const inv = s.inverter;
  return {
    edition: s.edition,
    module: { iscA: s.module.iscA, impA: s.module.impA, vocV: s.module.vocV, vmpV: s.module.vmpV, vocCoeffPctPerC: s.module.betaVocPctPerC, maxSeriesFuseA: s.module.maxSeriesFuseA ?? null },
    inverter: {
      kind: inv.kind,
      label: `${inv.manufacturer} ${inv.model}`,
      acWatts: inv.acWatts,
      maxDcVoltageV: inv.maxDcVoltageV,
      mpptMinV: inv.mpptMinV,
      mpptMaxV: inv.mpptMaxV,
      maxInputIscA: inv.maxInputCurrentA,
      mpptCount: inv.mpptCount,
      modulesPerUnit: inv.modulesPerUnit,
    },
    inverterCount: inv.kind === "string" ? s.inverterCount : 1,
    moduleCount: Math.max(1, s.moduleCount),
    strings: s.stringPlan && inv.kind === "string" ? { sizes: [...s.stringPlan.stringSizes], lowestTempC: s.stringPlan.lowestTempC, highestTempC: s.stringPlan.highestTempC } : null,
    site: { serviceVoltageV: s.panel.serviceVoltageV ?? 240, busbarA: s.panel.serviceBusbarA, mainBreakerA: s.panel.serviceMainBreakerA },
  };
}

export function electricalDesignOf(s: ElectricalSources): ElectricalDesign {
  return designElectrical(electricalInputOf(s));
}
