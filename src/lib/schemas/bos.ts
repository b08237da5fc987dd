// Balance-of-system parts in the catalog (table bos_part): racking, attachments, clamps,
// module-level electronics, boxes, disconnects, overcurrent devices, conductors, conduit and
// labels. One part = a kind and that kind's own fields (a zod discriminated union), shared by the
// catalog screen, the route handlers and the CSV import. Ranges catch typing slips; they do not
// replace the maker's documents.
import { z } from "zod";
import { plainText } from "@/lib/schemas/text";
import type { CsvColumn } from "@/lib/schemas/catalog";

export const BOS_KINDS = ["rail", "splice", "attachment", "mid_clamp", "end_clamp", "mlpe", "combiner", "disconnect", "breaker", "fuse", "conductor", "conduit", "label"] as const;
export type BosKind = (typeof BOS_KINDS)[number];
export const BOS_KIND_LABELS: Record<BosKind, string> = {
  rail: "Racking rail",
  splice: "Rail splice",
  attachment: "Roof attachment",
  mid_clamp: "Mid clamp",
  end_clamp: "End clamp",
  mlpe: "Module-level electronics",
  combiner: "Combiner / junction box",
  disconnect: "Disconnect",
  breaker: "Breaker",
  fuse: "Fuse",
  conductor: "Conductor",
  conduit: "Conduit",
  label: "Label",
};

export const MLPE_FUNCTIONS = ["rapid_shutdown", "optimizer"] as const;
export const MLPE_FUNCTION_LABELS: Record<(typeof MLPE_FUNCTIONS)[number], string> = { rapid_shutdown: "Rapid-shutdown device", optimizer: "Optimizer (with rapid shutdown)" };
export const CONDUCTOR_MATERIALS = ["cu", "al"] as const;
export const CONDUCTOR_MATERIAL_LABELS: Record<(typeof CONDUCTOR_MATERIALS)[number], string> = { cu: "Copper", al: "Aluminium" };
/** Insulation types by their NEC Table 310.4(A) / 690.31 names. */
export const INSULATIONS = ["pv_wire", "use_2", "thwn_2", "xhhw_2"] as const;
export const INSULATION_LABELS: Record<(typeof INSULATIONS)[number], string> = { pv_wire: "PV wire", use_2: "USE-2", thwn_2: "THWN-2", xhhw_2: "XHHW-2" };
/** AWG / kcmil sizes a residential job uses (NEC Chapter 9 Table 8 names). */
export const CONDUCTOR_SIZES = ["14", "12", "10", "8", "6", "4", "3", "2", "1", "1/0", "2/0", "3/0", "4/0"] as const;
export const CONDUIT_TYPES = ["emt", "pvc", "fmc", "lfmc"] as const;
export const CONDUIT_TYPE_LABELS: Record<(typeof CONDUIT_TYPES)[number], string> = { emt: "EMT", pvc: "PVC (Schedule 40/80)", fmc: "Flexible metal", lfmc: "Liquidtight flexible metal" };
/** Trade sizes, inches (NEC Chapter 9 Table 4 names). */
export const CONDUIT_SIZES = ["1/2", "3/4", "1", "1-1/4", "1-1/2", "2"] as const;
export const LABEL_PURPOSES = ["rapid_shutdown", "dc_source", "ac_disconnect", "backfed_breaker", "conduit_marking", "directory"] as const;
export const LABEL_PURPOSE_LABELS: Record<(typeof LABEL_PURPOSES)[number], string> = {
  rapid_shutdown: "Rapid-shutdown sign",
  dc_source: "PV DC source marking",
  ac_disconnect: "PV system disconnect",
  backfed_breaker: "Backfed breaker / interconnection",
  conduit_marking: "Raceway marking (repeats along conduit)",
  directory: "Plaque / directory of power sources",
};

const int = (what: string, min: number, max: number, unit = "") =>
  z
    .number({ error: `Enter ${what} as a number${unit ? ` (${unit})` : ""}` })
    .int(`${what} must be a whole number`)
    .min(min, `${what} must be at least ${min}${unit ? ` ${unit}` : ""}`)
    .max(max, `${what} must be at most ${max}${unit ? ` ${unit}` : ""}`);

const enumOf = <T extends readonly [string, ...string[]]>(what: string, values: T) => z.enum(values, { error: `${what} must be one of: ${values.join(", ")}` });

/** A list of whole numbers typed as "4200 5300" (CSV, form) or sent as an array. */
const numberList = z.union([
  z.array(z.number()),
  z.string().transform((s) => s.split(/[\s;|,]+/).filter(Boolean).map(Number)),
]);

/** One row of a maker's span table: the largest attachment spacing allowed up to this wind speed and ground snow load. */
export const spanRowSchema = z.object({
  windMph: int("Wind speed", 85, 200, "mph"),
  snowPsf: int("Ground snow load", 0, 150, "psf"),
  maxSpanMm: int("Maximum span", 300, 3000, "mm"),
});
export type SpanRow = z.output<typeof spanRowSchema>;

