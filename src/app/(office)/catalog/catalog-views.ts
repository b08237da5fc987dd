// What the catalog's table and forms show of a module or an inverter. Its own module so the
// page, the table and the forms do not import each other.
import type { CellTechnology, CoefficientUnit, Construction, InverterKind } from "@/lib/schemas/catalog";

export type ModuleView = {
  id: string;
  manufacturer: string;
  model: string;
  stcWatts: number;
  vocV: number;
  iscA: number;
  vmpV: number;
  impA: number;
  gammaPmaxPctPerC: number;
  betaVocPctPerC: number;
  vocCoeff: { value: number; unit: CoefficientUnit };
  maxSeriesFuseA: number | null;
  lengthMm: number;
  widthMm: number;
  cellTechnology: CellTechnology;
  construction: Construction;
  encapsulant: string | null;
  active: boolean;
};

export type InverterView = {
  id: string;
  manufacturer: string;
  model: string;
  kind: InverterKind;
  acWatts: number;
  efficiencyPct: number;
  maxDcVoltageV: number | null;
  mpptMinV: number | null;
  mpptMaxV: number | null;
  maxInputCurrentA: number | null;
  mpptCount: number | null;
  dcInputMinV: number | null;
  dcInputMaxV: number | null;
  modulesPerUnit: number | null;
  active: boolean;
};
