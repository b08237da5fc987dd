// Input schemas for the equipment catalog (modules and inverters), shared by the admin
// forms (zodResolver), the route handlers, the server actions and the CSV import. The
// physical checks catch typing slips in datasheet values; they are sanity ranges, not a
// replacement for the datasheet.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import { CELL_TECHNOLOGIES, VOC_COEFF_UNIT_KEYS } from "@/lib/enums";
import { COEFFICIENT_UNITS, vocCoefficientPctPerC, type CoefficientUnit } from "@/engine/module-coefficients";

export { COEFFICIENT_UNITS, type CoefficientUnit };

/** The stored key of each Voc coefficient unit (the column keeps ASCII). */
export const VOC_COEFF_UNIT_KEY: Record<CoefficientUnit, (typeof VOC_COEFF_UNIT_KEYS)[number]> = { "%/°C": "pct_per_c", "mV/°C": "mv_per_c", "V/°C": "v_per_c" };
export const VOC_COEFF_UNIT_OF_KEY = Object.fromEntries(Object.entries(VOC_COEFF_UNIT_KEY).map(([unit, key]) => [key, unit])) as Record<(typeof VOC_COEFF_UNIT_KEYS)[number], CoefficientUnit>;

export { CELL_TECHNOLOGIES };
export type CellTechnology = (typeof CELL_TECHNOLOGIES)[number];

export const CELL_TECHNOLOGY_LABELS: Record<CellTechnology, string> = {
  mono_perc: "Mono PERC",
  topcon: "TOPCon",
  heterojunction: "Heterojunction",
  back_contact: "Back contact",
  polycrystalline: "Polycrystalline",
  thin_film_cdte: "Thin film (CdTe)",
  thin_film_cigs: "Thin film (CIGS)",
};

export const CONSTRUCTIONS = ["glass_glass", "glass_backsheet"] as const;
export type Construction = (typeof CONSTRUCTIONS)[number];
export const CONSTRUCTION_LABELS: Record<Construction, string> = {
  glass_glass: "Glass-glass",
  glass_backsheet: "Glass-backsheet",
};

export const INVERTER_KINDS = ["string", "micro"] as const;
export type InverterKind = (typeof INVERTER_KINDS)[number];
export const INVERTER_KIND_LABELS: Record<InverterKind, string> = { string: "String", micro: "Micro" };

/**
 * Vmp × Imp may differ from the rated STC watts by this fraction: datasheets round each of
 * the three figures and state a power tolerance, so a small gap is normal. Accepting ±3 %
 * is common practice when checking datasheet entries, not a standard.
 */
export const MPP_POWER_TOLERANCE = 0.03;
/** Irradiance at standard test conditions, W/m² (IEC 60904-3). */
const STC_IRRADIANCE_W_PER_M2 = 1000;
/**
 * Plausible module efficiency range at STC, %: commercial flat-plate modules sit far inside
 * it (thin film from about 10 %, the best silicon modules near 24 %). Outside it, a length,
 * width or wattage is almost certainly mistyped.
 */
export const MODULE_EFFICIENCY_RANGE_PCT = { min: 5, max: 26 } as const;

/** Plausible ranges; each message names the field and its unit. */
export const MODULE_LIMITS = {
  stcWatts: { min: 20, max: 1000, label: "STC watts", unit: "W" },
  vocV: { min: 5, max: 120, label: "Voc", unit: "V" },
  iscA: { min: 0.5, max: 30, label: "Isc", unit: "A" },
  vmpV: { min: 5, max: 120, label: "Vmp", unit: "V" },
  impA: { min: 0.5, max: 30, label: "Imp", unit: "A" },
  // Crystalline silicon datasheets show about −0.25 to −0.50 %/°C for Pmax and −0.22 to
  // −0.35 %/°C for Voc; thin film is flatter. The ranges leave room on both sides.
  gammaPmaxPctPerC: { min: -0.7, max: -0.1, label: "Pmax temperature coefficient", unit: "%/°C" },
  betaVocPctPerC: { min: -0.6, max: -0.1, label: "Voc temperature coefficient", unit: "%/°C" },
  // Residential modules' datasheets show 15–35 A; the range leaves room on both sides.
  maxSeriesFuseA: { min: 1, max: 60, label: "Maximum series fuse rating", unit: "A" },
  lengthMm: { min: 300, max: 3000, label: "Length", unit: "mm" },
  widthMm: { min: 200, max: 1600, label: "Width", unit: "mm" },
} as const;