const SPAN_ROW_TEXT = /^(\d+)\/(\d+):(\d+)$/;
/** The span table typed as "110/0:1830 110/30:1520" (wind mph / snow psf : span mm), or sent as rows. */
const spanTableField = z.preprocess((v, ctx) => {
  if (typeof v !== "string") return v;
  const out: unknown[] = [];
  for (const cell of v.split(/[\s;|]+/).filter(Boolean)) {
    const m = SPAN_ROW_TEXT.exec(cell);
    if (!m) {
      ctx.addIssue({ code: "custom", message: `Span table entry "${cell}" must read wind/snow:span, e.g. 110/30:1520`, input: v });
      return v;
    }
    out.push({ windMph: Number(m[1]), snowPsf: Number(m[2]), maxSpanMm: Number(m[3]) });
  }
  return out;
}, z.array(spanRowSchema).min(1, "Give at least one span table row (wind/snow:span)").max(40, "At most 40 span table rows"));

/** The span table as one line of text (CSV cell, form field). */
export const spanTableText = (rows: SpanRow[]) => rows.map((r) => `${r.windMph}/${r.snowPsf}:${r.maxSpanMm}`).join(" ");

const ampRating = (what: string) => int(what, 1, 800, "A");
const voltRating = int("Maximum voltage", 30, 1500, "V");

/** Each kind's own fields (stored in bos_part.details). */
export const bosDetailsSchema = z.discriminatedUnion(
  "kind",
  [
    z.object({
      kind: z.literal("rail"),
      /** Lengths the rail is sold in, mm. */
      stockLengthsMm: numberList.pipe(z.array(int("Stock length", 500, 8000, "mm")).min(1, "Give at least one stock length").max(6, "At most 6 stock lengths")),
      /** The maker's span table for this rail: wind speed / ground snow → largest attachment spacing. */
      spanTable: spanTableField,
    }),
    z.object({ kind: z.literal("splice") }),
    z.object({ kind: z.literal("attachment") }),
    z.object({ kind: z.literal("mid_clamp") }),
    z.object({ kind: z.literal("end_clamp") }),
    z.object({ kind: z.literal("mlpe"), mlpeFunction: enumOf("Function", MLPE_FUNCTIONS), modulesPerUnit: int("Modules per unit", 1, 4) }),
    z.object({ kind: z.literal("combiner"), inputs: int("Inputs", 1, 24), ratingA: ampRating("Rating") }),
    z.object({ kind: z.literal("disconnect"), ratingA: ampRating("Rating"), maxVoltageV: voltRating, fusible: z.boolean({ error: "Fusible must be true or false" }) }),
    z.object({ kind: z.literal("breaker"), ratingA: ampRating("Rating"), poles: int("Poles", 1, 3) }),
    z.object({ kind: z.literal("fuse"), ratingA: ampRating("Rating"), maxVoltageV: voltRating }),
    z.object({
      kind: z.literal("conductor"),
      material: enumOf("Material", CONDUCTOR_MATERIALS),
      insulation: enumOf("Insulation", INSULATIONS),
      sizeAwg: enumOf("Size", CONDUCTOR_SIZES),
    }),
    z.object({ kind: z.literal("conduit"), conduitType: enumOf("Conduit type", CONDUIT_TYPES), tradeSize: enumOf("Trade size", CONDUIT_SIZES) }),
    z.object({ kind: z.literal("label"), purpose: enumOf("Purpose", LABEL_PURPOSES) }),
  ],
  { error: `Kind must be one of: ${BOS_KINDS.join(", ")}` },
);
export type BosDetails = z.output<typeof bosDetailsSchema>;

/** Names as printed by the maker; they start with a letter or digit (no spreadsheet formula in an export). */
const name = (field: string) =>
  plainText({ error: `Enter the ${field}` })
    .trim()
    .min(1, `Enter the ${field}`)
    .max(100, `Keep the ${field} under 100 characters`)
    .regex(/^[\p{L}\p{N}]/u, `The ${field} must start with a letter or a digit`);

/** A part as the form, the routes and the CSV import give it. */
export const bosPartSchema = z.object({
  manufacturer: name("manufacturer"),
  model: name("model"),
  /** The price book's line item that prices one unit of this part (optional). */
  priceLineItemId: z
    .string()
    .trim()
    .max(40, "Keep the price line item id under 40 characters")
    .nullish()
    .transform((v) => (v ? v : null)),
  details: bosDetailsSchema,
});
export type BosPartInput = z.input<typeof bosPartSchema>;
export type BosPartValues = z.output<typeof bosPartSchema>;

export const bosPatchSchema = z.object({ active: z.boolean({ error: "Active must be true or false" }) }).strict();

// ── CSV ──────────────────────────────────────────────────────────────────────────────

/** Kind-specific columns: a row fills only its own kind's (others stay empty). */
export const BOS_KIND_FIELDS: Record<BosKind, readonly string[]> = {
  rail: ["stockLengthsMm", "spanTable"],
  splice: [],
  attachment: [],
  mid_clamp: [],
  end_clamp: [],
  mlpe: ["mlpeFunction", "modulesPerUnit"],
  combiner: ["inputs", "ratingA"],
  disconnect: ["ratingA", "maxVoltageV", "fusible"],
  breaker: ["ratingA", "poles"],
  fuse: ["ratingA", "maxVoltageV"],
  conductor: ["material", "insulation", "sizeAwg"],
  conduit: ["conduitType", "tradeSize"],
  label: ["purpose"],
};

