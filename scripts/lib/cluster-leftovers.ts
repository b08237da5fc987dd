// What a local cluster leaves behind when its runner dies without stopping it (SIGKILL, a crash):
// every process it starts is recorded in a pid file under <dir>/pids (the Galera nodes write
// their own, <node>/mysqld.pid) and carries KILOWRIGHT_CLUSTER_DIR=<dir> in its environment.
// - stopLeftovers(): the next start stops what is still running, but only a pid whose
//   /proc/<pid>/environ names this very folder (a pid file may outlive its process, and the
//   kernel may have given the number to something else); Galera nodes are shut down cleanly,
//   last node first, so the next start can bootstrap from the node stopped last.
// - startGuardian(): a small process (scripts/cluster/guardian.ts) tied to the runner by an IPC
//   pipe. When the runner dies, however it dies, the kernel closes the pipe and gives the
//   guardian a new parent; the guardian then runs stopLeftovers() at once. (PR_SET_PDEATHSIG would be the kernel's own way, but Linux
//   clears it when a process changes its user, as mariadbd does when started as root —
//   prctl(2) — and Node offers no call for it.)
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { existsSync, mkdirSync, openSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import path from "node:path";
import { nodePaths, type GaleraCluster } from "./galera";
import { projectRoot } from "./instance";

export const CLUSTER_MARK = "KILOWRIGHT_CLUSTER_DIR";

export type LeftoverScope = { dir: string; galera: GaleraCluster };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const pidDir = (dir: string) => path.join(dir, "pids");

/** Records a started process of the cluster in folder `dir`. */
export function recordPid(dir: string, name: string, pid: number | undefined): void {
  if (!pid) return;
  mkdirSync(pidDir(dir), { recursive: true });
  writeFileSync(path.join(pidDir(dir), `${name}.pid`), `${pid}\n`);
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}

/** Whether `pid` is a live process started for the cluster in `dir` (its environment says so). */
export function isOurs(pid: number, dir: string): boolean {
  if (!Number.isInteger(pid) || pid <= 1 || pid === process.pid || !alive(pid)) return false;
  try {
    const environ = readFileSync(`/proc/${pid}/environ`, "utf8").split("\0");
    return environ.includes(`${CLUSTER_MARK}=${dir}`);
  } catch {
    return false; // gone meanwhile, or not readable: not provably ours
  }
}

function readPid(file: string): number | null {
  if (!existsSync(file)) return null;
  const pid = Number(readFileSync(file, "utf8").trim());
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

export type LeftoverReport = { stopped: string[]; notOurs: string[]; stale: string[] };

async function stopPid(pid: number, ms: number): Promise<void> {
  // Services run in their own process group (started detached): stop the group.
  for (const signal of ["SIGTERM", "SIGKILL"] as const) {
    try {
      process.kill(-pid, signal);
    } catch {
      try {
        process.kill(pid, signal);
      } catch {
        /* gone */
      }
    }
    const deadline = Date.now() + ms;
    while (alive(pid) && Date.now() < deadline) await sleep(100);
    if (!alive(pid)) return;
  }
}

/** Stops what a previous run in `scope.dir` left running: services first, then the Galera nodes one by one. */
export async function stopLeftovers(scope: LeftoverScope): Promise<LeftoverReport> {
  const report: LeftoverReport = { stopped: [], notOurs: [], stale: [] };
  const files = existsSync(pidDir(scope.dir)) ? readdirSync(pidDir(scope.dir)).filter((f) => f.endsWith(".pid")) : [];
  for (const file of files) {
    const name = file.slice(0, -".pid".length);
    const pid = readPid(path.join(pidDir(scope.dir), file));
    if (pid !== null && isOurs(pid, scope.dir)) {
      await stopPid(pid, 10_000);
      report.stopped.push(name);
    } else (pid !== null && alive(pid) ? report.notOurs : report.stale).push(name);
    rmSync(path.join(pidDir(scope.dir), file), { force: true });
  }
  for (const node of [...scope.galera.nodes].reverse()) {
    const pid = readPid(nodePaths(node).pid);
    if (pid === null) continue;
    if (!isOurs(pid, scope.dir)) {
      (alive(pid) ? report.notOurs : report.stale).push(node.name);
      continue;
    }
    spawnSync("mariadb-admin", [`--defaults-file=${nodePaths(node).cnf}`, "shutdown"], { encoding: "utf8", timeout: 30_000 });
    const deadline = Date.now() + 30_000;
    while (alive(pid) && Date.now() < deadline) await sleep(200);
    if (alive(pid)) process.kill(pid, "SIGKILL");
    report.stopped.push(node.name);
  }
  return report;
}

/** Forgets a process stopped on purpose (a clean stop), so the next start does not look for it. */
export function forgetPid(dir: string, name: string): void {
  rmSync(path.join(pidDir(dir), `${name}.pid`), { force: true });
}

export type Guardian = { child: ChildProcess; release: () => Promise<void> };

/**
 * Starts the guardian of this runner (see above) and waits until it watches. Detached, so
 * Ctrl-C in the terminal or a kill of the runner's process group does not take it along;
 * `release()` ends it after a clean stop.
 */
export async function startGuardian(scope: LeftoverScope, logFile: string): Promise<Guardian> {
  mkdirSync(path.dirname(logFile), { recursive: true });
  const log = openSync(logFile, "a");
  const child = spawn(process.execPath, ["--import", "tsx", path.join(projectRoot, "scripts/cluster/guardian.ts")], {
    cwd: projectRoot,
    env: { ...process.env, [CLUSTER_MARK]: "", CLUSTER_GUARDIAN_SCOPE: JSON.stringify(scope), CLUSTER_GUARDIAN_RUNNER: String(process.pid) },
    stdio: ["ignore", log, log, "ipc"],
    detached: true,
  });
  const watching = await new Promise<boolean>((resolve) => {
    const timer = setTimeout(() => resolve(false), 60_000);
    child.once("message", (m) => (clearTimeout(timer), resolve(m === "watching")));
    child.once("exit", () => (clearTimeout(timer), resolve(false)));
  });
  if (!watching) throw new Error(`The cluster's guardian did not start (see ${logFile}).`);
  child.unref();
  child.channel?.unref();
  const release = () =>
    new Promise<void>((resolve) => {
      if (!child.connected) return resolve();
      child.send("released", () => resolve());
    });
  return { child, release };
}
