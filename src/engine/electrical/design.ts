/**
 * The electrical design of a residential PV system and its NEC checks, from the equipment, the
 * string plan (string inverters) or the module count (microinverters), the service panel's
 * ratings and the wiring assumptions. Pure: the app maps a deal's design and household onto this
 * input (src/lib/electrical-design.ts); `npm run electrical` reads it from a JSON case file
 * (docs/electrical-case.md). Every figure's rule is named in its check line.
 */
import { z } from "zod";
import { parseOrThrow } from "../errors";
import { checkString, CAUTION, NEC_690_8_A_FACTOR, type StringCheckResult } from "../string-check";
import { sizeCircuit, type CheckStatus, type CircuitInput, type CircuitResult, type ElectricalCheck } from "./circuit";
import { emtSize, type ConduitResult } from "./conduit";
import { checkInterconnection, type InterconnectionResult } from "./interconnection";
import { CONDUCTOR_MATERIALS, NEC_EDITIONS, standardOcpdAtLeast, TEMP_COLUMNS, type TempColumn } from "./nec-tables";
import { checkRapidShutdown, MODULE_LEVEL_ELECTRONICS, requiredLabels, type ModuleLevelElectronics, type RequiredLabel } from "./rapid-shutdown";

/** Common-practice voltage-drop targets, % (not code limits: NEC 210.19(A) and 215.2(A) informational notes suggest 3 % / 5 % for branch circuits and feeders). */
export const DC_VOLTAGE_DROP_TARGET_PCT = 2;
export const TOTAL_VOLTAGE_DROP_TARGET_PCT = 3;
/** Wiring assumptions when the design does not give them (our choice, stated on every result). */
export const DEFAULT_WIRING = { dcRunFt: 60, acRunFt: 20, branchRunFt: 60, heightAboveRoofMm: 25, branchBreakerA: 20 } as const;
/** Hot design ambient when the string plan gives none, °C (our choice; use the site's 2 % design dry-bulb). */
export const DEFAULT_AMBIENT_C = 35;

/** A number field whose message names the field and its unit (the case file's reader sees it). */
const need = (what: string) => z.number({ error: (iss) => (iss.input === undefined ? `${what} is required` : `${what} must be a number`) }).finite();
const pos = z.number({ error: (iss) => (iss.input === undefined ? "is required" : "must be a number") }).finite().positive("must be above 0");
const column = z.union(TEMP_COLUMNS.map((c) => z.literal(c)) as [z.ZodLiteral<60>, z.ZodLiteral<75>, z.ZodLiteral<90>]);

