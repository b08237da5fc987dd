// Starting and stopping the local services (mail fake, payments fake, app) as child processes, waiting
// until they answer, and building the app when its sources changed.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, openSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { projectRoot, type Instance } from "./instance";

/** What the local fakes need to know of the instance they serve (a demo, test or cluster instance). */
export type FakesHost = Pick<Instance, "mailDir" | "paymentsDir" | "secrets" | "appUrl" | "dir"> & {
  profile: string;
  ports: { mail: number; payments: number };
};

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const children: { name: string; child: ChildProcess }[] = [];

export function startService(name: string, command: string, args: string[], env: Record<string, string>, logDir: string): ChildProcess {
  mkdirSync(logDir, { recursive: true });
  const log = openSync(path.join(logDir, `${name}.log`), "a");
  const child = spawn(command, args, {
    cwd: projectRoot,
    env: { ...process.env, ...env },
    stdio: ["ignore", log, log],
    detached: true, // its own process group, so stopping it stops what it started
  });
  children.push({ name, child });
  return child;
}

export async function waitForHttp(url: string, what: string, timeoutMs = 60_000, okStatuses = [200]): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let last = "";
  while (Date.now() < deadline) {
    try {
      const res = await fetch(url, { signal: AbortSignal.timeout(2_000) });
      if (okStatuses.includes(res.status)) return;
      last = `HTTP ${res.status}`;
    } catch (err) {
      last = err instanceof Error ? err.message : String(err);
    }
    await sleep(250);
  }
  throw new Error(`${what} did not answer at ${url} within ${timeoutMs / 1000} s (${last}).`);
}

export async function stopServices(): Promise<void> {
  for (const { child } of children.reverse()) {
    if (child.exitCode !== null || child.pid === undefined) continue;
    try {
      process.kill(-child.pid, "SIGTERM");
    } catch {
      /* already gone */
    }
  }
  const deadline = Date.now() + 10_000;
  while (children.some(({ child }) => child.exitCode === null && child.signalCode === null) && Date.now() < deadline) await sleep(100);
  for (const { child } of children) {
    if (child.exitCode === null && child.signalCode === null && child.pid !== undefined) {
      try {
        process.kill(-child.pid, "SIGKILL");
      } catch {
        /* gone */
      }
    }
  }
  children.length = 0;
}

export function startMailFake(inst: FakesHost): ChildProcess {
  return startService(
    "mail",
    process.execPath,
    [path.join(projectRoot, "node_modules/tsx/dist/cli.mjs"), "scripts/fakes/mail.ts"],
    { MAIL_FAKE_PORT: String(inst.ports.mail), MAIL_FAKE_DIR: inst.mailDir, MAIL_FAKE_API_KEY: inst.secrets.resendKey },
    path.join(inst.dir, "logs"),
  );
}

/**
 * The dev payments server (local fake of the Stripe API) on inst.ports.payments; it signs and
 * POSTs webhooks to the app's /api/webhooks/stripe, retrying while the app is not up yet. The
 * test profile retries at most every 2 s so browser tests do not wait on a long back-off.
 */
export function startPaymentsFake(inst: FakesHost): ChildProcess {
  return startService(
    "payments",
    process.execPath,
    [path.join(projectRoot, "node_modules/tsx/dist/cli.mjs"), "scripts/fakes/payments.ts"],
    {
      PAYMENTS_FAKE_PORT: String(inst.ports.payments),
      PAYMENTS_FAKE_DIR: inst.paymentsDir,
      PAYMENTS_FAKE_API_KEY: inst.secrets.stripeKey,
      PAYMENTS_FAKE_WEBHOOK_URL: `${inst.appUrl}/api/webhooks/stripe`,
      PAYMENTS_FAKE_WEBHOOK_SECRET: inst.secrets.webhookSecret,
      PAYMENTS_FAKE_RETRY_INITIAL_MS: "1000",
      PAYMENTS_FAKE_RETRY_MAX_MS: inst.profile === "test" ? "2000" : "60000",
    },
    path.join(inst.dir, "logs"),
  );
}

/**
 * The production build behind scripts/app-server.ts (the client address from the connection),
 * on loopback. One Node process: stopping its group stops it.
 */
export function startApp(inst: Instance): ChildProcess {
  return startAppNode("app", inst.ports.app, inst.appEnv, path.join(inst.dir, "logs"));
}

/** One app process (`next start` behind scripts/app-server.ts) on a loopback port. */
export function startAppNode(name: string, port: number, appEnv: Record<string, string>, logDir: string): ChildProcess {
  return startService(
    name,
    process.execPath,
    ["--import", "tsx", "scripts/app-server.ts", "-H", "127.0.0.1", "-p", String(port)],
    { ...appEnv, NODE_ENV: "production", NEXT_TELEMETRY_DISABLED: "1" },
    logDir,
  );
}

const BUILD_INPUTS = ["src", "emails", "drizzle", "public", "package-lock.json", "tailwind.config.ts", "tsconfig.json", ".postcssrc.json", "next.config.ts"];

function newestMtime(p: string): number {
  if (!existsSync(p)) return 0;
  const st = statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = st.mtimeMs;
  for (const entry of readdirSync(p)) newest = Math.max(newest, newestMtime(path.join(p, entry)));
  return newest;
}

/** Builds for production unless .next is newer than every source (a re-run is then quick). */
export function buildIfStale(): void {
  const buildId = path.join(projectRoot, ".next", "BUILD_ID");
  const sources = Math.max(...BUILD_INPUTS.map((p) => newestMtime(path.join(projectRoot, p))));
  if (existsSync(buildId) && statSync(buildId).mtimeMs > sources) {
    console.log("· the production build is up to date");
    return;
  }
  console.log("· building for production (next build)…");
  const r = spawnSync(process.execPath, [path.join(projectRoot, "node_modules/next/dist/bin/next"), "build"], {
    cwd: projectRoot,
    stdio: "inherit",
    env: { ...process.env, NEXT_TELEMETRY_DISABLED: "1", NODE_ENV: "production" },
  });
  if (r.status !== 0) throw new Error("next build failed (see above).");
}