export const INVERTER_LIMITS = {
  acWatts: { min: 100, max: 100_000, label: "AC watts", unit: "W" },
  efficiencyPct: { min: 80, max: 99.9, label: "Efficiency", unit: "%" },
  maxDcVoltageV: { min: 50, max: 1500, label: "Max DC voltage", unit: "V" },
  mpptMinV: { min: 10, max: 1500, label: "MPPT minimum", unit: "V" },
  mpptMaxV: { min: 10, max: 1500, label: "MPPT maximum", unit: "V" },
  maxInputCurrentA: { min: 1, max: 100, label: "Max input current", unit: "A" },
  mpptCount: { min: 1, max: 20, label: "MPPT count", unit: "" },
  dcInputMinV: { min: 5, max: 150, label: "DC input minimum", unit: "V" },
  dcInputMaxV: { min: 5, max: 150, label: "DC input maximum", unit: "V" },
  modulesPerUnit: { min: 1, max: 8, label: "Modules per unit", unit: "" },
} as const;

type Limit = { min: number; max: number; label: string; unit: string };

const withUnit = (v: number, unit: string) => (unit ? `${v} ${unit}` : String(v));

/** A number within a plausible range; NaN (an empty form field) reads as "enter a number". */
export function measure(limit: Limit, opts: { integer?: boolean } = {}) {
  let s = z.number({ error: `Enter ${limit.label} as a number${limit.unit ? ` (${limit.unit})` : ""}` });
  if (opts.integer) s = s.int(`${limit.label} must be a whole number`);
  return s
    .min(limit.min, `${limit.label} must be at least ${withUnit(limit.min, limit.unit)}`)
    .max(limit.max, `${limit.label} must be at most ${withUnit(limit.max, limit.unit)}`);
}

/** Names as printed on datasheets; they start with a letter or digit (so an exported CSV never starts a cell with a spreadsheet formula). */
export function label(field: string, max = 100) {
  return plainText({ error: `Enter the ${field}` })
    .trim()
    .min(1, `Enter the ${field}`)
    .max(max, `Keep the ${field} under ${max} characters`)
    .regex(/^[\p{L}\p{N}]/u, `The ${field} must start with a letter or a digit`);
}

const encapsulant = z
  .string()
  .trim()
  .max(50, "Keep the encapsulant under 50 characters")
  .regex(/^($|[\p{L}\p{N}])/u, "The encapsulant must start with a letter or a digit")
  .nullish()
  .transform((v) => (v ? v : null));

const moduleFields = z.object({
  manufacturer: label("manufacturer"),
  model: label("model"),
  stcWatts: measure(MODULE_LIMITS.stcWatts),
  vocV: measure(MODULE_LIMITS.vocV),
  iscA: measure(MODULE_LIMITS.iscA),
  vmpV: measure(MODULE_LIMITS.vmpV),
  impA: measure(MODULE_LIMITS.impA),
  gammaPmaxPctPerC: measure(MODULE_LIMITS.gammaPmaxPctPerC),
  /** The Voc coefficient in %/°C; optional when vocCoeff gives it in its datasheet unit. */
  betaVocPctPerC: measure(MODULE_LIMITS.betaVocPctPerC).optional(),
  /** The Voc coefficient as the datasheet prints it: %/°C, mV/°C or V/°C. */
  vocCoeff: z
    .object({
      value: z.number({ error: "Enter the Voc temperature coefficient as a number" }),
      unit: z.enum(COEFFICIENT_UNITS, { error: `The Voc coefficient's unit must be one of: ${COEFFICIENT_UNITS.join(", ")}` }),
    })
    .optional(),
  // An empty form field (NaN) or CSV cell means "not on the datasheet".
  maxSeriesFuseA: z.preprocess((v) => (typeof v === "number" && Number.isNaN(v) ? null : v), measure(MODULE_LIMITS.maxSeriesFuseA).nullish()).transform((v) => v ?? null),
  lengthMm: measure(MODULE_LIMITS.lengthMm, { integer: true }),
  widthMm: measure(MODULE_LIMITS.widthMm, { integer: true }),
  cellTechnology: z.enum(CELL_TECHNOLOGIES, { error: `Cell technology must be one of: ${CELL_TECHNOLOGIES.join(", ")}` }),
  construction: z.enum(CONSTRUCTIONS, { error: `Construction must be one of: ${CONSTRUCTIONS.join(", ")}` }),
  encapsulant,
});

const round1 = (v: number) => Math.round(v * 10) / 10;

