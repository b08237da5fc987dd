/**
 * Sizing one circuit: conductor, overcurrent device, grounding conductor and voltage drop.
 *
 * Rules (NEC, NFPA 70; section numbers per edition in nec-tables.ts SECTIONS):
 * - 690.8(A) / 705.28(A): the circuit's maximum current (PV: Isc × 1.25; inverter output: the
 *   continuous output current rating) is given by the caller.
 * - 690.8(B)(1) / 705.28(B)(1): ampacity before correction and adjustment ≥ 125 % of that current,
 *   read in the column of the terminals' temperature rating (110.14(C): 75 °C terminals here
 *   unless the case says otherwise).
 * - 690.8(B)(2) / 705.28(B)(2): ampacity after the ambient correction (with the rooftop adder the
 *   edition has) and the adjustment for more than three current-carrying conductors ≥ the current.
 * - 690.9(B) / 705.30(B): the overcurrent device ≥ 125 % of the current, rounded up to a
 *   standard rating of 240.6(A); 240.4(B) lets a device protect a conductor whose ampacity falls
 *   between standard ratings (next size up); 240.4(D) caps small conductors.
 * - 250.122(A): grounding conductor by the device ahead; 250.122(B): upsized in proportion when
 *   the circuit conductors are upsized (here for voltage drop). 690.45: a PV circuit without a
 *   device uses an assumed device rated per 690.9(B).
 * - Voltage drop (not a code rule for these circuits; common practice: ≈ 2 % DC, ≈ 3 % total):
 *   Vd = 2 × one-way length × R × I, R from Chapter 9 Table 8.
 */
import {
  ambientCorrection,
  conductorCountAdjustment,
  CONDUCTOR_SIZES,
  egcSize,
  MATERIAL_NAME,
  RESISTANCE_OHM_PER_KFT,
  rooftopAdderC,
  SECTIONS,
  sizeLabel,
  SMALL_CONDUCTOR_MAX_OCPD,
  standardOcpdAtLeast,
  tableAmpacity,
  type ConductorMaterial,
  type ConductorSize,
  type NecEdition,
  type TempColumn,
} from "./nec-tables";

export type CheckStatus = "pass" | "warn" | "fail";
export type ElectricalCheck = { id: string; status: CheckStatus; rule: string; detail: string };

/** NEC 690.8(B)(1), 690.9(B), 705.28(B), 705.30(B): continuous loads at 125 %. */
export const CONTINUOUS_FACTOR = 1.25;

/**
 * Chapter 9 Table 8 areas, circular mils (from memory), for the proportional upsizing of the
 * grounding conductor (250.122(B)).
 */
const CIRCULAR_MILS: Record<ConductorSize, number> = {
  "14": 4110, "12": 6530, "10": 10380, "8": 16510, "6": 26240, "4": 41740, "3": 52620, "2": 66360, "1": 83690, "1/0": 105600, "2/0": 133100, "3/0": 167800, "4/0": 211600,
};

export type CircuitInput = {
  id: string;
  name: string;
  kind: "dc" | "ac";
  edition: NecEdition;
  /** The circuit's maximum current (690.8(A) or the inverter's continuous output), A. */
  maxCurrentA: number;
  /** The current that flows at the operating point (Imp, or the output current), A, and its voltage, V: for voltage drop. */
  operatingCurrentA: number;
  operatingVoltageV: number;
  material: ConductorMaterial;
  insulationC: TempColumn;
  terminalC: TempColumn;
  /** Highest ambient temperature where the conductor runs, °C. */
  ambientC: number;
  /** Height of the raceway above a roof in sunlight, mm; null when the run is not on a roof. */
  heightAboveRoofMm: number | null;
  /** Current-carrying conductors in the raceway. */
  currentCarrying: number;
  /** Whether the circuit has its own overcurrent device (PV source circuits often need none, 690.9(A)). */
  ocpdRequired: boolean;
  /** One-way length, ft. */
  lengthFt: number;
  /** Voltage-drop target for this circuit, % (common practice). */
  voltageDropTargetPct: number;
  /** Smallest size the caller accepts (e.g. the maker's terminal minimum); default the table's smallest. */
  minimumSize?: ConductorSize;
};

