/**
 * Sizing helper: how many modules, on which roof faces, for a target offset.
 *
 * Offset % = estimated annual AC kWh ÷ annual usage kWh × 100. Each face has a specific yield
 * (kWh AC per kW DC per year, from the production model run for that face alone) and a number
 * of usable module slots. Faces are filled best-yielding first, so the target is reached with
 * the fewest modules; each face takes at most its slots. Module counts are whole numbers, so
 * the result reaches the target from above by default ("at-least"), or lands on the count
 * nearest the target ("nearest").
 *
 * DC/AC guard: a string-inverter system whose DC/AC ratio exceeds the maximum (default 1.35)
 * loses more energy to clipping than the estimate here assumes. Residential designs commonly
 * run 1.1–1.3, and 1.35 is a common ceiling (industry practice, from memory; some inverter
 * makers allow more). Mode "warn" keeps the count and warns; "limit" removes modules from the
 * worst-yielding faces until the ratio is met.
 */
import { z } from "zod";
import { parseOrThrow } from "./errors";

/** Common-practice ceiling for the DC/AC ratio of a string-inverter system (see above). */
export const DEFAULT_MAX_DC_AC_RATIO = 1.35;
/**
 * Common-practice ceiling for a microinverter's DC/AC ratio (module STC watts ÷ the unit's AC
 * watts per module): above about 1.35 a micro clips much of a clear day's midday output (common
 * practice, from memory; microinverter makers publish their own recommended module range).
 */
export const MICRO_MAX_DC_AC_RATIO = 1.35;

/** A warning when the DC/AC ratio passes the common-practice ceiling for the inverter kind, else null. */
export function dcAcRatioWarning(kind: "string" | "micro", ratio: number, maxRatio = kind === "micro" ? MICRO_MAX_DC_AC_RATIO : DEFAULT_MAX_DC_AC_RATIO): string | null {
  if (!(ratio > maxRatio)) return null;
  return kind === "micro"
    ? `Microinverter DC/AC ratio ${ratio.toFixed(2)} (module STC watts ÷ AC watts per module) is above ${maxRatio}, a common-practice ceiling: expect midday clipping; check the maker's recommended module range.`
    : `DC/AC ratio ${ratio.toFixed(2)} exceeds ${maxRatio}.`;
}

export const sizingInputSchema = z
  .object({
    annualUsageKwh: z.number().finite().positive().max(1e8),
    targetOffsetPct: z.number().finite().min(1).max(200),
    moduleWatts: z.number().finite().min(10).max(1500),
    faces: z
      .array(
        z.object({
          id: z.string().min(1),
          usableSlots: z.number().int().min(0).max(1000),
          /** kWh AC per kW DC per year for this face (after shading and losses). */
          specificYieldKwhPerKw: z.number().finite().min(0).max(5000),
        }),
      )
      .min(1),
    rounding: z.enum(["at-least", "nearest"]).default("at-least"),
    /** Inverter AC rating, kW; omit for microinverters (no shared DC/AC ratio to guard). */
    inverterAcKw: z.number().finite().positive().max(10_000).optional(),
    maxDcAcRatio: z.number().finite().min(0.8).max(3).default(DEFAULT_MAX_DC_AC_RATIO),
    dcAcMode: z.enum(["warn", "limit"]).default("warn"),
  })
  .superRefine((v, ctx) => {
    const ids = new Set<string>();
    v.faces.forEach((f, i) => {
      if (ids.has(f.id)) ctx.addIssue({ code: "custom", path: ["faces", i, "id"], message: `duplicate face id "${f.id}"` });
      ids.add(f.id);
    });
  });
export type SizingInput = z.input<typeof sizingInputSchema>;

