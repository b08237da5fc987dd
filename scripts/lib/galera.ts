// A 3-node MariaDB Galera cluster on loopback from Debian's packages (mariadb-server brings
// galera-4): each node its own data folder, SQL port and group-communication ports under
// .data/<profile>/galera/db<N>. The first node starts the cluster (or the one Galera marks as
// safe to bootstrap after a clean stop); the others join it one at a time and copy its data
// by rsync state transfer.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { chownSync, existsSync, mkdirSync, openSync, readFileSync, readdirSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";

export type GaleraNode = {
  name: string; // db1, db2, db3
  dir: string;
  sqlPort: number;
  /** Group communication on groupPort; incremental state transfer on +1, full state transfer (rsync) on +2. */
  groupPort: number;
};

export type GaleraCluster = { nodes: GaleraNode[]; database: string; user: string; password: string };

const isRoot = typeof process.getuid === "function" && process.getuid() === 0;

export function nodePaths(node: GaleraNode) {
  return {
    cnf: path.join(node.dir, "my.cnf"),
    data: path.join(node.dir, "data"),
    socket: path.join(node.dir, "mysqld.sock"),
    pid: path.join(node.dir, "mysqld.pid"),
    log: path.join(node.dir, "mysqld.log"),
  };
}

function writeCnf(cluster: GaleraCluster, node: GaleraNode) {
  const p = nodePaths(node);
  const members = cluster.nodes.map((n) => `127.0.0.1:${n.groupPort}`).join(",");
  // As root, the server runs as the mysql user: rsync state transfer refuses to work as root.
  const userLine = isRoot ? "user=mysql\n" : "";
  writeFileSync(
    p.cnf,
    `[client]
socket=${p.socket}
port=${node.sqlPort}

[mariadbd]
${userLine}datadir=${p.data}
socket=${p.socket}
pid-file=${p.pid}
port=${node.sqlPort}
bind-address=127.0.0.1
skip-name-resolve
log-error=${p.log}
character-set-server=utf8mb4
collation-server=utf8mb4_unicode_ci
default-storage-engine=InnoDB
innodb_buffer_pool_size=128M
innodb_flush_log_at_trx_commit=2
max_connections=300
default-time-zone=+00:00
# Galera: row-based replication, interleaved auto-increment locks (both required).
binlog_format=ROW
innodb_autoinc_lock_mode=2
# Galera replicates through the binary log's events: the app's user (not SUPER) may then create
# the triggers its migrations define only when the server trusts trigger creators.
log_bin_trust_function_creators=1
wsrep_on=ON
wsrep_provider=/usr/lib/galera/libgalera_smm.so
wsrep_cluster_name=kilowright
wsrep_cluster_address=gcomm://${members}
wsrep_node_name=${node.name}
wsrep_node_address=127.0.0.1:${node.groupPort}
wsrep_provider_options="base_port=${node.groupPort};ist.recv_addr=127.0.0.1:${node.groupPort + 1};gmcast.listen_addr=tcp://127.0.0.1:${node.groupPort}"
wsrep_sst_receive_address=127.0.0.1:${node.groupPort + 2}
wsrep_sst_method=rsync
`,
  );
}

function chownTree(dir: string) {
  if (!isRoot) return;
  const mysql = spawnSync("id", ["-u", "mysql"], { encoding: "utf8" });
  const group = spawnSync("id", ["-g", "mysql"], { encoding: "utf8" });
  const uid = Number(mysql.stdout.trim());
  const gid = Number(group.stdout.trim());
  const walk = (p: string) => {
    chownSync(p, uid, gid);
    if (statSync(p).isDirectory()) for (const e of readdirSync(p)) walk(path.join(p, e));
  };
  walk(dir);
}

export function nodeSql(node: GaleraNode, statement: string): string {
  const r = spawnSync("mariadb", [`--defaults-file=${nodePaths(node).cnf}`, "-N", "-B", "-e", statement], { encoding: "utf8" });
  if (r.status !== 0) throw new Error(`SQL on ${node.name} failed: ${r.stderr.trim()}`);
  return r.stdout.trim();
}

