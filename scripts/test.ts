// `npm test`: the demo's set-up on the test profile's own ports and data (a fresh database
// each run), then every layer: unit, integration (real MariaDB, the dev outbox, the dev
// payments server), browser (Playwright driving Debian's chromium against a production build)
// and cluster (scripts/test-cluster.ts: a local Galera cluster and two app nodes under faults).
import { spawnSync } from "node:child_process";
import { rmSync } from "node:fs";
import path from "node:path";
import { instance, projectRoot } from "./lib/instance";
import { resetDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb";
import { applyMigrations } from "./lib/migrate";
import { seedDemo } from "./lib/seed-demo";
import { checkClientBundles } from "./lib/client-bundles";
import { buildIfStale, startApp, startMailFake, startPaymentsFake, stopServices, waitForHttp } from "./lib/services";

const inst = instance("test");
const dashDash = process.argv.indexOf("--");
const own = dashDash < 0 ? process.argv.slice(2) : process.argv.slice(2, dashDash);
/** Anything after `--` goes to the test runner (a file filter, -g "title"). */
const extra = dashDash < 0 ? [] : process.argv.slice(dashDash + 1);
const only = own.filter((a) => ["unit", "integration", "browser", "cluster"].includes(a));
const layers = only.length > 0 ? only : ["unit", "integration", "browser", "cluster"];
const started = Date.now();

function run(label: string, args: string[], env: Record<string, string> = {}): boolean {
  console.log(`\n━━ ${label} ━━`);
  const r = spawnSync(process.execPath, args, { cwd: projectRoot, stdio: "inherit", env: { ...process.env, ...env } });
  return r.status === 0;
}

const bin = (p: string) => path.join(projectRoot, "node_modules", p);
const testEnv = { ...inst.appEnv, KW_TEST_MAIL_URL: inst.mailUrl, KW_TEST_PAYMENTS_URL: inst.paymentsUrl };

async function main(): Promise<boolean> {
  const results: [string, boolean][] = [];
  if (layers.includes("unit")) results.push(["unit", run("unit tests", [bin("vitest/vitest.mjs"), "run", "-c", "tests/vitest.config.ts", "--project", "unit", ...extra])]);
  // Layers hold: no import cycles in src, and the PDFs (src/documents) never import src/server.
  if (layers.includes("unit")) results.push(["import cycles", run("import cycles and layers", [bin("tsx/dist/cli.mjs"), "scripts/check-import-cycles.ts"])]);
  // No function over 80 lines in src without a reason written beside it.
  if (layers.includes("unit")) results.push(["function length", run("function length", [bin("tsx/dist/cli.mjs"), "scripts/check-function-length.ts"])]);

  if (layers.includes("integration") || layers.includes("browser")) {
    console.log(`\n· MariaDB (test) on 127.0.0.1:${inst.ports.db}, a fresh database`);
    await startMariaDb(inst.db);
    resetDatabase(inst.db);
    rmSync(inst.mailDir, { recursive: true, force: true });
    rmSync(inst.paymentsDir, { recursive: true, force: true });
    rmSync(inst.appEnv.STORAGE_DIR, { recursive: true, force: true });
    await applyMigrations(inst.appEnv.DATABASE_URL);
    process.env.STORAGE_DIR = inst.appEnv.STORAGE_DIR; // seeds store demo files (weather) there
    await seedDemo(inst.appEnv.DATABASE_URL);
    startMailFake(inst);
    await waitForHttp(`${inst.mailUrl}/health`, "The dev outbox");
    startPaymentsFake(inst);
    await waitForHttp(`${inst.paymentsUrl}/health`, "The dev payments server");
  }
  if (layers.includes("integration")) {
    results.push(["integration", run("integration tests (real MariaDB)", [bin("vitest/vitest.mjs"), "run", "-c", "tests/vitest.config.ts", "--project", "integration", ...extra], testEnv)]);
  }
  if (layers.includes("browser")) {
    buildIfStale();
    console.log("\n━━ client bundles (no drizzle in the browser) ━━");
    results.push(["client bundles", checkClientBundles(projectRoot)]);
    startApp(inst);
    await waitForHttp(`${inst.appUrl}/api/health`, "Kilowright (test)", 90_000);
    results.push(["browser", run("browser tests (Playwright + chromium)", [bin("@playwright/test/cli.js"), "test", "-c", "tests/playwright.config.ts", ...extra], testEnv)]);
  }
  // The cluster under faults (3 Galera nodes, HAProxy, 2 app nodes; its own ports and data):
  // kill -9 a database node and an app node under load, 0 lost or doubled writes.
  if (layers.includes("cluster")) results.push(["cluster", run("cluster fault test (Galera + HAProxy + 2 app nodes)", [bin("tsx/dist/cli.mjs"), "scripts/test-cluster.ts"])]);
  const minutes = ((Date.now() - started) / 60_000).toFixed(1);
  console.log(`\n${results.map(([name, ok]) => `${ok ? "✓" : "✗"} ${name}`).join("   ")}   (${minutes} min)`);
  return results.every(([, ok]) => ok);
}

let ok = false;
try {
  ok = await main();
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
} finally {
  await stopServices();
  await stopMariaDb(inst.db).catch((err) => console.error(err));
}
process.exit(ok ? 0 : 1);