export const BOS_CSV_COLUMNS: readonly CsvColumn[] = [
  { name: "manufacturer", field: "manufacturer", type: "text", required: true, meaning: "Manufacturer as on the maker's sheet" },
  { name: "model", field: "model", type: "text", required: true, meaning: "Model or part number; with the manufacturer it identifies the row (an existing pair is updated)" },
  { name: "kind", field: "kind", type: "enum", required: true, meaning: BOS_KINDS.join(" | ") },
  { name: "price_line_item", field: "priceLineItemId", type: "text", required: false, meaning: "Id of the price book line item that prices one unit; may be empty" },
  { name: "stock_lengths_mm", field: "stockLengthsMm", type: "text", required: false, meaning: "Rail only: stock lengths, mm, separated by spaces (e.g. 4200 5300)" },
  { name: "span_table", field: "spanTable", type: "text", required: false, meaning: "Rail only: the maker's span table, entries wind mph/snow psf:span mm separated by spaces (e.g. 110/0:1830 110/30:1520)" },
  { name: "mlpe_function", field: "mlpeFunction", type: "enum", required: false, meaning: `Module-level electronics only: ${MLPE_FUNCTIONS.join(" | ")}` },
  { name: "modules_per_unit", field: "modulesPerUnit", type: "integer", required: false, meaning: "Module-level electronics only: modules one unit serves" },
  { name: "inputs", field: "inputs", type: "integer", required: false, meaning: "Combiner only: circuit inputs" },
  { name: "rating_a", field: "ratingA", type: "integer", required: false, meaning: "Combiner, disconnect, breaker, fuse: current rating, A" },
  { name: "max_voltage_v", field: "maxVoltageV", type: "integer", required: false, meaning: "Disconnect, fuse: maximum voltage, V" },
  { name: "fusible", field: "fusible", type: "text", required: false, meaning: "Disconnect only: true or false" },
  { name: "poles", field: "poles", type: "integer", required: false, meaning: "Breaker only: poles (1–3)" },
  { name: "material", field: "material", type: "enum", required: false, meaning: `Conductor only: ${CONDUCTOR_MATERIALS.join(" | ")}` },
  { name: "insulation", field: "insulation", type: "enum", required: false, meaning: `Conductor only: ${INSULATIONS.join(" | ")}` },
  { name: "size_awg", field: "sizeAwg", type: "text", required: false, meaning: `Conductor only: ${CONDUCTOR_SIZES.join(" | ")}` },
  { name: "conduit_type", field: "conduitType", type: "enum", required: false, meaning: `Conduit only: ${CONDUIT_TYPES.join(" | ")}` },
  { name: "trade_size", field: "tradeSize", type: "text", required: false, meaning: `Conduit only: ${CONDUIT_SIZES.join(" | ")} (inches)` },
  { name: "purpose", field: "purpose", type: "enum", required: false, meaning: `Label only: ${LABEL_PURPOSES.join(" | ")}` },
  { name: "active", field: "active", type: "boolean", required: false, meaning: "true or false; empty keeps an existing row's status, new rows are active" },
];

/** A part as one flat CSV record (the export's shape). */
export function bosCsvRecord(p: BosPartValues & { active: boolean }): Record<string, unknown> {
  const d = p.details as Record<string, unknown>;
  const flat: Record<string, unknown> = { manufacturer: p.manufacturer, model: p.model, kind: p.details.kind, priceLineItemId: p.priceLineItemId, active: p.active };
  for (const f of BOS_KIND_FIELDS[p.details.kind]) flat[f] = d[f];
  if (p.details.kind === "rail") {
    flat.stockLengthsMm = p.details.stockLengthsMm.join(" ");
    flat.spanTable = spanTableText(p.details.spanTable);
  }
  return flat;
}

/** A flat CSV record as the part schema's input (fusible's words read as a boolean). */
export function bosInputOfRecord(flat: Record<string, unknown>): { input: BosPartInput; foreign: string[] } {
  const kind = typeof flat.kind === "string" ? flat.kind : "";
  const own = (BOS_KIND_FIELDS as Record<string, readonly string[] | undefined>)[kind] ?? [];
  const details: Record<string, unknown> = { kind };
  const foreign: string[] = [];
  for (const fields of Object.values(BOS_KIND_FIELDS)) {
    for (const f of fields) {
      const v = flat[f];
      if (v === undefined || v === null || v === "") continue;
      if (own.includes(f)) details[f] = f === "fusible" && typeof v === "string" ? ({ true: true, yes: true, false: false, no: false } as Record<string, boolean>)[v.toLowerCase()] ?? v : v;
      else if (!foreign.includes(f)) foreign.push(f);
    }
  }
  return { input: { manufacturer: flat.manufacturer as string, model: flat.model as string, priceLineItemId: flat.priceLineItemId as string | null, details: details as BosPartInput["details"] }, foreign };
}
