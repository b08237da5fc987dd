// The clean-up after a cluster runner that died (SIGKILL): with real processes (sleep) standing
// in for the cluster's services, in a temporary folder. No database is needed: the Galera part
// of the clean-up is the same pid-file walk, followed by mariadb-admin shutdown.
import { spawn, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { existsSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import { CLUSTER_MARK, isOurs, recordPid, stopLeftovers, type LeftoverScope } from "./cluster-leftovers";

const started: ChildProcess[] = [];
const dirs: string[] = [];

function scratch(): LeftoverScope {
  const dir = mkdtempSync(path.join(tmpdir(), "kw-leftovers-"));
  dirs.push(dir);
  return { dir, galera: { nodes: [], database: "x", user: "x", password: "x" } };
}

/** A stand-in service: `sleep`, detached like the cluster's services, marked for `dir` (or not). */
function sleeper(mark: string | null): ChildProcess {
  const env = { ...process.env, [CLUSTER_MARK]: mark ?? "" };
  const child = spawn("sleep", ["300"], { env, detached: true, stdio: "ignore" });
  started.push(child);
  return child;
}

const running = (child: ChildProcess) => child.exitCode === null && child.signalCode === null;

async function waitUntil(check: () => boolean, ms: number): Promise<boolean> {
  const deadline = Date.now() + ms;
  while (!check() && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
  return check();
}

afterEach(() => {
  for (const child of started.splice(0)) if (running(child)) child.kill("SIGKILL");
  for (const dir of dirs.splice(0)) rmSync(dir, { recursive: true, force: true });
});

describe("stopLeftovers", () => {
  it("stops the processes its pid files name when they carry this folder's mark, and nothing else", async () => {
    const scope = scratch();
    const ours = sleeper(scope.dir);
    const otherCluster = sleeper(`${scope.dir}-other`); // another profile's process: a different folder
    const stranger = sleeper(null); // a pid the kernel gave to something else after our process ended
    recordPid(scope.dir, "app1", ours.pid);
    recordPid(scope.dir, "app2", otherCluster.pid);
    recordPid(scope.dir, "haproxy", stranger.pid);
    writeFileSync(path.join(scope.dir, "pids", "mail.pid"), "999999999\n"); // its process is long gone
    await once(ours, "spawn");

    expect(isOurs(ours.pid!, scope.dir)).toBe(true);
    expect(isOurs(stranger.pid!, scope.dir)).toBe(false);
    const report = await stopLeftovers(scope);

    expect(report).toEqual({ stopped: ["app1"], notOurs: ["app2", "haproxy"], stale: ["mail"] });
    expect(await waitUntil(() => !running(ours), 5_000)).toBe(true);
    expect(running(otherCluster)).toBe(true);
    expect(running(stranger)).toBe(true);
    expect(readdirSync(path.join(scope.dir, "pids"))).toEqual([]); // the next start begins clean
  });

  it("a runner killed with SIGKILL: its guardian stops what it started, at once", async () => {
    const scope = scratch();
    // The runner: starts the guardian and one marked service, records the service's pid, then waits.
    const runnerCode = `
      import { spawn } from "node:child_process";
      import { CLUSTER_MARK, recordPid, startGuardian } from "./scripts/lib/cluster-leftovers.ts";
      const scope = JSON.parse(process.env.SCOPE);
      await startGuardian(scope, scope.dir + "/guardian.log");
      const child = spawn("sleep", ["300"], { env: { ...process.env, [CLUSTER_MARK]: scope.dir }, detached: true, stdio: "ignore" });
      child.unref();
      recordPid(scope.dir, "app1", child.pid);
      console.log(child.pid);
      setInterval(() => {}, 1000);`;
    // Not the test worker's own IPC channel (vitest's fork): the runner is started from a terminal.
    const { NODE_CHANNEL_FD: _fd, NODE_CHANNEL_SERIALIZATION_MODE: _mode, ...env } = process.env;
    const runner = spawn(process.execPath, ["--import", "tsx", "--input-type=module", "-e", runnerCode], {
      env: { ...env, SCOPE: JSON.stringify(scope) },
      stdio: ["ignore", "pipe", "inherit"],
    });
    started.push(runner);
    const [line] = (await once(runner.stdout!, "data")) as [Buffer];
    const servicePid = Number(line.toString().trim());
    expect(isOurs(servicePid, scope.dir)).toBe(true);

    runner.kill("SIGKILL");
    const gone = await waitUntil(() => !isOurs(servicePid, scope.dir), 15_000);
    try {
      const log = existsSync(path.join(scope.dir, "guardian.log")) ? readFileSync(path.join(scope.dir, "guardian.log"), "utf8") : "(no guardian log)";
      expect(gone, `the service the killed runner started is still running; guardian: ${log}`).toBe(true);
    } finally {
      if (!gone) process.kill(-servicePid, "SIGKILL");
    }
    expect(await waitUntil(() => readdirSync(path.join(scope.dir, "pids")).length === 0, 5_000)).toBe(true);
  }, 30_000);
});