export type SizingResult = {
  modulesByFace: { id: string; modules: number; kwDc: number; annualKwh: number }[];
  totalModules: number;
  kwDc: number;
  annualKwh: number;
  targetKwh: number;
  offsetPct: number;
  dcAcRatio: number | null;
  /** "reached", or why not: the roof is full, or the DC/AC limit stopped it. */
  outcome: "reached" | "roof-full" | "dc-ac-limited";
  warnings: string[];
};

/** Module counts per face for a target offset. */
export function sizeSystem(input: SizingInput): SizingResult {
  const v = parseOrThrow(sizingInputSchema, input, "sizing");
  const kwPerModule = v.moduleWatts / 1000;
  const targetKwh = (v.annualUsageKwh * v.targetOffsetPct) / 100;
  const warnings: string[] = [];

  // Best yield first; ties keep the input order (Array.prototype.sort is stable).
  const order = v.faces.map((_, i) => i).sort((a, b) => v.faces[b].specificYieldKwhPerKw - v.faces[a].specificYieldKwhPerKw);
  const counts = new Array<number>(v.faces.length).fill(0);
  const perModule = (i: number) => kwPerModule * v.faces[i].specificYieldKwhPerKw;
  let remaining = targetKwh;
  for (const i of order) {
    if (remaining <= 0) break;
    const each = perModule(i);
    if (each <= 0) continue;
    const exact = remaining / each;
    // Guard against 12.000000001 from floating point turning into 13 modules.
    const wanted = Math.ceil(exact - 1e-9);
    const take = Math.min(v.faces[i].usableSlots, wanted);
    counts[i] = take;
    remaining -= take * each;
  }
  let outcome: SizingResult["outcome"] = remaining > 1e-9 ? "roof-full" : "reached";
  if (outcome === "roof-full") warnings.push("The usable slots cannot reach the target offset; every slot on a producing face is used.");

  if (v.rounding === "nearest" && outcome === "reached") {
    // The last module added may overshoot by more than it is worth: drop it if that lands closer.
    const lastFace = [...order].reverse().find((i) => counts[i] > 0);
    if (lastFace !== undefined) {
      const produced = targetKwh - remaining;
      const without = produced - perModule(lastFace);
      if (Math.abs(targetKwh - without) < Math.abs(produced - targetKwh)) counts[lastFace] -= 1;
    }
  }

  let dcAcRatio: number | null = null;
  if (v.inverterAcKw !== undefined) {
    const maxModules = Math.floor((v.maxDcAcRatio * v.inverterAcKw) / kwPerModule + 1e-9);
    let total = counts.reduce((a, b) => a + b, 0);
    if (total > maxModules) {
      if (v.dcAcMode === "limit") {
        for (const i of [...order].reverse()) {
          const drop = Math.min(counts[i], total - maxModules);
          counts[i] -= drop;
          total -= drop;
          if (total <= maxModules) break;
        }
        outcome = "dc-ac-limited";
        warnings.push(`Limited to ${maxModules} modules to keep the DC/AC ratio at or under ${v.maxDcAcRatio}.`);
      } else {
        warnings.push(
          `DC/AC ratio ${((total * kwPerModule) / v.inverterAcKw).toFixed(2)} exceeds ${v.maxDcAcRatio}: expect more clipping, or choose a larger inverter.`,
        );
      }
    }
    dcAcRatio = (total * kwPerModule) / v.inverterAcKw;
  }

  const modulesByFace = v.faces.map((f, i) => ({
    id: f.id,
    modules: counts[i],
    kwDc: counts[i] * kwPerModule,
    annualKwh: counts[i] * perModule(i),
  }));
  const annualKwh = modulesByFace.reduce((a, f) => a + f.annualKwh, 0);
  const totalModules = counts.reduce((a, b) => a + b, 0);
  return {
    modulesByFace,
    totalModules,
    kwDc: totalModules * kwPerModule,
    annualKwh,
    targetKwh,
    offsetPct: (annualKwh / v.annualUsageKwh) * 100,
    dcAcRatio,
    outcome,
    warnings,
  };
}
