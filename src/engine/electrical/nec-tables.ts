/**
 * NEC tables the electrical checks read, written out for the conductor sizes residential PV uses.
 * Every value in this file is written from memory of NFPA 70 (NEC) and must be checked against
 * the edition the authority having jurisdiction (AHJ) enforces: each table says "from memory".
 */

export const NEC_EDITIONS = ["2017", "2020", "2023"] as const;
export type NecEdition = (typeof NEC_EDITIONS)[number];

export const CONDUCTOR_MATERIALS = ["cu", "al"] as const;
export type ConductorMaterial = (typeof CONDUCTOR_MATERIALS)[number];
export const MATERIAL_NAME: Record<ConductorMaterial, string> = { cu: "copper", al: "aluminium" };

/** Insulation / terminal temperature columns of Table 310.16, °C. */
export const TEMP_COLUMNS = [60, 75, 90] as const;
export type TempColumn = (typeof TEMP_COLUMNS)[number];

/** Sizes in ascending order (AWG, then kcmil-free aught sizes up to 4/0). */
export const CONDUCTOR_SIZES = ["14", "12", "10", "8", "6", "4", "3", "2", "1", "1/0", "2/0", "3/0", "4/0"] as const;
export type ConductorSize = (typeof CONDUCTOR_SIZES)[number];
export const sizeLabel = (s: ConductorSize) => `${s} AWG`;

type Row = readonly [number, number, number];

/**
 * NEC Table 310.16 (Table 310.15(B)(16) in NEC 2017): allowable ampacities of not more than three
 * current-carrying conductors in raceway, cable or earth, at 30 °C ambient; columns 60/75/90 °C.
 * From memory (same figures in 2017, 2020 and 2023 for these sizes). Aluminium starts at 12 AWG.
 */
export const TABLE_310_16: Record<ConductorMaterial, Partial<Record<ConductorSize, Row>>> = {
  cu: { "14": [15, 20, 25], "12": [20, 25, 30], "10": [30, 35, 40], "8": [40, 50, 55], "6": [55, 65, 75], "4": [70, 85, 95], "3": [85, 100, 115], "2": [95, 115, 130], "1": [110, 130, 145], "1/0": [125, 150, 170], "2/0": [145, 175, 195], "3/0": [165, 200, 225], "4/0": [195, 230, 260] },
  al: { "12": [15, 20, 25], "10": [25, 30, 35], "8": [35, 40, 45], "6": [40, 50, 55], "4": [55, 65, 75], "3": [65, 75, 85], "2": [75, 90, 100], "1": [85, 100, 115], "1/0": [100, 120, 135], "2/0": [115, 135, 150], "3/0": [130, 155, 175], "4/0": [150, 180, 205] },
};

/** Table 310.16 ampacity of a size at a temperature column, or null when the table has no entry. */
export function tableAmpacity(material: ConductorMaterial, size: ConductorSize, column: TempColumn): number | null {
  const row = TABLE_310_16[material][size];
  return row ? row[TEMP_COLUMNS.indexOf(column)] : null;
}

/**
 * Ambient temperature correction factors for a 30 °C table: NEC 2020/2023 Table 310.15(B)(1),
 * NEC 2017 Table 310.15(B)(2)(a). Rows: highest ambient up to `toC` °C; factors for the
 * 60/75/90 °C columns (null: the conductor may not be used). From memory.
 */
export const AMBIENT_CORRECTION: readonly { toC: number; factors: readonly [number | null, number | null, number | null] }[] = [
  { toC: 10, factors: [1.29, 1.2, 1.15] },
  { toC: 15, factors: [1.22, 1.15, 1.12] },
  { toC: 20, factors: [1.15, 1.11, 1.08] },
  { toC: 25, factors: [1.08, 1.05, 1.04] },
  { toC: 30, factors: [1.0, 1.0, 1.0] },
  { toC: 35, factors: [0.91, 0.94, 0.96] },
  { toC: 40, factors: [0.82, 0.88, 0.91] },
  { toC: 45, factors: [0.71, 0.82, 0.87] },
  { toC: 50, factors: [0.58, 0.75, 0.82] },
  { toC: 55, factors: [0.41, 0.67, 0.76] },
  { toC: 60, factors: [null, 0.58, 0.71] },
  { toC: 65, factors: [null, 0.47, 0.65] },
  { toC: 70, factors: [null, 0.33, 0.58] },
  { toC: 75, factors: [null, null, 0.5] },
  { toC: 80, factors: [null, null, 0.41] },
  { toC: 85, factors: [null, null, 0.29] },
];