/** The Voc coefficient in %/°C and as typed; null when none was given. */
function vocCoefficientOf(m: { vocV: number; betaVocPctPerC?: number; vocCoeff?: { value: number; unit: CoefficientUnit } }) {
  if (m.vocCoeff) return { pctPerC: vocCoefficientPctPerC(m.vocCoeff.value, m.vocCoeff.unit, m.vocV), typed: m.vocCoeff };
  if (m.betaVocPctPerC !== undefined) return { pctPerC: m.betaVocPctPerC, typed: { value: m.betaVocPctPerC, unit: "%/°C" as const } };
  return null;
}

function checkVocCoefficient(m: z.output<typeof moduleFields>, ctx: z.RefinementCtx) {
  const coeff = vocCoefficientOf(m);
  const path = ["vocCoeff", "value"];
  if (!coeff) return ctx.addIssue({ code: "custom", path, message: "Enter the Voc temperature coefficient with its unit" });
  const { min, max } = MODULE_LIMITS.betaVocPctPerC;
  if (m.vocCoeff && !(coeff.pctPerC >= min && coeff.pctPerC <= max)) {
    ctx.addIssue({
      code: "custom",
      path,
      message: `${m.vocCoeff.value} ${m.vocCoeff.unit} is ${round3(coeff.pctPerC)} %/°C of the ${m.vocV} V Voc; expected ${min} to ${max} %/°C (check the number and its unit)`,
    });
  }
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;

export const moduleModelSchema = moduleFields.superRefine((m, ctx) => {
  checkVocCoefficient(m, ctx);
  if (m.vmpV >= m.vocV) {
    ctx.addIssue({ code: "custom", path: ["vmpV"], message: `Vmp (${m.vmpV} V) must be below Voc (${m.vocV} V)` });
  }
  if (m.impA >= m.iscA) {
    ctx.addIssue({ code: "custom", path: ["impA"], message: `Imp (${m.impA} A) must be below Isc (${m.iscA} A)` });
  }
  const mppWatts = m.vmpV * m.impA;
  if (Math.abs(mppWatts - m.stcWatts) > MPP_POWER_TOLERANCE * m.stcWatts) {
    ctx.addIssue({
      code: "custom",
      path: ["stcWatts"],
      message: `STC watts (${m.stcWatts} W) and Vmp × Imp (${round1(mppWatts)} W) differ by more than ${MPP_POWER_TOLERANCE * 100} % (the usual tolerance for datasheet rounding)`,
    });
  }
  const areaM2 = (m.lengthMm / 1000) * (m.widthMm / 1000);
  const efficiencyPct = (m.stcWatts / (areaM2 * STC_IRRADIANCE_W_PER_M2)) * 100;
  if (efficiencyPct < MODULE_EFFICIENCY_RANGE_PCT.min || efficiencyPct > MODULE_EFFICIENCY_RANGE_PCT.max) {
    ctx.addIssue({
      code: "custom",
      path: ["lengthMm"],
      message: `Length × width gives a module efficiency of ${round1(efficiencyPct)} % at ${m.stcWatts} W; expected ${MODULE_EFFICIENCY_RANGE_PCT.min}–${MODULE_EFFICIENCY_RANGE_PCT.max} % (check length, width and STC watts)`,
    });
  }
}).transform((m) => {
  // Checked above: a coefficient is there. The engine's %/°C figure is kept beside the typed one.
  const coeff = vocCoefficientOf(m)!;
  return { ...m, betaVocPctPerC: Math.round(coeff.pctPerC * 1e5) / 1e5, vocCoeff: coeff.typed };
});
export type ModuleModelInput = z.input<typeof moduleModelSchema>;
export type ModuleModelValues = z.output<typeof moduleModelSchema>;

const inverterCommon = {
  manufacturer: label("manufacturer"),
  model: label("model"),
  acWatts: measure(INVERTER_LIMITS.acWatts),
  efficiencyPct: measure(INVERTER_LIMITS.efficiencyPct),
};

export const stringInverterSchema = z
  .object({
    kind: z.literal("string"),
    ...inverterCommon,
    maxDcVoltageV: measure(INVERTER_LIMITS.maxDcVoltageV),
    mpptMinV: measure(INVERTER_LIMITS.mpptMinV),
    mpptMaxV: measure(INVERTER_LIMITS.mpptMaxV),
    maxInputCurrentA: measure(INVERTER_LIMITS.maxInputCurrentA),
    mpptCount: measure(INVERTER_LIMITS.mpptCount, { integer: true }),
  })
  .superRefine((v, ctx) => {
    if (v.mpptMinV >= v.mpptMaxV) {
      ctx.addIssue({ code: "custom", path: ["mpptMinV"], message: `MPPT minimum (${v.mpptMinV} V) must be below the MPPT maximum (${v.mpptMaxV} V)` });
    }
    if (v.mpptMaxV > v.maxDcVoltageV) {
      ctx.addIssue({ code: "custom", path: ["mpptMaxV"], message: `MPPT maximum (${v.mpptMaxV} V) cannot exceed the max DC voltage (${v.maxDcVoltageV} V)` });
    }
  });

export const microInverterSchema = z
  .object({
    kind: z.literal("micro"),
    ...inverterCommon,
    acWatts: measure({ ...INVERTER_LIMITS.acWatts, max: 2000 }),
    dcInputMinV: measure(INVERTER_LIMITS.dcInputMinV),
    dcInputMaxV: measure(INVERTER_LIMITS.dcInputMaxV),
    modulesPerUnit: measure(INVERTER_LIMITS.modulesPerUnit, { integer: true }),
  })
  .superRefine((v, ctx) => {
    if (v.dcInputMinV >= v.dcInputMaxV) {
      ctx.addIssue({ code: "custom", path: ["dcInputMinV"], message: `DC input minimum (${v.dcInputMinV} V) must be below the DC input maximum (${v.dcInputMaxV} V)` });
    }
  });

export const inverterModelSchema = z.discriminatedUnion("kind", [stringInverterSchema, microInverterSchema], {
  error: "Kind must be string or micro",
});
export type InverterModelInput = z.input<typeof inverterModelSchema>;
export type InverterModelValues = z.output<typeof inverterModelSchema>;

/** Fields a partial update may carry; the merged record is then checked with the full schema. */
export const inverterPatchSchema = z
  .object({
    kind: z.enum(INVERTER_KINDS, { error: "Kind must be string or micro" }),
    manufacturer: z.string(),
    model: z.string(),
    acWatts: z.number(),
    efficiencyPct: z.number(),
    maxDcVoltageV: z.number().nullable(),
    mpptMinV: z.number().nullable(),
    mpptMaxV: z.number().nullable(),
    maxInputCurrentA: z.number().nullable(),
    mpptCount: z.number().nullable(),
    dcInputMinV: z.number().nullable(),
    dcInputMaxV: z.number().nullable(),
    modulesPerUnit: z.number().nullable(),
    active: z.boolean(),
  })
  .partial()
  .strict();

export const modulePatchSchema = z
  .object({
    manufacturer: z.string(),
    model: z.string(),
    stcWatts: z.number(),
    vocV: z.number(),
    iscA: z.number(),
    vmpV: z.number(),
    impA: z.number(),
    gammaPmaxPctPerC: z.number(),
    betaVocPctPerC: z.number(),
    vocCoeff: z.object({ value: z.number(), unit: z.string() }),
    maxSeriesFuseA: z.number().nullable(),
    lengthMm: z.number(),
    widthMm: z.number(),
    cellTechnology: z.string(),
    construction: z.string(),
    encapsulant: z.string().nullable(),
    active: z.boolean(),
  })
  .partial()
  .strict();

// ── CSV ──────────────────────────────────────────────────────────────────────────────

export const IMPORT_MODES = ["all_or_nothing", "good_rows"] as const;
export type ImportMode = (typeof IMPORT_MODES)[number];
export const importModeSchema = z.enum(IMPORT_MODES, { error: "Mode must be all_or_nothing or good_rows" });

/** Largest CSV file the import takes, bytes, and most data rows. */
export const CSV_MAX_BYTES = 1_000_000;
export const CSV_MAX_ROWS = 2_000;

export type CsvColumn = {
  /** Our column name in the file. */
  name: string;
  /** The schema field it fills. */
  field: string;
  /** coefficient: a number with its unit, "-0.26 %/°C", "-104 mV/°C", "-0.104 V/K" (a bare number is %/°C). */
  type: "text" | "number" | "integer" | "enum" | "boolean" | "coefficient";
  required: boolean;
  meaning: string;
};

export const MODULE_CSV_COLUMNS: readonly CsvColumn[] = [
  { name: "manufacturer", field: "manufacturer", type: "text", required: true, meaning: "Manufacturer as on the datasheet" },
  { name: "model", field: "model", type: "text", required: true, meaning: "Model name; with the manufacturer it identifies the row (an existing pair is updated)" },
  { name: "stc_watts", field: "stcWatts", type: "number", required: true, meaning: "Rated power at STC, W" },
  { name: "voc_v", field: "vocV", type: "number", required: true, meaning: "Open-circuit voltage at STC, V" },
  { name: "isc_a", field: "iscA", type: "number", required: true, meaning: "Short-circuit current at STC, A" },
  { name: "vmp_v", field: "vmpV", type: "number", required: true, meaning: "Voltage at maximum power, V (below Voc)" },
  { name: "imp_a", field: "impA", type: "number", required: true, meaning: "Current at maximum power, A (below Isc)" },
  { name: "gamma_pmax_pct_per_c", field: "gammaPmaxPctPerC", type: "number", required: true, meaning: "Temperature coefficient of Pmax, %/°C (negative, e.g. -0.30)" },
  { name: "beta_voc_pct_per_c", field: "betaVocPctPerC", type: "number", required: false, meaning: "Temperature coefficient of Voc, %/°C (negative, e.g. -0.25); may be empty when voc_coeff is given" },
  {
    name: "voc_coeff",
    field: "vocCoeff",
    type: "coefficient",
    required: false,
    meaning: "Temperature coefficient of Voc with its unit as the datasheet prints it: -0.26 %/°C, -104 mV/°C or -0.104 V/°C (/K reads as /°C; a bare number is %/°C); wins over beta_voc_pct_per_c",
  },
  { name: "max_series_fuse_a", field: "maxSeriesFuseA", type: "number", required: false, meaning: "Maximum series fuse rating, A (NEC 690.9(A)); may be empty" },
  { name: "length_mm", field: "lengthMm", type: "integer", required: true, meaning: "Module length, mm" },
  { name: "width_mm", field: "widthMm", type: "integer", required: true, meaning: "Module width, mm" },
  { name: "cell_technology", field: "cellTechnology", type: "enum", required: true, meaning: CELL_TECHNOLOGIES.join(" | ") },
  { name: "construction", field: "construction", type: "enum", required: true, meaning: CONSTRUCTIONS.join(" | ") },
  { name: "encapsulant", field: "encapsulant", type: "text", required: false, meaning: "Encapsulant (e.g. POE, EVA); may be empty" },
  { name: "active", field: "active", type: "boolean", required: false, meaning: "true or false; empty keeps an existing row's status, new rows are active" },
];

export const INVERTER_CSV_COLUMNS: readonly CsvColumn[] = [
  { name: "manufacturer", field: "manufacturer", type: "text", required: true, meaning: "Manufacturer as on the datasheet" },
  { name: "model", field: "model", type: "text", required: true, meaning: "Model name; with the manufacturer it identifies the row (an existing pair is updated)" },
  { name: "kind", field: "kind", type: "enum", required: true, meaning: "string | micro" },
  { name: "ac_watts", field: "acWatts", type: "number", required: true, meaning: "Rated AC output, W" },
  { name: "efficiency_pct", field: "efficiencyPct", type: "number", required: true, meaning: "Weighted efficiency, %" },
  { name: "max_dc_voltage_v", field: "maxDcVoltageV", type: "number", required: false, meaning: "String only: max DC input voltage, V" },
  { name: "mppt_min_v", field: "mpptMinV", type: "number", required: false, meaning: "String only: MPPT window minimum, V" },
  { name: "mppt_max_v", field: "mpptMaxV", type: "number", required: false, meaning: "String only: MPPT window maximum, V (≤ max DC voltage)" },
  { name: "max_input_current_a", field: "maxInputCurrentA", type: "number", required: false, meaning: "String only: max input current per MPPT, A" },
  { name: "mppt_count", field: "mpptCount", type: "integer", required: false, meaning: "String only: number of MPPT inputs" },
  { name: "dc_input_min_v", field: "dcInputMinV", type: "number", required: false, meaning: "Micro only: DC input range minimum, V" },
  { name: "dc_input_max_v", field: "dcInputMaxV", type: "number", required: false, meaning: "Micro only: DC input range maximum, V" },
  { name: "modules_per_unit", field: "modulesPerUnit", type: "integer", required: false, meaning: "Micro only: modules one unit takes" },
  { name: "active", field: "active", type: "boolean", required: false, meaning: "true or false; empty keeps an existing row's status, new rows are active" },
];

export const STRING_ONLY_FIELDS = ["maxDcVoltageV", "mpptMinV", "mpptMaxV", "maxInputCurrentA", "mpptCount"] as const;
export const MICRO_ONLY_FIELDS = ["dcInputMinV", "dcInputMaxV", "modulesPerUnit"] as const;

/** One problem in an uploaded CSV: its line in the file (the header is line 1) and column. */
export type CsvRowError = { line: number; column: string; message: string };

export type CsvImportReport = {
  mode: ImportMode;
  /** False when nothing was written (a bad row in all-or-nothing mode, or a bad file). */
  applied: boolean;
  rowsRead: number;
  created: { line: number; manufacturer: string; model: string }[];
  updated: { line: number; manufacturer: string; model: string }[];
  errors: CsvRowError[];
};