/** The node's Galera state: "Synced" when it serves reads and writes as a full member. */
export function nodeState(node: GaleraNode): string | null {
  try {
    return nodeSql(node, "SELECT VARIABLE_VALUE FROM information_schema.GLOBAL_STATUS WHERE VARIABLE_NAME = 'WSREP_LOCAL_STATE_COMMENT'") || null;
  } catch {
    return null;
  }
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function waitSynced(node: GaleraNode, timeoutMs = 120_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let state: string | null = null;
  while (Date.now() < deadline) {
    state = nodeState(node);
    if (state === "Synced") return;
    await sleep(300);
  }
  const p = nodePaths(node);
  const log = existsSync(p.log) ? readFileSync(p.log, "utf8").split("\n").slice(-25).join("\n") : "";
  throw new Error(`Galera node ${node.name} (port ${node.sqlPort}) is not Synced after ${timeoutMs / 1000} s (state: ${state ?? "not answering"}).\n${log}`);
}

/** Whether Galera recorded this node as the last one to leave a cleanly stopped cluster. */
function safeToBootstrap(node: GaleraNode): boolean {
  const file = path.join(nodePaths(node).data, "grastate.dat");
  return existsSync(file) && /safe_to_bootstrap:\s*1/.test(readFileSync(file, "utf8"));
}

/** The node's last committed position as Galera wrote it at a clean stop (-1 after a crash, null without data). */
function savedSeqno(node: GaleraNode): number | null {
  const file = path.join(nodePaths(node).data, "grastate.dat");
  if (!existsSync(file)) return null;
  const m = /seqno:\s*(-?\d+)/.exec(readFileSync(file, "utf8"));
  return m ? Number(m[1]) : null;
}

/** After a crash: the position InnoDB holds, from `mariadbd --wsrep-recover` (it writes it to the error log and exits). */
function recoveredSeqno(node: GaleraNode): number {
  const p = nodePaths(node);
  chownTree(node.dir);
  spawnSync("/usr/sbin/mariadbd", [`--defaults-file=${p.cnf}`, "--wsrep-recover"], { encoding: "utf8", timeout: 120_000 });
  const found = existsSync(p.log) ? [...readFileSync(p.log, "utf8").matchAll(/Recovered position: [0-9a-f-]+:(-?\d+)/g)].pop() : undefined;
  return found ? Number(found[1]) : -1;
}

/**
 * The node to start the cluster from: the one Galera marked safe after a clean stop; when every
 * node stopped at once or crashed (none is marked), the most advanced one — its position from
 * grastate.dat, else recovered from InnoDB — which is then marked safe (Galera's documented
 * recovery of a cluster that lost every node: "bootstrap from the node with the highest seqno").
 */
function bootstrapNode(cluster: GaleraCluster): GaleraNode {
  const running = cluster.nodes.find((n) => existsSync(n.dir) && nodeState(n) === "Synced");
  if (running) return running;
  const safe = cluster.nodes.find(safeToBootstrap);
  if (safe) return safe;
  const withData = cluster.nodes.filter((n) => savedSeqno(n) !== null);
  if (withData.length === 0) return cluster.nodes[0];
  for (const n of withData) writeCnf(cluster, n);
  const ranked = withData.map((n) => ({ n, seqno: savedSeqno(n) === -1 ? recoveredSeqno(n) : (savedSeqno(n) as number) })).sort((a, b) => b.seqno - a.seqno);
  const best = ranked[0].n;
  const file = path.join(nodePaths(best).data, "grastate.dat");
  writeFileSync(file, readFileSync(file, "utf8").replace(/safe_to_bootstrap:\s*0/, "safe_to_bootstrap: 1"));
  return best;
}

/** Starts one node's server process (detached, logging to its folder). */
export function startNode(cluster: GaleraCluster, node: GaleraNode, opts: { bootstrap?: boolean } = {}): ChildProcess {
  const p = nodePaths(node);
  mkdirSync(p.data, { recursive: true });
  writeCnf(cluster, node);
  chownTree(node.dir);
  const out = openSync(path.join(node.dir, "mariadbd.out"), "a");
  const child = spawn("/usr/sbin/mariadbd", [`--defaults-file=${p.cnf}`, ...(opts.bootstrap ? ["--wsrep-new-cluster"] : [])], {
    detached: true,
    stdio: ["ignore", out, out],
  });
  child.unref();
  return child;
}

/** The server's pid, from its pid file (null when it is not running). */
export function nodePid(node: GaleraNode): number | null {
  const file = nodePaths(node).pid;
  if (!existsSync(file)) return null;
  const pid = Number(readFileSync(file, "utf8").trim());
  try {
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

/**
 * Starts the cluster: initialises the first node when no node has data, bootstraps from the
 * node Galera marked safe (else the first), then joins the others one at a time. Creates the
 * app's database and user (replicated to every node).
 */
export async function startGalera(cluster: GaleraCluster, log: (line: string) => void = () => undefined): Promise<void> {
  for (const node of cluster.nodes) mkdirSync(node.dir, { recursive: true });
  const first = bootstrapNode(cluster);
  const firstPaths = nodePaths(first);
  if (!existsSync(path.join(firstPaths.data, "mysql"))) {
    mkdirSync(firstPaths.data, { recursive: true });
    writeCnf(cluster, first);
    chownTree(first.dir);
    const init = spawnSync("mariadb-install-db", [`--defaults-file=${firstPaths.cnf}`, "--skip-test-db", "--auth-root-authentication-method=socket"], { encoding: "utf8" });
    if (init.status !== 0) throw new Error(`mariadb-install-db failed for ${first.name}:\n${init.stdout}\n${init.stderr}`);
  }
  if (nodeState(first) !== "Synced") {
    log(`· Galera ${first.name} starts the cluster (SQL port ${first.sqlPort})`);
    startNode(cluster, first, { bootstrap: true });
    await waitSynced(first);
  }
  const pw = cluster.password.replaceAll("'", "''");
  nodeSql(
    first,
    `CREATE DATABASE IF NOT EXISTS \`${cluster.database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
     CREATE USER IF NOT EXISTS '${cluster.user}'@'127.0.0.1' IDENTIFIED BY '${pw}';
     ALTER USER '${cluster.user}'@'127.0.0.1' IDENTIFIED BY '${pw}';
     GRANT ALL PRIVILEGES ON \`${cluster.database}\`.* TO '${cluster.user}'@'127.0.0.1';`,
  );
  for (const node of cluster.nodes) {
    if (node === first || nodeState(node) === "Synced") continue;
    log(`· Galera ${node.name} joins (SQL port ${node.sqlPort})`);
    startNode(cluster, node);
    await waitSynced(node);
  }
}

/** Stops the nodes one by one (the last one stopped is marked safe to start the cluster again). */
export async function stopGalera(cluster: GaleraCluster): Promise<void> {
  for (const node of [...cluster.nodes].reverse()) {
    const pid = nodePid(node);
    if (pid === null) continue;
    spawnSync("mariadb-admin", [`--defaults-file=${nodePaths(node).cnf}`, "shutdown"], { encoding: "utf8" });
    const deadline = Date.now() + 30_000;
    while (nodePid(node) !== null && Date.now() < deadline) await sleep(200);
    if (nodePid(node) !== null) process.kill(pid, "SIGKILL");
  }
}
