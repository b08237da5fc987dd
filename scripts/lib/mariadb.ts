// A private MariaDB instance on loopback, from Debian's packages: its own data folder,
// port and socket under .data/<profile>/, so demo and tests never share data and nothing
// under /etc/mysql or the system service is used.
import { spawn, spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync, openSync } from "node:fs";
import path from "node:path";

export type MariaDbConfig = {
  dir: string; // .data/<profile>/mariadb
  port: number;
  database: string;
  user: string;
  password: string;
};

export function mariaDbPaths(cfg: MariaDbConfig) {
  return {
    cnf: path.join(cfg.dir, "my.cnf"),
    data: path.join(cfg.dir, "data"),
    socket: path.join(cfg.dir, "mysqld.sock"),
    pid: path.join(cfg.dir, "mysqld.pid"),
    log: path.join(cfg.dir, "mysqld.log"),
  };
}

function writeCnf(cfg: MariaDbConfig) {
  const p = mariaDbPaths(cfg);
  const isRoot = typeof process.getuid === "function" && process.getuid() === 0;
  const userLine = isRoot ? "user=root\n" : "";
  writeFileSync(
    p.cnf,
    `[client]
socket=${p.socket}
port=${cfg.port}

[mariadbd]
${userLine}datadir=${p.data}
socket=${p.socket}
pid-file=${p.pid}
port=${cfg.port}
bind-address=127.0.0.1
skip-name-resolve
log-error=${p.log}
character-set-server=utf8mb4
collation-server=utf8mb4_unicode_ci
default-storage-engine=InnoDB
innodb_flush_log_at_trx_commit=1
sync_binlog=1
innodb_buffer_pool_size=128M
max_connections=300
default-time-zone=+00:00

[mariadb-install-db]
${userLine}`,
  );
}

function admin(cfg: MariaDbConfig, args: string[]) {
  return spawnSync("mariadb-admin", [`--defaults-file=${mariaDbPaths(cfg).cnf}`, ...args], {
    encoding: "utf8",
  });
}

function sql(cfg: MariaDbConfig, statement: string) {
  const r = spawnSync("mariadb", [`--defaults-file=${mariaDbPaths(cfg).cnf}`, "-e", statement], {
    encoding: "utf8",
  });
  if (r.status !== 0) throw new Error(`SQL failed: ${r.stderr}`);
}

export function isMariaDbUp(cfg: MariaDbConfig): boolean {
  return existsSync(mariaDbPaths(cfg).cnf) && admin(cfg, ["ping", "--connect-timeout=1"]).status === 0;
}

function pidAlive(pidFile: string): boolean {
  if (!existsSync(pidFile)) return false;
  const pid = Number(readFileSync(pidFile, "utf8").trim());
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Idempotent: initialises once, recovers from a stale pid/socket, waits until ready. */
export async function startMariaDb(cfg: MariaDbConfig): Promise<void> {
  const p = mariaDbPaths(cfg);
  mkdirSync(cfg.dir, { recursive: true });
  writeCnf(cfg);
  if (isMariaDbUp(cfg)) return ensureDatabase(cfg);

  // A crash leaves a pid file and a socket behind; a live process with that pid means
  // another start is underway, so only remove them when nothing holds them.
  if (!pidAlive(p.pid)) {
    rmSync(p.pid, { force: true });
    rmSync(p.socket, { force: true });
  }
  if (!existsSync(path.join(p.data, "mysql"))) {
    mkdirSync(p.data, { recursive: true });
    const init = spawnSync(
      "mariadb-install-db",
      [`--defaults-file=${p.cnf}`, "--skip-test-db", "--auth-root-authentication-method=socket"],
      { encoding: "utf8" },
    );
    if (init.status !== 0) throw new Error(`mariadb-install-db failed:\n${init.stdout}\n${init.stderr}`);
  }
  if (!pidAlive(p.pid)) {
    const out = openSync(path.join(cfg.dir, "mariadbd.out"), "a");
    const child = spawn("/usr/sbin/mariadbd", [`--defaults-file=${p.cnf}`], {
      detached: true,
      stdio: ["ignore", out, out],
    });
    child.unref();
  }
  const deadline = Date.now() + 30_000;
  while (!isMariaDbUp(cfg)) {
    if (Date.now() > deadline) {
      const log = existsSync(p.log) ? readFileSync(p.log, "utf8").split("\n").slice(-20).join("\n") : "";
      throw new Error(`MariaDB did not become ready on port ${cfg.port}.\n${log}`);
    }
    await sleep(150);
  }
  ensureDatabase(cfg);
}

function ensureDatabase(cfg: MariaDbConfig) {
  const pw = cfg.password.replaceAll("'", "''");
  sql(
    cfg,
    `CREATE DATABASE IF NOT EXISTS \`${cfg.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
     CREATE USER IF NOT EXISTS '${cfg.user}'@'127.0.0.1' IDENTIFIED BY '${pw}';
     ALTER USER '${cfg.user}'@'127.0.0.1' IDENTIFIED BY '${pw}';
     GRANT ALL PRIVILEGES ON \`${cfg.database}\`.* TO '${cfg.user}'@'127.0.0.1';
     FLUSH PRIVILEGES;`,
  );
}

/** A second, empty database the app's user may use (tests of migrations on old data); dropped by dropScratchDatabase. */
export function createScratchDatabase(cfg: MariaDbConfig, name: string) {
  sql(
    cfg,
    `DROP DATABASE IF EXISTS \`${name}\`;
     CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
     GRANT ALL PRIVILEGES ON \`${name}\`.* TO '${cfg.user}'@'127.0.0.1';`,
  );
}

export function dropScratchDatabase(cfg: MariaDbConfig, name: string) {
  sql(cfg, `DROP DATABASE IF EXISTS \`${name}\`;`);
}

/** Drops and recreates the database (tests only). */
export function resetDatabase(cfg: MariaDbConfig) {
  sql(cfg, `DROP DATABASE IF EXISTS \`${cfg.database}\`;`);
  ensureDatabase(cfg);
}

/** Clean shutdown; waits for the pid file to disappear. */
export async function stopMariaDb(cfg: MariaDbConfig): Promise<void> {
  const p = mariaDbPaths(cfg);
  if (!existsSync(p.cnf)) return;
  if (isMariaDbUp(cfg)) admin(cfg, ["shutdown"]);
  const deadline = Date.now() + 30_000;
  while (pidAlive(p.pid)) {
    if (Date.now() > deadline) throw new Error("MariaDB did not stop within 30 s");
    await sleep(100);
  }
}