export type CircuitResult = {
  id: string;
  name: string;
  kind: "dc" | "ac";
  maxCurrentA: number;
  /** 690.8(B)(1): 125 % of the current, before correction and adjustment. */
  requiredBeforeA: number;
  material: ConductorMaterial;
  size: ConductorSize | null;
  sizeForAmpacity: ConductorSize | null;
  /** Table 310.16 at the terminal column, and at the insulation column after the factors. */
  terminalAmpacityA: number | null;
  correctedAmpacityA: number | null;
  ambientC: number;
  rooftopAdderC: number;
  correctionFactor: number | null;
  adjustmentFactor: number;
  currentCarrying: number;
  /** The circuit's device (null: none required), or the one assumed for the grounding conductor. */
  ocpdA: number | null;
  egcSize: ConductorSize | null;
  lengthFt: number;
  voltageDropV: number | null;
  voltageDropPct: number | null;
  checks: ElectricalCheck[];
  notes: string[];
};

const r2 = (x: number) => Math.round(x * 100) / 100;

/** What one size gives in this circuit: terminal-column ampacity, corrected ampacity, and whether it meets (B)(1), (B)(2) and 240.4. */
export function sizeFits(c: CircuitInput, size: ConductorSize, factor: number, ocpdA: number | null) {
  const terminal = tableAmpacity(c.material, size, c.terminalC);
  const insulation = tableAmpacity(c.material, size, c.insulationC);
  if (terminal === null || insulation === null) return null;
  const corrected = insulation * factor;
  // 110.14(C): the conductor's usable ampacity is also limited by its terminals.
  const usable = Math.min(corrected, terminal);
  const b1 = terminal >= c.maxCurrentA * CONTINUOUS_FACTOR - 1e-9;
  const b2 = corrected >= c.maxCurrentA - 1e-9;
  const small = SMALL_CONDUCTOR_MAX_OCPD[c.material][size];
  const protectedBy = ocpdA === null || ((standardOcpdAtLeast(usable) ?? Infinity) >= ocpdA && (small === undefined || ocpdA <= small));
  return { terminal, corrected, usable, b1, b2, protectedBy };
}

export function voltageDrop(material: ConductorMaterial, size: ConductorSize, lengthFt: number, currentA: number, voltageV: number): { volts: number; pct: number } | null {
  const ohmPerKft = RESISTANCE_OHM_PER_KFT[material][size];
  if (ohmPerKft === undefined) return null;
  const volts = (2 * lengthFt * ohmPerKft * currentA) / 1000;
  return { volts, pct: (volts / voltageV) * 100 };
}

function proportionalEgc(base: ConductorSize, material: ConductorMaterial, fromSize: ConductorSize, toSize: ConductorSize, circuitSize: ConductorSize): ConductorSize {
  const needed = CIRCULAR_MILS[base] * (CIRCULAR_MILS[toSize] / CIRCULAR_MILS[fromSize]);
  const found = CONDUCTOR_SIZES.find((s) => CIRCULAR_MILS[s] >= needed - 1 && RESISTANCE_OHM_PER_KFT[material][s] !== undefined) ?? circuitSize;
  // Never larger than the circuit conductors themselves (250.122(A)).
  return CONDUCTOR_SIZES.indexOf(found) > CONDUCTOR_SIZES.indexOf(circuitSize) ? circuitSize : found;
}

