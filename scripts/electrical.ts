/**
 * Run the electrical design and its NEC checks on one JSON case:
 *
 *   npm run electrical -- --case docs/examples/electrical-case.json [--json]
 *
 * Prints conductor sizes, overcurrent devices, voltage drops and the interconnection result.
 * The case format is described in docs/electrical-case.md. Exit codes: 0 checked (whatever the
 * result), 1 unreadable or invalid case, 2 bad arguments.
 */
import { readFileSync } from "node:fs";
import { resolve } from "node:path";
import { EngineInputError } from "../src/engine/errors";
import { designElectrical, type ElectricalDesign } from "../src/engine/electrical/design";
import { MATERIAL_NAME, sizeLabel } from "../src/engine/electrical/nec-tables";

function usage(message: string): never {
  console.error(`${message}\nusage: npm run electrical -- --case FILE.json [--json]`);
  process.exit(2);
}

const fmt = (x: number | null, unit: string) => (x === null ? "—" : `${x} ${unit}`);

function printText(name: string, d: ElectricalDesign): void {
  const lines = [
    `${name} — NEC ${d.edition}, ${d.kind === "micro" ? `${d.inverterUnits} microinverters` : `${d.inverterUnits} × ${d.inverterLabel}`}, ${d.moduleCount} modules: ${d.status.toUpperCase()}`,
    ...(d.missing.length > 0 ? [`Missing: ${d.missing.join("; ")}`] : []),
    ...(d.strings.length > 0 ? [`Strings: ${d.strings.map((s) => `${s.count} × ${s.size}`).join(", ")}; ${d.stringsPerInput} per MPPT input; string fuses ${d.stringFuseA ? `${d.stringFuseA} A` : "not required"}`] : []),
    ...(d.branches.length > 0 ? [`Branch circuits: ${d.branches.map((b) => `${b.count} × ${b.units} units`).join(", ")}`] : []),
    "",
    "circuit                                                        current  conductor          OCPD    EGC       Vdrop",
    ...d.circuits.map(
      (c) =>
        `${c.name.slice(0, 62).padEnd(62)} ${fmt(c.maxCurrentA, "A").padStart(8)}  ${(c.size ? `${sizeLabel(c.size)} ${MATERIAL_NAME[c.material]}` : "none fits").padEnd(17)} ${fmt(c.ocpdA, "A").padStart(6)}  ${(c.egcSize ? sizeLabel(c.egcSize) : "—").padEnd(8)}  ${fmt(c.voltageDropPct, "%")}`,
    ),
    ...d.circuits.map((c) => `  raceway: ${c.conduit?.text ?? "—"}`),
    ...(d.totalVoltageDropPct !== null ? [`Total voltage drop: ${d.totalVoltageDropPct} % (common-practice target 3 %)`] : []),
    "",
    d.interconnection
      ? `Interconnection: ${d.interconnection.method}, back-fed breaker ${d.backfedBreakerA} A: ${d.interconnection.status.toUpperCase()}`
      : "Interconnection: not checked (the panel's busbar and main breaker ratings are missing)",
    ...(d.interconnection?.checks.map((c) => `  ${c.detail}`) ?? []),
    ...(d.interconnection?.whenItFails.map((w) => `  → ${w}`) ?? []),
    "",
    "Checks:",
    ...d.checks.map((c) => `  [${c.status}] ${c.detail}  (${c.rule})`),
    "",
    "Labels:",
    ...d.labels.map((l) => `  ${l.section} — ${l.where}: ${l.wording}`),
    `  ${d.rapidShutdownInitiator}`,
    "",
    "Assumptions:",
    ...d.assumptions.map((a) => `  - ${a}`),
    ...(d.notes.length > 0 ? ["Notes:", ...d.notes.map((n) => `  - ${n}`)] : []),
    "",
    d.caution,
  ];
  console.log(lines.join("\n"));
}

function main(): void {
  const args = process.argv.slice(2);
  const at = args.indexOf("--case");
  if (at === -1 || !args[at + 1]) usage("Missing --case FILE.json");
  const casePath = resolve(args[at + 1]);
  let text: string;
  try {
    text = readFileSync(casePath, "utf8");
  } catch (e) {
    console.error(`Cannot read the case file ${casePath}: ${(e as Error).message}`);
    process.exit(1);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    console.error(`The case file is not valid JSON: ${(e as Error).message}`);
    process.exit(1);
  }
  const { name, ...input } = (raw ?? {}) as { name?: unknown };
  try {
    const d = designElectrical(input as Parameters<typeof designElectrical>[0]);
    if (args.includes("--json")) console.log(JSON.stringify(d, null, 2));
    else printText(typeof name === "string" ? name : "Electrical case", d);
  } catch (e) {
    if (e instanceof EngineInputError) {
      console.error("The case is not valid:");
      for (const issue of e.issues) console.error(`  ${issue.path || "(case)"}: ${issue.message}`);
      process.exit(1);
    }
    throw e;
  }
}

main();
