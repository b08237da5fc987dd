// Starting and stopping a local cluster (npm run cluster, npm run test:cluster): the Galera
// nodes and their health checks, S3-compatible storage, HAProxy, migrations once, the demo
// company, the local fakes and the app nodes, in that order. What an earlier run left running
// is stopped first, and a guardian stops this run's processes if the runner dies
// (scripts/lib/cluster-leftovers.ts).
import type { ChildProcess } from "node:child_process";
import { rmSync } from "node:fs";
import path from "node:path";
import mysql from "mysql2/promise";
import { APP_NODE_COUNT, type ClusterInstance } from "./cluster-instance";
import { writeHaproxyConfig } from "./balancer";
import { nodePaths, startGalera, stopGalera } from "./galera";
import { applyMigrations } from "./migrate";
import { seedDemo } from "./seed-demo";
import { buildIfStale, startAppNode, startMailFake, startPaymentsFake, startService, stopServices, waitForHttp } from "./services";
import { projectRoot } from "./instance";
import { CLUSTER_MARK, recordPid, startGuardian, stopLeftovers, type Guardian } from "./cluster-leftovers";

const tsx = path.join(projectRoot, "node_modules/tsx/dist/cli.mjs");
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Waits until the database answers through the balancer (HAProxy needs its checks to pass first). */
async function waitForDatabase(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let last = "";
  while (Date.now() < deadline) {
    try {
      const conn = await mysql.createConnection({ uri: url, connectTimeout: 1_000 });
      await conn.query("SELECT 1");
      await conn.end();
      return;
    } catch (err) {
      last = err instanceof Error ? err.message : String(err);
      await sleep(300);
    }
  }
  throw new Error(`The database did not answer through the balancer within ${timeoutMs / 1000} s (${last}).`);
}

/** Keeps the pid of a started process of the cluster, for the clean-up after a dead runner. */
function tracked(c: ClusterInstance, name: string, child: ChildProcess): ChildProcess {
  recordPid(c.dir, name, child.pid);
  return child;
}

export function startGaleraCheck(c: ClusterInstance, index: number) {
  const node = c.galera.nodes[index];
  const name = `galera-check-${node.name}`;
  return tracked(c, name, startService(name, process.execPath, [tsx, "scripts/cluster/galera-check.ts"], { GALERA_CHECK_PORT: String(c.ports.healthChecks[index]), GALERA_NODE_SOCKET: nodePaths(node).socket }, c.logDir));
}

export function startAppNodeOf(c: ClusterInstance, index: number) {
  return tracked(c, `app${index + 1}`, startAppNode(`app${index + 1}`, c.ports.appNodes[index], c.appEnv, c.logDir));
}

let guardian: Guardian | null = null;

/**
 * Stops what an earlier run of this profile left running (its runner was killed), removes the
 * named data folders (a fresh cluster), marks every process started from now on as this
 * profile's and starts the guardian.
 */
export async function prepareCluster(c: ClusterInstance, fresh: string[] = [], log: (line: string) => void = console.log): Promise<void> {
  const left = await stopLeftovers(c);
  if (left.stopped.length > 0) log(`· stopped what an earlier run left running: ${left.stopped.join(", ")}`);
  if (left.notOurs.length > 0) log(`· pid files of ${left.notOurs.join(", ")} name processes that are not this cluster's: left alone`);
  for (const sub of fresh) rmSync(path.join(c.dir, sub), { recursive: true, force: true });
  process.env[CLUSTER_MARK] = c.dir;
  guardian ??= await startGuardian(c, path.join(c.logDir, "guardian.log"));
}

// long because: one ordered start-up sequence, each step logged
export async function startCluster(c: ClusterInstance, log: (line: string) => void = console.log): Promise<ChildProcess[]> {
  await prepareCluster(c, [], log);
  await startGalera(c.galera, log);
  c.galera.nodes.forEach((_, i) => startGaleraCheck(c, i));
  // HAProxy counts a server up until its first checks fail: start it only once the checks
  // answer, or it would mark every node down (and cut the connections) while they start.
  for (const port of c.ports.healthChecks) await waitForHttp(`http://127.0.0.1:${port}/`, `The Galera health check on ${port}`, 60_000);
  log(`· S3-compatible storage on 127.0.0.1:${c.ports.s3}`);
  tracked(c, "s3", startService("s3", process.execPath, [tsx, "scripts/cluster/s3.ts"], { S3_FAKE_PORT: String(c.ports.s3), S3_FAKE_DIR: c.s3.dir, S3_FAKE_BUCKET: c.s3.bucket }, c.logDir));
  log(`· HAProxy: app on 127.0.0.1:${c.ports.front}, database on 127.0.0.1:${c.ports.dbFront}, stats on 127.0.0.1:${c.ports.stats}`);
  tracked(c, "haproxy", startService("haproxy", "/usr/sbin/haproxy", ["-db", "-f", writeHaproxyConfig(c)], {}, c.logDir));
  await waitForDatabase(c.appEnv.DATABASE_URL);
  await waitForHttp(`${c.s3.endpoint}/${c.s3.bucket}`, "The S3-compatible storage", 30_000, [200, 403]);
  log("· migrations (once, before the app nodes)");
  await applyMigrations(c.appEnv.DATABASE_URL);
  Object.assign(process.env, { STORAGE_DIR: c.appEnv.STORAGE_DIR, STORAGE_DRIVER: "s3", S3_ENDPOINT: c.s3.endpoint, S3_BUCKET: c.s3.bucket, S3_ACCESS_KEY_ID: c.s3.accessKeyId, S3_SECRET_ACCESS_KEY: c.s3.secretAccessKey });
  const seeded = await seedDemo(c.appEnv.DATABASE_URL);
  log(seeded.created ? "· demo company created" : "· demo company already there");
  tracked(c, "mail", startMailFake({ ...c, ports: c.ports }));
  await waitForHttp(`${c.mailUrl}/health`, "The dev outbox");
  tracked(c, "payments", startPaymentsFake(c));
  await waitForHttp(`${c.paymentsUrl}/health`, "The dev payments server");
  buildIfStale();
  const apps: ChildProcess[] = [];
  for (let i = 0; i < APP_NODE_COUNT; i++) {
    log(`· app node ${i + 1} on 127.0.0.1:${c.ports.appNodes[i]}`);
    apps.push(startAppNodeOf(c, i));
  }
  for (const port of c.ports.appNodes) await waitForHttp(`http://127.0.0.1:${port}/api/health`, `App node on ${port}`, 90_000);
  await waitForHttp(`${c.appUrl}/api/health`, "Kilowright through the balancer", 30_000);
  return apps;
}

export async function stopCluster(c: ClusterInstance): Promise<void> {
  await stopServices();
  await stopGalera(c.galera);
  rmSync(path.join(c.dir, "pids"), { recursive: true, force: true });
  await guardian?.release();
  guardian = null;
}
