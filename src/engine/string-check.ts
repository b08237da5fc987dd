/**
 * String check for string inverters: voltage and current of one series string against the
 * inverter and the code limits.
 *
 * Rules (U.S. National Electrical Code, NFPA 70, 2020 and 2023 editions):
 * - NEC 690.7(A)(1): the maximum PV system voltage is the sum of the modules' open-circuit
 *   voltages corrected to the lowest expected ambient temperature, using the manufacturer's
 *   Voc temperature coefficient: Voc_max = Voc_STC · (1 + (T_min − 25 °C) · β_Voc).
 * - NEC 690.7(A)(2) and Table 690.7(A): without a coefficient, crystalline and multicrystalline
 *   modules use the table's correction factor for the lowest expected ambient temperature.
 * - NEC 690.7: in one- and two-family dwellings the maximum PV system voltage is 600 V.
 * - NEC 690.8(A)(1): maximum circuit current = sum of parallel modules' Isc × 1.25.
 * - NEC 690.8(B): conductor ampacity not less than the larger of (1) 125 % of the 690.8(A)
 *   current before correction and adjustment factors (Isc × 1.25 × 1.25 = Isc × 1.56), and
 *   (2) the 690.8(A) current itself after correction and adjustment factors (Isc × 1.25).
 * - NEC 690.9(A): with strings in parallel and no string fuses, the current the other strings
 *   can feed into a faulted string ((strings − 1) × Isc × 1.25) must not exceed the module's
 *   maximum series fuse rating, else each string needs overcurrent protection.
 *
 * The MPPT window check (Vmp at a hot cell temperature, and at the cold extreme) is not a code
 * rule but common design practice: a string whose voltage leaves the window still works, but
 * loses energy. Hot cell temperature: the NOCT approximation T_cell = T_amb + (NOCT − 20 °C) ·
 * G / 800 W/m² at G = 1000 W/m² (the customary NOCT cell-temperature model, e.g. Duffie &
 * Beckman, "Solar Engineering of Thermal Processes", eq. 23.3.3, from memory).
 *
 * Every result carries CAUTION: the engine informs; a licensed professional and the AHJ decide.
 */
import { z } from "zod";
import { EngineInputError, parseOrThrow } from "./errors";
import { COEFFICIENT_UNITS, vocCoefficientPctPerC } from "./module-coefficients";

export const CAUTION =
  "Design aid only: the final design must be checked by a licensed professional against the local code and the authority having jurisdiction (AHJ).";

/** STC cell temperature, °C (IEC 60904-3 standard test conditions). */
export const STC_TEMP_C = 25;
/** NEC 690.7: maximum PV system voltage for one- and two-family dwellings, V. */
export const DWELLING_MAX_SYSTEM_VOLTAGE = 600;
/** NEC 690.8(A)(1): continuous-irradiance multiplier on Isc. */
export const NEC_690_8_A_FACTOR = 1.25;
/** NEC 690.8(B)(1): conductor multiplier on the 690.8(A) current (1.25 × 1.25 = 1.5625, "1.56"). */
export const NEC_690_8_B_FACTOR = 1.25;
/** NOCT test irradiance and air temperature (IEC 61215 NOCT conditions): 800 W/m², 20 °C. */
const NOCT_IRRADIANCE = 800;
const NOCT_AIR_C = 20;
/** Irradiance used for the hot-cell estimate, W/m². */
const HOT_CELL_IRRADIANCE = 1000;
/** NOCT assumed when the module data sheet gives none, °C (typical for glass/backsheet modules, from memory). */
export const DEFAULT_NOCT_C = 45;
/**
 * Vmp temperature coefficient assumed when neither it nor the Voc coefficient is known, %/°C
 * (crystalline silicon data sheets commonly show −0.35 to −0.45 %/°C for Pmax/Vmp, from memory;
 * the steeper end is the cautious choice for the low-voltage check).
 */
export const DEFAULT_VMP_COEFF_PCT_PER_C = -0.45;

/**
 * NEC Table 690.7(A), voltage correction factors for crystalline and multicrystalline silicon
 * modules (NEC 2020 and 2023; written out from memory of the table). Each row: lowest expected
 * ambient temperature range in °C (warmest first), factor.
 */
