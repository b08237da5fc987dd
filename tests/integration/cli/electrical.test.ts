import { execFile } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";
import type { ElectricalDesign } from "@/engine/electrical/design";

const run = promisify(execFile);
const root = process.cwd();
const tsx = path.join(root, "node_modules/tsx/dist/cli.mjs");
const electrical = (...args: string[]) => run(process.execPath, [tsx, "scripts/electrical.ts", ...args], { cwd: root, timeout: 60_000 });

describe("npm run electrical", () => {
  it("sizes the documented string-inverter case and prints conductors, devices, drops and the interconnection", async () => {
    const { stdout } = await electrical("--case", "docs/examples/electrical-case.json");
    expect(stdout).toMatch(/NEC 2020, .*: PASS/);
    expect(stdout).toMatch(/Inverter output circuit, inverter to service panel\s+32 A\s+8 AWG copper\s+40 A\s+10 AWG\s+0\.41 %/);
    expect(stdout).toMatch(/Interconnection: load-side \(120 % rule\), back-fed breaker 40 A: PASS/);
    expect(stdout).toMatch(/licensed professional/);
  });

  it("--json gives the whole result; the microinverter example fails the busbar rule and names what follows", async () => {
    const { stdout } = await electrical("--case", "docs/examples/electrical-case-micro.json", "--json");
    const d = JSON.parse(stdout) as ElectricalDesign;
    expect(d.status).toBe("fail");
    expect(d.branches).toEqual([{ units: 13, count: 2 }]);
    // 26 × 1.21 A = 31.46 A; × 1.25 = 39.33 A + 100 A > 120 A; 39.33 + 80 ≤ 120
    expect(d.interconnection?.deratedMainA).toBe(80);
    expect(d.interconnection?.whenItFails.join(" ")).toMatch(/supply side/);
  });

  it("refuses an invalid case with every bad field named and exit code 1", async () => {
    const dir = mkdtempSync(path.join(tmpdir(), "electrical-"));
    const file = path.join(dir, "bad.json");
    writeFileSync(file, JSON.stringify({ edition: "2014", module: { iscA: 10, impA: 9, vocV: 40 }, inverter: { kind: "micro", acWatts: 290 }, moduleCount: 10 }));
    const err = (await electrical("--case", file).catch((e: unknown) => e)) as { code?: number; stderr?: string };
    expect(err.code).toBe(1);
    expect(err.stderr).toMatch(/edition: edition must be one of 2017, 2020, 2023/);
    expect(err.stderr).toMatch(/module\.vmpV: the module's voltage at maximum power Vmp \(V\) is required/);
  });
});
