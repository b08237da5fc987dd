// `npm run demo`: MariaDB, the dev outbox and the dev payments server on loopback, migrations,
// the demo company, a production build, and the app on http://localhost:3000. Ctrl-C stops all of it.
import { rmSync } from "node:fs";
import path from "node:path";
import { instance } from "./lib/instance";
import { resetDatabase, startMariaDb, stopMariaDb } from "./lib/mariadb";
import { applyMigrations } from "./lib/migrate";
import { DEMO_PASSWORD, DEMO_PEOPLE, seedDemo } from "./lib/seed-demo";
import { buildIfStale, startApp, startMailFake, startPaymentsFake, stopServices, waitForHttp } from "./lib/services";
import { ROLE_LABELS } from "../src/lib/permissions";

const inst = instance("demo");
/** `npm run demo -- --fresh` drops the demo's data (database, outbox, payments, files) and seeds it again. */
const fresh = process.argv.includes("--fresh");
let stopping = false;

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  console.log("\n· stopping the app, the dev outbox, the dev payments server and MariaDB…");
  await stopServices();
  await stopMariaDb(inst.db).catch((err) => console.error(err));
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));

try {
  console.log(`· MariaDB on 127.0.0.1:${inst.ports.db} (data in ${path.relative(process.cwd(), inst.db.dir)})`);
  await startMariaDb(inst.db);
  if (fresh) {
    console.log("· --fresh: dropping the demo's database, outbox, payments and files");
    resetDatabase(inst.db);
    for (const dir of [inst.mailDir, inst.paymentsDir, inst.appEnv.STORAGE_DIR]) rmSync(dir, { recursive: true, force: true });
  }
  await applyMigrations(inst.appEnv.DATABASE_URL);
  process.env.STORAGE_DIR = inst.appEnv.STORAGE_DIR; // seeds store demo files (weather) there
  const seeded = await seedDemo(inst.appEnv.DATABASE_URL);
  console.log(
    seeded.created
      ? "· demo company created"
      : "· demo company already there (seeded once, kept as you left it; `npm run demo -- --fresh` starts over with this version's demo data)",
  );
  startMailFake(inst);
  await waitForHttp(`${inst.mailUrl}/health`, "The dev outbox");
  startPaymentsFake(inst);
  await waitForHttp(`${inst.paymentsUrl}/health`, "The dev payments server");
  buildIfStale();
  startApp(inst);
  await waitForHttp(`${inst.appUrl}/api/health`, "Kilowright", 90_000);

  const width = Math.max(...DEMO_PEOPLE.map((p) => p.email.length));
  console.log(`
Kilowright is running: ${inst.appUrl}

Demo company: Tallgrass Bright Energy (invented). Every demo account uses the password
  ${DEMO_PASSWORD}

${DEMO_PEOPLE.map((p) => `  ${p.email.padEnd(width)}  ${ROLE_LABELS[p.role]} (${p.name})`).join("\n")}

Mail goes to the dev outbox: sign in as owner or admin and open "Dev outbox".
Payments go to the dev payments server (${inst.paymentsUrl}, a local stand-in for Stripe):
  card 4242 4242 4242 4242 pays, 4000 0000 0000 0002 is declined, any future expiry and CVC.
Logs: ${path.relative(process.cwd(), path.join(inst.dir, "logs"))}/  ·  Ctrl-C stops everything.`);
} catch (err) {
  console.error(`\nThe demo could not start: ${err instanceof Error ? err.message : String(err)}`);
  await shutdown(1);
}