export const NEC_TABLE_690_7_A: readonly { fromC: number; toC: number; factor: number }[] = [
  { fromC: 24, toC: 20, factor: 1.02 },
  { fromC: 19, toC: 15, factor: 1.04 },
  { fromC: 14, toC: 10, factor: 1.06 },
  { fromC: 9, toC: 5, factor: 1.08 },
  { fromC: 4, toC: 0, factor: 1.1 },
  { fromC: -1, toC: -5, factor: 1.12 },
  { fromC: -6, toC: -10, factor: 1.14 },
  { fromC: -11, toC: -15, factor: 1.16 },
  { fromC: -16, toC: -20, factor: 1.18 },
  { fromC: -21, toC: -25, factor: 1.2 },
  { fromC: -26, toC: -30, factor: 1.21 },
  { fromC: -31, toC: -35, factor: 1.23 },
  { fromC: -36, toC: -40, factor: 1.25 },
];

/**
 * Table 690.7(A) factor for a temperature. The table lists whole degrees; a temperature between
 * two rows (e.g. −10.5 °C) takes the colder row, the cautious reading. At or above 25 °C (STC)
 * no correction is needed (1.00). Below −40 °C the table gives no factor: null.
 */
export function table690_7AFactor(lowestTempC: number): number | null {
  if (lowestTempC >= STC_TEMP_C) return 1;
  for (const row of NEC_TABLE_690_7_A) if (lowestTempC >= row.toC) return row.factor;
  return null;
}

const positive = z.number().finite().positive();

export const stringCheckInputSchema = z
  .object({
    module: z.object({
      vocV: positive.max(200),
      vmpV: positive.max(200),
      iscA: positive.max(50),
      impA: positive.max(50).optional(),
      /** Voc temperature coefficient, %/°C (negative for silicon), from the data sheet (see module-coefficients.ts for mV/°C and V/°C). */
      vocCoeffPctPerC: z.number().finite().min(-1).max(0).optional(),
      /** The Voc coefficient as the data sheet prints it (%/°C, mV/°C or V/°C), when vocCoeffPctPerC is not given. */
      vocCoeff: z.object({ value: z.number().finite(), unit: z.enum(COEFFICIENT_UNITS) }).optional(),
      /** The data sheet's maximum series fuse rating, A (NEC 690.9(A)). */
      maxSeriesFuseA: positive.max(100).optional(),
      /** Vmp (or Pmax) temperature coefficient, %/°C; falls back to the Voc coefficient. */
      vmpCoeffPctPerC: z.number().finite().min(-1).max(0).optional(),
      noctC: z.number().finite().min(30).max(70).optional(),
    }),
    inverter: z.object({
      maxDcInputV: positive.max(1500),
      mpptMinV: positive.max(1500),
      mpptMaxV: positive.max(1500),
      /** Maximum input short-circuit current per MPPT input, A. */
      maxInputIscA: positive.max(200).optional(),
    }),
    modulesInSeries: z.number().int().min(1).max(100),
    /** Strings in parallel on one MPPT input. */
    stringsInParallel: z.number().int().min(1).max(20).default(1),
    /** Lowest expected ambient temperature at the site, °C (e.g. the ASHRAE extreme annual mean minimum). */
    lowestTempC: z.number().finite().min(-70).max(40),
    /** Highest expected ambient temperature, °C (e.g. the ASHRAE 2 % design dry-bulb). */
    highestTempC: z.number().finite().min(-20).max(60),
    /** Override for the hot cell temperature, °C; default from NOCT. */
    hotCellTempC: z.number().finite().min(0).max(100).optional(),
    /** Code voltage limit, V (default 600 V for one- and two-family dwellings). */
    systemVoltageLimitV: positive.max(1500).default(DWELLING_MAX_SYSTEM_VOLTAGE),
    /** Ampacity of the chosen string conductor from the ampacity table, before correction and adjustment, A (optional). */
    conductorTableAmpacityA: positive.max(1000).optional(),
    /** Ampacity of the chosen string conductor after correction and adjustment factors, A (optional). */
    conductorAmpacityA: positive.max(1000).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.inverter.mpptMinV >= v.inverter.mpptMaxV) {
      ctx.addIssue({ code: "custom", path: ["inverter", "mpptMaxV"], message: "must be above mpptMinV" });
    }
    if (v.module.vmpV >= v.module.vocV) ctx.addIssue({ code: "custom", path: ["module", "vmpV"], message: "must be below vocV" });
    if (v.module.vocCoeff && v.module.vocCoeffPctPerC === undefined) {
      const pct = vocCoefficientPctPerC(v.module.vocCoeff.value, v.module.vocCoeff.unit, v.module.vocV);
      if (!(pct >= -1 && pct <= 0)) {
        ctx.addIssue({ code: "custom", path: ["module", "vocCoeff"], message: `${v.module.vocCoeff.value} ${v.module.vocCoeff.unit} is ${pct.toFixed(3)} %/°C of a ${v.module.vocV} V Voc; expected between −1 and 0 %/°C` });
      }
    }
    if (v.highestTempC <= v.lowestTempC) ctx.addIssue({ code: "custom", path: ["highestTempC"], message: "must be above lowestTempC" });
  });
