import { execFile } from "node:child_process";
import path from "node:path";
import { promisify } from "node:util";
import { describe, expect, it } from "vitest";

const run = promisify(execFile);
const root = process.cwd();
const tsx = path.join(root, "node_modules/tsx/dist/cli.mjs");

describe("command line", () => {
  it("npm run estimate reproduces the Denver PVWatts year from its own weather (NREL PVWatts v5 reference: 6,023.67 kWh)", async () => {
    // The reference system (tests/fixtures/weather/README.md): 4 kW DC, open rack, standard
    // module, tilt 20°, azimuth 180°, 14.08 % losses, 96 % inverter, DC/AC 1.2. Its own hourly
    // weather, as a generic CSV: scripts/lib/seed/data/denver-pvwatts-hourly-weather.csv.
    const { stdout } = await run(process.execPath, [
      tsx,
      "scripts/estimate.ts",
      "--weather",
      "scripts/lib/seed/data/denver-pvwatts-hourly-weather.csv",
      "--lat", "39.73", "--lon", "-105.18", "--elev", "1819.6", "--utc-offset", "-7",
      "--tilt", "20", "--azimuth", "180", "--dc-kw", "4", "--module", "standard", "--mount", "open-rack",
      "--losses", "14.08", "--inverter-eff", "96", "--dc-ac", "1.2", "--json",
    ], { cwd: root, timeout: 60_000 });
    const out = JSON.parse(stdout) as { annualAcKwh: number; monthlyAcKwh: number[]; annualPoaKwhPerM2: number };
    expect(Math.abs(out.annualAcKwh - 6023.67) / 6023.67).toBeLessThan(0.02);
    expect(out.monthlyAcKwh).toHaveLength(12);
    expect(out.annualPoaKwhPerM2).toBeGreaterThan(1500);
  });

  it("npm run estimate refuses bad arguments with a message and exit code 1", async () => {
    const err = await run(process.execPath, [tsx, "scripts/estimate.ts", "--weather", "src/engine/data/tmy3-723170-greensboro-nc.csv", "--tilt", "120", "--azimuth", "180", "--dc-kw", "4", "--json"], { cwd: root, timeout: 60_000 }).catch((e: unknown) => e);
    expect((err as { code?: number }).code).toBe(1);
    expect((err as { stderr?: string }).stderr).toMatch(/tilt/);
  });

  it("npm run quote runs the documented example case end to end", async () => {
    const { stdout } = await run(process.execPath, [tsx, "scripts/quote.ts", "--case", "docs/examples/quote-case.json", "--json"], { cwd: root, timeout: 60_000, maxBuffer: 32 * 1024 * 1024 });
    const out = JSON.parse(stdout) as Record<string, unknown>;
    expect(JSON.stringify(out)).toMatch(/payback/i);
  });
});