/** Size one circuit. */
export function sizeCircuit(c: CircuitInput): CircuitResult {
  const sections = SECTIONS[c.edition];
  const notes: string[] = [];
  const roof = rooftopAdderC(c.edition, c.heightAboveRoofMm);
  const ambient = c.ambientC + roof.adderC;
  const correction = ambientCorrection(ambient, c.insulationC);
  const adjustment = conductorCountAdjustment(c.currentCarrying);
  const requiredBefore = c.maxCurrentA * CONTINUOUS_FACTOR;
  const ocpdNeeded = standardOcpdAtLeast(requiredBefore);
  const ocpdA = c.ocpdRequired ? ocpdNeeded : null;
  const factor = (correction ?? 0) * adjustment;
  const start = CONDUCTOR_SIZES.indexOf(c.minimumSize ?? (c.material === "al" ? "12" : "14"));
  const candidates = CONDUCTOR_SIZES.slice(Math.max(0, start));
  const forAmpacity = correction === null ? undefined : candidates.find((s) => {
    const f = sizeFits(c, s, factor, ocpdA);
    return f !== null && f.b1 && f.b2 && f.protectedBy;
  });
  let size: ConductorSize | undefined = forAmpacity;
  let drop = size ? voltageDrop(c.material, size, c.lengthFt, c.operatingCurrentA, c.operatingVoltageV) : null;
  while (size && drop && drop.pct > c.voltageDropTargetPct) {
    const next = CONDUCTOR_SIZES[CONDUCTOR_SIZES.indexOf(size) + 1];
    if (!next) break;
    size = next;
    drop = voltageDrop(c.material, size, c.lengthFt, c.operatingCurrentA, c.operatingVoltageV);
  }
  if (size && forAmpacity && size !== forAmpacity) notes.push(`Upsized from ${sizeLabel(forAmpacity)} to ${sizeLabel(size)} for voltage drop (common practice); the grounding conductor grows in proportion (250.122(B)).`);
  const fit = size ? sizeFits(c, size, factor, ocpdA) : null;
  // 690.45: a PV circuit without its own device takes an assumed device rated per 690.9(B).
  const egcBasis = ocpdA ?? ocpdNeeded;
  let egc = egcBasis === null ? null : egcSize(egcBasis, c.material);
  if (egc && size && forAmpacity && size !== forAmpacity) egc = proportionalEgc(egc, c.material, forAmpacity, size, size);
  // 250.122(A): never larger than the circuit conductors themselves.
  if (egc && size && CONDUCTOR_SIZES.indexOf(egc) > CONDUCTOR_SIZES.indexOf(size)) egc = size;
  if (!c.ocpdRequired) notes.push(`No overcurrent device on this circuit (690.9(A)); the grounding conductor is sized for an assumed ${egcBasis} A device (690.45).`);

  const checks = circuitChecks({ c, sections, roof, ambient, correction, adjustment, requiredBefore, ocpdA, ocpdNeeded, size: size ?? null, fit, drop, egc, egcBasis });
  return {
    id: c.id,
    name: c.name,
    kind: c.kind,
    maxCurrentA: r2(c.maxCurrentA),
    requiredBeforeA: r2(requiredBefore),
    material: c.material,
    size: size ?? null,
    sizeForAmpacity: forAmpacity ?? null,
    terminalAmpacityA: fit?.terminal ?? null,
    correctedAmpacityA: fit ? r2(fit.corrected) : null,
    ambientC: ambient,
    rooftopAdderC: roof.adderC,
    correctionFactor: correction,
    adjustmentFactor: adjustment,
    currentCarrying: c.currentCarrying,
    ocpdA: c.ocpdRequired ? ocpdA : null,
    egcSize: egc,
    lengthFt: c.lengthFt,
    voltageDropV: drop ? r2(drop.volts) : null,
    voltageDropPct: drop ? r2(drop.pct) : null,
    checks,
    notes,
  };
}

type CheckFacts = {
  c: CircuitInput;
  sections: (typeof SECTIONS)[NecEdition];
  roof: { adderC: number; rule: string };
  ambient: number;
  correction: number | null;
  adjustment: number;
  requiredBefore: number;
  ocpdA: number | null;
  ocpdNeeded: number | null;
  size: ConductorSize | null;
  fit: ReturnType<typeof sizeFits>;
  drop: { volts: number; pct: number } | null;
  egc: ConductorSize | null;
  egcBasis: number | null;
};