export type StringCheckInput = z.input<typeof stringCheckInputSchema>;

export type CheckStatus = "pass" | "warn" | "fail";

export type CheckLine = {
  id: "max-voltage" | "code-voltage-limit" | "mppt-low" | "mppt-high" | "max-current" | "inverter-current" | "conductor";
  status: CheckStatus;
  /** The computed figure and the limit it is compared with. */
  value: number;
  limit: number | null;
  unit: "V" | "A";
  rule: string;
  detail: string;
};

export type StringCheckResult = {
  status: CheckStatus;
  checks: CheckLine[];
  /** Corrected Voc of one module at the lowest temperature, V. */
  moduleVocMaxV: number;
  stringVocMaxV: number;
  method: "coefficient" | "table-690.7(A)";
  correctionFactor: number;
  hotCellTempC: number;
  stringVmpHotV: number;
  stringVmpColdV: number;
  maxCircuitCurrentA: number;
  requiredConductorAmpacityA: number;
  notes: string[];
  caution: string;
};

const round = (x: number, digits: number) => Math.round(x * 10 ** digits) / 10 ** digits;

/** NEC 690.7 voltage limits and the MPPT window (design practice), one line each. */
function voltageChecks(x: {
  v: z.output<typeof stringCheckInputSchema>;
  mod: { vocV: number; vmpV: number; vocCoeffPctPerC?: number };
  n: number;
  factor: number;
  method: StringCheckResult["method"];
  stringVocMax: number;
  stringVmpHot: number;
  stringVmpCold: number;
  hotCell: number;
}): CheckLine[] {
  const { v, mod, n, factor, method, stringVocMax, stringVmpHot, stringVmpCold, hotCell } = x;
  const inv = v.inverter;
  const checks: CheckLine[] = [];
  const volts = (x: number) => `${round(x, 2)} V`;
  const factorText = method === "coefficient" ? `(1 + (${v.lowestTempC} − 25) × ${mod.vocCoeffPctPerC} %) = ${round(factor, 5)} →` : `Table 690.7(A) factor ${factor} →`;
  checks.push({
    id: "max-voltage",
    status: stringVocMax <= inv.maxDcInputV ? "pass" : "fail",
    value: round(stringVocMax, 2),
    limit: inv.maxDcInputV,
    unit: "V",
    rule: "NEC 690.7(A); inverter maximum DC input voltage",
    detail: `${n} × ${mod.vocV} V × ${factorText} ${volts(stringVocMax)} against the inverter's ${inv.maxDcInputV} V`,
  });
  checks.push({
    id: "code-voltage-limit",
    status: stringVocMax <= v.systemVoltageLimitV ? "pass" : "fail",
    value: round(stringVocMax, 2),
    limit: v.systemVoltageLimitV,
    unit: "V",
    rule: v.systemVoltageLimitV === DWELLING_MAX_SYSTEM_VOLTAGE ? "NEC 690.7: 600 V for one- and two-family dwellings" : "NEC 690.7 maximum PV system voltage",
    detail: `${volts(stringVocMax)} against ${v.systemVoltageLimitV} V`,
  });
  checks.push({
    id: "mppt-low",
    status: stringVmpHot >= inv.mpptMinV ? "pass" : "warn",
    value: round(stringVmpHot, 2),
    limit: inv.mpptMinV,
    unit: "V",
    rule: "design practice: Vmp at a hot cell stays in the MPPT window",
    detail: `Vmp ${n} × ${mod.vmpV} V at ${round(hotCell, 1)} °C cell = ${volts(stringVmpHot)} against the MPPT minimum ${inv.mpptMinV} V`,
  });
  checks.push({
    id: "mppt-high",
    status: stringVmpCold <= inv.mpptMaxV ? "pass" : "warn",
    value: round(stringVmpCold, 2),
    limit: inv.mpptMaxV,
    unit: "V",
    rule: "design practice: Vmp at the cold extreme stays in the MPPT window",
    detail: `Vmp at ${Math.min(STC_TEMP_C, v.lowestTempC)} °C = ${volts(stringVmpCold)} against the MPPT maximum ${inv.mpptMaxV} V`,
  });
  return checks;
}

/**
 * NEC 690.7(A)(1) with the coefficient, else (A)(2) with the table. Above 25 °C the coefficient
 * would lower Voc; the code maximum is never taken below STC Voc.
 */