export const electricalInputSchema = z
  .object({
    edition: z.enum(NEC_EDITIONS, { error: `edition must be one of ${NEC_EDITIONS.join(", ")}` }),
    module: z.object(
      {
      iscA: need("the module's short-circuit current Isc (A)").positive().max(50),
      impA: need("the module's current at maximum power Imp (A)").positive().max(50),
      vocV: need("the module's open-circuit voltage Voc (V)").positive().max(200),
      vmpV: need("the module's voltage at maximum power Vmp (V)").positive().max(200), vocCoeffPctPerC: z.number().min(-1).max(0).optional(), maxSeriesFuseA: pos.max(100).nullable().optional() },
      { error: "the module is required: { iscA, impA, vocV, vmpV } (docs/electrical-case.md)" },
    ),
    inverter: z.object({
      kind: z.enum(["string", "micro"], { error: 'inverter.kind must be "string" or "micro"' }),
      label: z.string().max(200).default("Inverter"),
      /** Rated AC output per unit, W. */
      acWatts: need("the inverter's rated AC output (W)").positive().max(100_000),
      /** Continuous output current per unit, A (data sheet); default acWatts ÷ service voltage. */
      continuousOutputA: pos.max(500).optional(),
      maxDcVoltageV: pos.max(1500).nullable().optional(),
      mpptMinV: pos.max(1500).nullable().optional(),
      mpptMaxV: pos.max(1500).nullable().optional(),
      maxInputIscA: pos.max(200).nullable().optional(),
      mpptCount: z.number().int().min(1).max(12).nullable().optional(),
      modulesPerUnit: z.number().int().min(1).max(8).nullable().optional(),
      /** Microinverters: the maker's most units on one branch circuit. */
      maxUnitsPerBranch: z.number().int().min(1).max(40).nullable().optional(),
    }, { error: "the inverter is required: { kind, acWatts, … } (docs/electrical-case.md)" }),
    inverterCount: z.number().int().min(1).max(20).default(1),
    moduleCount: need("the number of modules").int("the number of modules must be whole").min(1).max(1000),
    strings: z.object({ sizes: z.array(z.number().int().min(1).max(100)).max(60), lowestTempC: z.number().min(-70).max(40), highestTempC: z.number().min(-20).max(60) }).nullable().default(null),
    site: z.object({ serviceVoltageV: z.number().int().min(100).max(600).default(240), busbarA: pos.max(2000).nullable().default(null), mainBreakerA: pos.max(2000).nullable().default(null) }).default({ serviceVoltageV: 240, busbarA: null, mainBreakerA: null }),
    moduleLevelElectronics: z.enum(MODULE_LEVEL_ELECTRONICS).optional(),
    wiring: z
      .object({
        material: z.enum(CONDUCTOR_MATERIALS).default("cu"),
        insulationC: column.default(90),
        terminalC: column.default(75),
        dcRunFt: pos.max(2000).default(DEFAULT_WIRING.dcRunFt),
        acRunFt: pos.max(2000).default(DEFAULT_WIRING.acRunFt),
        branchRunFt: pos.max(2000).default(DEFAULT_WIRING.branchRunFt),
        heightAboveRoofMm: z.number().min(0).max(2000).nullable().default(DEFAULT_WIRING.heightAboveRoofMm),
        ambientC: z.number().min(-20).max(60).optional(),
        branchBreakerA: pos.max(60).default(DEFAULT_WIRING.branchBreakerA),
      })
      .prefault({}),
  })
  .superRefine((v, ctx) => {
    if (v.inverter.kind === "string" && v.strings && v.strings.sizes.reduce((s, n) => s + n, 0) > v.moduleCount) {
      ctx.addIssue({ code: "custom", path: ["strings", "sizes"], message: `the strings hold more modules than the system's ${v.moduleCount}` });
    }
  });
export type ElectricalInput = z.input<typeof electricalInputSchema>;
type Parsed = z.output<typeof electricalInputSchema>;

/** A sized circuit and its raceway (EMT by Chapter 9 fill; AC output circuits carry a neutral, our assumption). */
export type WiredCircuit = CircuitResult & { conduit: ConduitResult | null };

function withConduit(c: CircuitResult): WiredCircuit {
  if (!c.size || !c.egcSize) return { ...c, conduit: null };
  const neutral = c.id === "inverter-output" || c.id === "ac-combiner-output" ? 1 : 0;
  return { ...c, conduit: emtSize([{ size: c.size, count: c.currentCarrying + neutral }, { size: c.egcSize, count: 1 }]) };
}

export type ElectricalStatus = CheckStatus | "incomplete";

export type ElectricalDesign = {
  edition: Parsed["edition"];
  status: ElectricalStatus;
  /** Why the design cannot be checked yet (empty when it can). */
  missing: string[];
  kind: "string" | "micro";
  moduleLevelElectronics: ModuleLevelElectronics;
  inverterLabel: string;
  inverterUnits: number;
  moduleCount: number;
  strings: { size: number; count: number }[];
  /** Strings in parallel on the busiest MPPT input, and whether each string needs a fuse (690.9(A)). */
  stringsPerInput: number;
  stringFuseA: number | null;
  branches: { units: number; count: number }[];
  circuits: WiredCircuit[];
  stringChecks: StringCheckResult[];
  site: Parsed["site"];
  backfedBreakerA: number | null;
  interconnection: InterconnectionResult | null;
  totalVoltageDropPct: number | null;
  checks: ElectricalCheck[];
  labels: RequiredLabel[];
  rapidShutdownInitiator: string;
  assumptions: string[];
  notes: string[];
  caution: string;
};

const r2 = (x: number) => Math.round(x * 100) / 100;
const groups = (sizes: number[]) => [...sizes.reduce((m, n) => m.set(n, (m.get(n) ?? 0) + 1), new Map<number, number>())].map(([size, count]) => ({ size, count }));

function base(v: Parsed, ambientC: number): Pick<CircuitInput, "edition" | "material" | "insulationC" | "terminalC" | "ambientC"> {
  return { edition: v.edition, material: v.wiring.material, insulationC: v.wiring.insulationC as TempColumn, terminalC: v.wiring.terminalC as TempColumn, ambientC };
}