function circuitChecks(x: CheckFacts): ElectricalCheck[] {
  const { c, sections, fit, size } = x;
  const mat = MATERIAL_NAME[c.material];
  const isPv = c.kind === "dc";
  const b = isPv ? "690.8(B)" : sections.acConductor;
  const checks: ElectricalCheck[] = [];
  const factorText = `${c.ambientC} °C${x.roof.adderC ? ` + ${x.roof.adderC} °C rooftop adder (${x.roof.rule})` : ""} → factor ${x.correction ?? "none"} (${sections.ambient}); ${c.currentCarrying} current-carrying conductors → ${x.adjustment} (${sections.adjustment})`;
  if (!size || !fit) {
    checks.push({ id: "conductor", status: "fail", rule: `${b}(1) and (2), ${sections.table310_16}`, detail: x.correction === null ? `No ${c.insulationC} °C conductor may run at ${x.ambient} °C` : `No ${mat} size up to 4/0 AWG carries ${r2(c.maxCurrentA)} A here (${factorText})` });
    return checks;
  }
  checks.push({
    id: "conductor-b1",
    status: fit.b1 ? "pass" : "fail",
    rule: `${b}(1): ≥ 125 % of the current before correction and adjustment, at the ${c.terminalC} °C terminal column (110.14(C))`,
    detail: `${r2(c.maxCurrentA)} A × 1.25 = ${r2(x.requiredBefore)} A ≤ ${fit.terminal} A (${sizeLabel(size)} ${mat}, ${c.terminalC} °C column of ${sections.table310_16}, from memory)`,
  });
  checks.push({
    id: "conductor-b2",
    status: fit.b2 ? "pass" : "fail",
    rule: `${b}(2): ≥ the current after correction and adjustment`,
    detail: `${tableAmpacity(c.material, size, c.insulationC)} A (${c.insulationC} °C column) × ${x.correction} × ${x.adjustment} = ${r2(fit.corrected)} A ≥ ${r2(c.maxCurrentA)} A; ${factorText}`,
  });
  checks.push(
    x.ocpdA === null
      ? { id: "ocpd", status: "pass", rule: isPv ? "690.9(A)" : sections.inverterOcpd, detail: "No overcurrent device required on this circuit" }
      : {
          id: "ocpd",
          status: fit.protectedBy ? "pass" : "fail",
          rule: `${isPv ? "690.9(B)" : sections.inverterOcpd}: ≥ 125 % of the current, next standard rating (240.6(A)); conductor protected (240.4(B), 240.4(D))`,
          detail: `${r2(x.requiredBefore)} A → ${x.ocpdA} A device; conductor's usable ampacity ${r2(fit.usable)} A`,
        },
  );
  checks.push({
    id: "egc",
    status: x.egc ? "pass" : "fail",
    rule: "Table 250.122 (from memory)" + (x.ocpdA === null ? " with 690.45's assumed device" : ""),
    detail: x.egc ? `${x.egcBasis} A device → ${sizeLabel(x.egc)} ${mat} grounding conductor` : `No row of Table 250.122 for ${x.egcBasis} A`,
  });
  if (x.drop) {
    checks.push({
      id: "voltage-drop",
      status: x.drop.pct <= c.voltageDropTargetPct ? "pass" : "warn",
      rule: `voltage drop ≤ ${c.voltageDropTargetPct} % (common practice, not a code limit); Chapter 9 Table 8 resistance (from memory)`,
      detail: `2 × ${c.lengthFt} ft × ${RESISTANCE_OHM_PER_KFT[c.material][size]} Ω/kft × ${r2(c.operatingCurrentA)} A = ${r2(x.drop.volts)} V of ${r2(c.operatingVoltageV)} V = ${r2(x.drop.pct)} %`,
    });
  }
  return checks;
}