function vocCorrection(vocCoeffPctPerC: number | undefined, lowestTempC: number, notes: string[]): { factor: number; method: StringCheckResult["method"] } {
  if (vocCoeffPctPerC !== undefined) return { factor: Math.max(1, 1 + ((lowestTempC - STC_TEMP_C) * vocCoeffPctPerC) / 100), method: "coefficient" };
  const tableFactor = table690_7AFactor(lowestTempC);
  if (tableFactor === null) {
    throw new EngineInputError(
      [{ path: "module.vocCoeffPctPerC", message: `NEC Table 690.7(A) stops at −40 °C; a Voc coefficient is needed for ${lowestTempC} °C` }],
      "string check",
    );
  }
  notes.push("No Voc temperature coefficient given: used the NEC Table 690.7(A) factor (crystalline silicon).");
  return { factor: Math.max(1, tableFactor), method: "table-690.7(A)" };
}

/** Run the string check. Voltages are rounded to 0.01 V and currents to 0.01 A in the output. */
export function checkString(input: StringCheckInput): StringCheckResult {
  const v = parseOrThrow(stringCheckInputSchema, input, "string check");
  const { inverter: inv } = v;
  const mod = { ...v.module, vocCoeffPctPerC: v.module.vocCoeffPctPerC ?? (v.module.vocCoeff && vocCoefficientPctPerC(v.module.vocCoeff.value, v.module.vocCoeff.unit, v.module.vocV)) };
  const n = v.modulesInSeries;
  const notes: string[] = [];

  const { factor, method } = vocCorrection(mod.vocCoeffPctPerC, v.lowestTempC, notes);
  const moduleVocMax = mod.vocV * factor;
  const stringVocMax = moduleVocMax * n;

  const vmpCoeff = mod.vmpCoeffPctPerC ?? mod.vocCoeffPctPerC ?? DEFAULT_VMP_COEFF_PCT_PER_C;
  if (mod.vmpCoeffPctPerC === undefined) {
    notes.push(
      mod.vocCoeffPctPerC !== undefined
        ? "No Vmp coefficient given: the Voc coefficient was used for Vmp (Vmp usually falls faster with heat)."
        : `No temperature coefficients given: Vmp used ${DEFAULT_VMP_COEFF_PCT_PER_C} %/°C.`,
    );
  }
  const noct = mod.noctC ?? DEFAULT_NOCT_C;
  const hotCell = v.hotCellTempC ?? v.highestTempC + ((noct - NOCT_AIR_C) * HOT_CELL_IRRADIANCE) / NOCT_IRRADIANCE;
  const vmpAt = (cellC: number) => mod.vmpV * n * (1 + ((cellC - STC_TEMP_C) * vmpCoeff) / 100);
  const stringVmpHot = vmpAt(hotCell);
  // Cold and bright: the cell sits near ambient; the highest Vmp the MPPT must follow.
  const stringVmpCold = vmpAt(Math.min(STC_TEMP_C, v.lowestTempC));

  const maxCurrent = mod.iscA * v.stringsInParallel * NEC_690_8_A_FACTOR;
  const conductorAmps = mod.iscA * NEC_690_8_A_FACTOR * NEC_690_8_B_FACTOR;

  const checks: CheckLine[] = voltageChecks({ v, mod, n, factor, method, stringVocMax, stringVmpHot, stringVmpCold, hotCell });
  checks.push(maxCurrentCheck(mod, v.stringsInParallel, maxCurrent));
  if (inv.maxInputIscA !== undefined) {
    const isc = mod.iscA * v.stringsInParallel;
    checks.push({
      id: "inverter-current",
      status: isc <= inv.maxInputIscA ? "pass" : "fail",
      value: round(isc, 2),
      limit: inv.maxInputIscA,
      unit: "A",
      rule: "inverter maximum input short-circuit current (manufacturer's rating)",
      detail: `${v.stringsInParallel} × ${mod.iscA} A = ${round(isc, 2)} A against ${inv.maxInputIscA} A`,
    });
  }
  checks.push(conductorCheck(mod.iscA, v.conductorTableAmpacityA, v.conductorAmpacityA));

  const status: CheckStatus = checks.some((c) => c.status === "fail") ? "fail" : checks.some((c) => c.status === "warn") ? "warn" : "pass";
  return {
    status,
    checks,
    moduleVocMaxV: round(moduleVocMax, 4),
    stringVocMaxV: round(stringVocMax, 2),
    method,
    correctionFactor: factor,
    hotCellTempC: round(hotCell, 2),
    stringVmpHotV: round(stringVmpHot, 2),
    stringVmpColdV: round(stringVmpCold, 2),
    maxCircuitCurrentA: round(maxCurrent, 2),
    requiredConductorAmpacityA: round(conductorAmps, 2),
    notes,
    caution: CAUTION,
  };
}