/** Inverter output (string) or AC combiner output: the circuit that lands on the back-fed breaker. */
function outputCircuit(v: Parsed, ambientC: number, id: string, name: string, currentA: number, vdTarget: number): CircuitResult {
  return sizeCircuit({
    ...base(v, ambientC),
    id,
    name,
    kind: "ac",
    maxCurrentA: currentA,
    operatingCurrentA: currentA,
    operatingVoltageV: v.site.serviceVoltageV,
    heightAboveRoofMm: null,
    currentCarrying: 2,
    ocpdRequired: true,
    lengthFt: v.wiring.acRunFt,
    voltageDropTargetPct: vdTarget,
  });
}

/** String inverter: source circuits per string size, inverter output circuit(s). */
function stringCircuits(v: Parsed, ambientC: number, strings: { size: number; count: number }[], unitA: number, notes: string[]) {
  const total = strings.reduce((s, g) => s + g.count, 0);
  const inputs = Math.max(1, (v.inverter.mpptCount ?? 1) * v.inverterCount);
  const perInput = Math.max(1, Math.ceil(total / inputs));
  const stringChecks = strings.map((g) =>
    checkString({
      module: { vocV: v.module.vocV, vmpV: v.module.vmpV, iscA: v.module.iscA, impA: v.module.impA, vocCoeffPctPerC: v.module.vocCoeffPctPerC, maxSeriesFuseA: v.module.maxSeriesFuseA ?? undefined },
      inverter: { maxDcInputV: v.inverter.maxDcVoltageV!, mpptMinV: v.inverter.mpptMinV!, mpptMaxV: v.inverter.mpptMaxV!, maxInputIscA: v.inverter.maxInputIscA ?? undefined },
      modulesInSeries: g.size,
      stringsInParallel: perInput,
      lowestTempC: v.strings!.lowestTempC,
      highestTempC: v.strings!.highestTempC,
    }),
  );
  // 690.9(A): strings need their own fuse when the others can feed more than the module's series fuse rating.
  const backFeed = (perInput - 1) * v.module.iscA * NEC_690_8_A_FACTOR;
  const fuseNeeded = perInput > 2 || (perInput === 2 && v.module.maxSeriesFuseA != null && backFeed > v.module.maxSeriesFuseA);
  if (perInput === 2 && v.module.maxSeriesFuseA == null) notes.push("Two strings share an MPPT input and the module's maximum series fuse rating is unknown: check 690.9(A) on the data sheet.");
  const circuits = strings.map((g) =>
    sizeCircuit({
      ...base(v, ambientC),
      id: `pv-source-${g.size}`,
      name: `PV source circuits: ${g.count} string${g.count > 1 ? "s" : ""} of ${g.size} modules, roof junction box to inverter`,
      kind: "dc",
      maxCurrentA: v.module.iscA * NEC_690_8_A_FACTOR,
      operatingCurrentA: v.module.impA,
      operatingVoltageV: v.module.vmpV * g.size,
      heightAboveRoofMm: v.wiring.heightAboveRoofMm,
      currentCarrying: 2 * total,
      ocpdRequired: fuseNeeded,
      lengthFt: v.wiring.dcRunFt,
      voltageDropTargetPct: DC_VOLTAGE_DROP_TARGET_PCT,
    }),
  );
  const fuseA = fuseNeeded ? (circuits[0]?.ocpdA ?? null) : null;
  const acTarget = TOTAL_VOLTAGE_DROP_TARGET_PCT - DC_VOLTAGE_DROP_TARGET_PCT;
  circuits.push(outputCircuit(v, ambientC, "inverter-output", v.inverterCount > 1 ? `Inverter output circuit (each of ${v.inverterCount}), inverter to AC combiner` : "Inverter output circuit, inverter to service panel", unitA, acTarget));
  if (v.inverterCount > 1) circuits.push(outputCircuit(v, ambientC, "ac-combiner-output", "AC combiner output circuit, to service panel", unitA * v.inverterCount, acTarget));
  return { circuits, stringChecks, perInput, fuseA };
}