/** Correction factor for an ambient temperature (a fraction of a degree takes the warmer row); null past the table. */
export function ambientCorrection(ambientC: number, column: TempColumn): number | null {
  const row = AMBIENT_CORRECTION.find((r) => Math.ceil(ambientC) <= r.toC);
  return row ? row.factors[TEMP_COLUMNS.indexOf(column)] : null;
}

/**
 * Adjustment for more than three current-carrying conductors in one raceway or cable: NEC
 * 2020/2023 Table 310.15(C)(1), NEC 2017 Table 310.15(B)(3)(a). From memory.
 */
export const CONDUCTOR_COUNT_ADJUSTMENT: readonly { upTo: number; factor: number }[] = [
  { upTo: 3, factor: 1 },
  { upTo: 6, factor: 0.8 },
  { upTo: 9, factor: 0.7 },
  { upTo: 20, factor: 0.5 },
  { upTo: 30, factor: 0.45 },
  { upTo: 40, factor: 0.4 },
  { upTo: Number.POSITIVE_INFINITY, factor: 0.35 },
];

export function conductorCountAdjustment(currentCarrying: number): number {
  return CONDUCTOR_COUNT_ADJUSTMENT.find((r) => currentCarrying <= r.upTo)!.factor;
}

/**
 * Rooftop temperature adder for raceways and cables in sunlight, °C, by edition. From memory:
 * - NEC 2017 Table 310.15(B)(3)(c): by the distance of the raceway above the roof: 0–13 mm 33 °C,
 *   13–90 mm 22 °C, 90–300 mm 17 °C, 300–900 mm 14 °C, above 900 mm none (XHHW-2 exempt).
 * - NEC 2020 and 2023 removed the table: 310.15(B)(2) keeps one adder of 33 °C only for raceways
 *   or cables less than 7/8 in. (23 mm) above the roof.
 */
export function rooftopAdderC(edition: NecEdition, heightAboveRoofMm: number | null): { adderC: number; rule: string } {
  if (heightAboveRoofMm === null) return { adderC: 0, rule: "not on a rooftop in sunlight: no adder" };
  if (edition === "2017") {
    const adderC = heightAboveRoofMm <= 13 ? 33 : heightAboveRoofMm <= 90 ? 22 : heightAboveRoofMm <= 300 ? 17 : heightAboveRoofMm <= 900 ? 14 : 0;
    return { adderC, rule: "NEC 2017 Table 310.15(B)(3)(c) (from memory)" };
  }
  return {
    adderC: heightAboveRoofMm < 23 ? 33 : 0,
    rule: `NEC ${edition} 310.15(B)(2): 33 °C only below 7/8 in. (23 mm) above the roof; the 2017 table was removed (from memory)`,
  };
}

/** NEC 240.6(A) standard ampere ratings of fuses and inverse-time breakers (up to 400 A; from memory). */
export const STANDARD_OCPD_A = [15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350, 400] as const;

/** The next standard rating at or above `amps` (240.6(A)); null past 400 A. */
export function standardOcpdAtLeast(amps: number): number | null {
  return STANDARD_OCPD_A.find((r) => r >= amps - 1e-9) ?? null;
}

/**
 * NEC 240.4(D) small-conductor limits on the overcurrent device, A (from memory):
 * 14 Cu 15 A, 12 Cu 20 A, 10 Cu 30 A; 12 Al 15 A, 10 Al 25 A.
 */