/** NEC 690.8(A)(1) current, and the back-feed into one faulted string against the module's fuse rating (690.9(A)). */
function maxCurrentCheck(mod: { iscA: number; maxSeriesFuseA?: number }, parallel: number, maxCurrent: number): CheckLine {
  const line = { id: "max-current" as const, value: round(maxCurrent, 2), unit: "A" as const };
  const perString = mod.iscA * NEC_690_8_A_FACTOR;
  if (parallel === 1) {
    return { ...line, status: "pass", limit: null, rule: "NEC 690.8(A)(1): Isc × 1.25", detail: `one string: ${mod.iscA} A × 1.25 = ${round(perString, 2)} A; no other string can feed it` };
  }
  const backFeed = (parallel - 1) * perString;
  if (mod.maxSeriesFuseA === undefined) {
    return {
      ...line,
      status: "warn",
      limit: null,
      rule: "NEC 690.8(A)(1) and 690.9(A)",
      detail: `${parallel} strings in parallel can feed ${round(backFeed, 2)} A into one faulted string; the module's maximum series fuse rating is not in the catalog, so whether string fuses are needed is not known`,
    };
  }
  return {
    ...line,
    status: backFeed <= mod.maxSeriesFuseA ? "pass" : "fail",
    limit: mod.maxSeriesFuseA,
    rule: "NEC 690.8(A)(1) and 690.9(A): back-feed into a string ≤ the module's maximum series fuse rating",
    detail: `(${parallel} − 1) × ${mod.iscA} A × 1.25 = ${round(backFeed, 2)} A against the module's ${mod.maxSeriesFuseA} A series fuse rating${backFeed > mod.maxSeriesFuseA ? ": each string needs its own fuse" : ""}`,
  };
}

/** NEC 690.8(B): the larger of 125 % of the 690.8(A) current before correction and adjustment, and the 690.8(A) current after them. */
function conductorCheck(iscA: number, tableAmpacityA: number | undefined, adjustedAmpacityA: number | undefined): CheckLine {
  const maxCurrent = iscA * NEC_690_8_A_FACTOR;
  const unadjustedNeed = maxCurrent * NEC_690_8_B_FACTOR;
  const shortOf = [
    ...(tableAmpacityA !== undefined && tableAmpacityA < unadjustedNeed ? [`the table ampacity ${tableAmpacityA} A is below ${round(unadjustedNeed, 2)} A (690.8(B)(1))`] : []),
    ...(adjustedAmpacityA !== undefined && adjustedAmpacityA < maxCurrent ? [`the corrected and adjusted ampacity ${adjustedAmpacityA} A is below ${round(maxCurrent, 2)} A (690.8(B)(2))`] : []),
  ];
  const given = tableAmpacityA !== undefined || adjustedAmpacityA !== undefined;
  return {
    id: "conductor",
    status: shortOf.length > 0 ? "fail" : "pass",
    value: round(unadjustedNeed, 2),
    limit: tableAmpacityA ?? null,
    unit: "A",
    rule: "NEC 690.8(B): ampacity ≥ 125 % of the 690.8(A) current before correction and adjustment (Isc × 1.56), and ≥ the 690.8(A) current after them (Isc × 1.25)",
    detail: !given
      ? `each string conductor needs at least ${round(unadjustedNeed, 2)} A from the ampacity table (${iscA} A × 1.56) and at least ${round(maxCurrent, 2)} A after correction and adjustment (${iscA} A × 1.25)`
      : shortOf.length > 0
        ? shortOf.join("; ")
        : `${iscA} A × 1.56 = ${round(unadjustedNeed, 2)} A before and ${iscA} A × 1.25 = ${round(maxCurrent, 2)} A after correction and adjustment: met`,
  };
}

/** Longest series string whose cold Voc stays within both the inverter and the code limit (0 when none fits). */
export function maxModulesInSeries(input: Omit<StringCheckInput, "modulesInSeries">): number {
  let best = 0;
  for (let n = 1; n <= 100; n++) {
    const result = checkString({ ...input, modulesInSeries: n });
    if (result.checks.some((c) => (c.id === "max-voltage" || c.id === "code-voltage-limit") && c.status === "fail")) break;
    best = n;
  }
  return best;
}