/** Microinverters: AC branch circuits by the branch breaker (125 % of the units' current, 690.9 / 705.30), then the AC combiner output. */
function microCircuits(v: Parsed, ambientC: number, units: number, unitA: number, notes: string[]) {
  const byBreaker = Math.floor(v.wiring.branchBreakerA / (unitA * 1.25) + 1e-9);
  const maxPerBranch = Math.max(1, Math.min(byBreaker, v.inverter.maxUnitsPerBranch ?? byBreaker));
  const branchCount = Math.ceil(units / maxPerBranch);
  const small = Math.floor(units / branchCount);
  const big = units - small * branchCount;
  const branches = [{ units: small + 1, count: big }, { units: small, count: branchCount - big }].filter((b) => b.count > 0 && b.units > 0);
  notes.push(`Branch circuits on ${v.wiring.branchBreakerA} A breakers: at most ${maxPerBranch} units each (${v.wiring.branchBreakerA} A ÷ (${r2(unitA)} A × 1.25)${v.inverter.maxUnitsPerBranch ? `, maker's limit ${v.inverter.maxUnitsPerBranch}` : ""}).`);
  const circuits = branches.map((b) =>
    sizeCircuit({
      ...base(v, ambientC),
      id: `ac-branch-${b.units}`,
      name: `AC branch circuit${b.count > 1 ? `s: ${b.count} of` : ":"} ${b.units} microinverters, roof junction box to ${branchCount > 1 ? "AC combiner" : "service panel"}`,
      kind: "ac",
      maxCurrentA: unitA * b.units,
      operatingCurrentA: unitA * b.units,
      operatingVoltageV: v.site.serviceVoltageV,
      heightAboveRoofMm: v.wiring.heightAboveRoofMm,
      currentCarrying: 2 * branchCount,
      ocpdRequired: true,
      lengthFt: v.wiring.branchRunFt,
      voltageDropTargetPct: DC_VOLTAGE_DROP_TARGET_PCT,
    }),
  );
  if (branchCount > 1) circuits.push(outputCircuit(v, ambientC, "ac-combiner-output", "AC combiner output circuit, to service panel", unitA * units, TOTAL_VOLTAGE_DROP_TARGET_PCT - DC_VOLTAGE_DROP_TARGET_PCT));
  return { circuits, branches };
}

function missingOf(v: Parsed): string[] {
  const missing: string[] = [];
  if (v.inverter.kind === "string" && (!v.strings || v.strings.sizes.length === 0)) missing.push("a string plan (the string inverter's strings)");
  if (v.inverter.kind === "string" && (!v.inverter.maxDcVoltageV || !v.inverter.mpptMinV || !v.inverter.mpptMaxV)) missing.push("the inverter's maximum DC voltage and MPPT window");
  if (v.site.busbarA === null) missing.push("the service panel's busbar rating");
  if (v.site.mainBreakerA === null) missing.push("the service panel's main breaker rating");
  return missing;
}

// long because: one readable pass from input to every circuit, check and label; the parts are the functions above.
export function designElectrical(input: ElectricalInput): ElectricalDesign {
  const v = parseOrThrow(electricalInputSchema, input, "electrical design");
  const kind = v.inverter.kind;
  const mlpe: ModuleLevelElectronics = v.moduleLevelElectronics ?? (kind === "micro" ? "microinverter" : "rapid-shutdown-device");
  const ambientC = v.wiring.ambientC ?? v.strings?.highestTempC ?? DEFAULT_AMBIENT_C;
  const unitA = v.inverter.continuousOutputA ?? v.inverter.acWatts / v.site.serviceVoltageV;
  const inverterUnits = kind === "micro" ? Math.ceil(v.moduleCount / (v.inverter.modulesPerUnit ?? 1)) : v.inverterCount;
  const missing = missingOf(v);
  const notes: string[] = [];
  const assumptions = [
    `Conductors: ${v.wiring.material === "cu" ? "copper" : "aluminium"}, ${v.wiring.insulationC} °C insulation, ${v.wiring.terminalC} °C terminals (110.14(C)).`,
    `Runs (one way): DC ${v.wiring.dcRunFt} ft, branch ${v.wiring.branchRunFt} ft, inverter to panel ${v.wiring.acRunFt} ft; raceway ${v.wiring.heightAboveRoofMm === null ? "not on the roof" : `${v.wiring.heightAboveRoofMm} mm above the roof`}; hot ambient ${ambientC} °C.`,
    `Inverter continuous output ${r2(unitA)} A per unit${v.inverter.continuousOutputA ? "" : ` (${v.inverter.acWatts} W ÷ ${v.site.serviceVoltageV} V)`}.`,
  ];
  const strings = kind === "string" && v.strings ? groups(v.strings.sizes) : [];
  let circuits: CircuitResult[] = [];
  let stringChecks: StringCheckResult[] = [];
  let perInput = 0;
  let fuseA: number | null = null;
  let branches: { units: number; count: number }[] = [];
  if (kind === "string" && strings.length > 0 && v.inverter.maxDcVoltageV && v.inverter.mpptMinV && v.inverter.mpptMaxV) ({ circuits, stringChecks, perInput, fuseA } = stringCircuits(v, ambientC, strings, unitA, notes));
  if (kind === "micro") ({ circuits, branches } = microCircuits(v, ambientC, inverterUnits, unitA, notes));

  const last = circuits.at(-1);
  const backfedBreakerA = last?.kind === "ac" ? last.ocpdA : null;
  const totalOutputA = unitA * (kind === "micro" ? inverterUnits : v.inverterCount);
  const interconnection =
    v.site.busbarA !== null && v.site.mainBreakerA !== null
      ? checkInterconnection({ edition: v.edition, inverterOutputA: totalOutputA, backfedBreakerA: backfedBreakerA ?? standardOcpdAtLeast(totalOutputA * 1.25) ?? 0, busbarA: v.site.busbarA, mainBreakerA: v.site.mainBreakerA })
      : null;
  const rsd = checkRapidShutdown(v.edition, mlpe, true);
  const first = circuits[0];
  const totalDrop = first?.voltageDropPct != null && last?.voltageDropPct != null ? r2(Math.max(...circuits.filter((c) => c.id !== last.id).map((c) => c.voltageDropPct ?? 0), 0) + (circuits.length > 1 ? last.voltageDropPct : 0)) : null;
  const checks: ElectricalCheck[] = [
    ...stringChecks.flatMap((s, i) => s.checks.filter((c) => c.id !== "conductor").map((c) => ({ id: `string-${strings[i].size}-${c.id}`, status: c.status, rule: c.rule, detail: `${strings[i].size} in series: ${c.detail}` }))),
    ...circuits.flatMap((c) => c.checks.map((k) => ({ ...k, id: `${c.id}/${k.id}`, detail: `${c.name}: ${k.detail}` }))),
    ...(totalDrop !== null ? [{ id: "total-voltage-drop", status: (totalDrop <= TOTAL_VOLTAGE_DROP_TARGET_PCT ? "pass" : "warn") as CheckStatus, rule: `total voltage drop ≤ ${TOTAL_VOLTAGE_DROP_TARGET_PCT} % (common practice)`, detail: `worst branch or string plus the output circuit: ${totalDrop} %` }] : []),
    ...(interconnection?.checks ?? []),
    rsd.check,
  ];
  const worst: CheckStatus = checks.some((c) => c.status === "fail") ? "fail" : checks.some((c) => c.status === "warn") ? "warn" : "pass";
  const maxDc = stringChecks.length > 0 ? Math.max(...stringChecks.map((s) => s.stringVocMaxV)) : null;
  return {
    edition: v.edition,
    status: missing.length > 0 ? "incomplete" : worst,
    missing,
    kind,
    moduleLevelElectronics: mlpe,
    inverterLabel: v.inverter.label,
    inverterUnits,
    moduleCount: v.moduleCount,
    strings,
    stringsPerInput: perInput,
    stringFuseA: fuseA,
    branches,
    circuits: circuits.map(withConduit),
    stringChecks,
    site: v.site,
    backfedBreakerA,
    interconnection,
    totalVoltageDropPct: totalDrop,
    checks,
    labels: requiredLabels(v.edition, { kind, rule120: interconnection?.method === "load-side (120 % rule)", maxDcVoltageV: maxDc }),
    rapidShutdownInitiator: rsd.initiator,
    assumptions,
    notes: [...notes, ...circuits.flatMap((c) => c.notes.map((n) => `${c.name}: ${n}`))],
    caution: CAUTION,
  };
}

/** One-line reasons a design cannot be built as checked (for the proposal rule and the Design tab). */
export function electricalProblems(d: ElectricalDesign): string[] {
  if (d.status === "incomplete") return [`missing ${d.missing.join(", ")}`];
  return d.checks.filter((c) => c.status === "fail").map((c) => `${c.detail} (${c.rule})`);
}