export const SMALL_CONDUCTOR_MAX_OCPD: Record<ConductorMaterial, Partial<Record<ConductorSize, number>>> = {
  cu: { "14": 15, "12": 20, "10": 30 },
  al: { "12": 15, "10": 25 },
};

/**
 * NEC Table 250.122: minimum equipment grounding conductor by the rating of the overcurrent
 * device ahead of the circuit (copper, aluminium). From memory, rows up to 400 A.
 */
export const TABLE_250_122: readonly { upToA: number; cu: ConductorSize; al: ConductorSize }[] = [
  { upToA: 15, cu: "14", al: "12" },
  { upToA: 20, cu: "12", al: "10" },
  { upToA: 60, cu: "10", al: "8" },
  { upToA: 100, cu: "8", al: "6" },
  { upToA: 200, cu: "6", al: "4" },
  { upToA: 300, cu: "4", al: "2" },
  { upToA: 400, cu: "3", al: "1" },
];

export function egcSize(ocpdA: number, material: ConductorMaterial): ConductorSize | null {
  const row = TABLE_250_122.find((r) => ocpdA <= r.upToA);
  return row ? row[material] : null;
}

/**
 * NEC Chapter 9 Table 8: DC resistance at 75 °C of stranded uncoated copper and aluminium
 * conductors, ohms per 1000 ft. From memory.
 */
export const RESISTANCE_OHM_PER_KFT: Record<ConductorMaterial, Partial<Record<ConductorSize, number>>> = {
  cu: { "14": 3.14, "12": 1.98, "10": 1.24, "8": 0.778, "6": 0.491, "4": 0.308, "3": 0.245, "2": 0.194, "1": 0.154, "1/0": 0.122, "2/0": 0.0967, "3/0": 0.0766, "4/0": 0.0608 },
  al: { "12": 3.25, "10": 2.04, "8": 1.28, "6": 0.808, "4": 0.508, "3": 0.403, "2": 0.319, "1": 0.253, "1/0": 0.201, "2/0": 0.159, "3/0": 0.126, "4/0": 0.1 },
};

/** Where each edition puts a rule (section numbers from memory; check the edition's own text). */
export const SECTIONS: Record<NecEdition, { ambient: string; adjustment: string; rooftop: string; inverterOutput: string; acConductor: string; inverterOcpd: string; busbar: string; table310_16: string }> = {
  "2017": {
    ambient: "NEC 2017 Table 310.15(B)(2)(a)",
    adjustment: "NEC 2017 Table 310.15(B)(3)(a)",
    rooftop: "NEC 2017 Table 310.15(B)(3)(c)",
    inverterOutput: "NEC 2017 690.8(A)(3) and 705.60(B)",
    acConductor: "705.60(B)",
    inverterOcpd: "NEC 2017 705.65 with 690.9(B)",
    busbar: "NEC 2017 705.12(B)(2)(3)(b)",
    table310_16: "NEC 2017 Table 310.15(B)(16)",
  },
  "2020": {
    ambient: "NEC 2020 Table 310.15(B)(1)",
    adjustment: "NEC 2020 Table 310.15(C)(1)",
    rooftop: "NEC 2020 310.15(B)(2)",
    inverterOutput: "NEC 2020 690.8(A)(1)(e) and 705.28(B)",
    acConductor: "705.28(B)",
    inverterOcpd: "NEC 2020 705.30(B)",
    busbar: "NEC 2020 705.12(B)(3)(2)",
    table310_16: "NEC 2020 Table 310.16",
  },
  "2023": {
    ambient: "NEC 2023 Table 310.15(B)(1)(1)",
    adjustment: "NEC 2023 Table 310.15(C)(1)",
    rooftop: "NEC 2023 310.15(B)(2)",
    inverterOutput: "NEC 2023 690.8(A)(1)(e) and 705.28(B)",
    acConductor: "705.28(B)",
    inverterOcpd: "NEC 2023 705.30(B)",
    busbar: "NEC 2023 705.12(B)(3)(2) (renumbered within 705.12(B)(3) in this edition; check the text)",
    table310_16: "NEC 2023 Table 310.16",
  },
};
