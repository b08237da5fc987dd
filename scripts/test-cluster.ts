// `npm run test:cluster`: the cluster under faults. A fresh local cluster (profile
// cluster-test: 3 Galera nodes, HAProxy, 2 app nodes, S3-compatible storage, the fakes); while
// autocannon reads the deals table and the Board through the balancer, writers make leads and
// stage moves, and homeowners sign sent proposals and pay their deposits through the dev
// payments server (scripts/lib/cluster-homeowners.ts), the writer's database node is killed
// with SIGKILL, then an app node, then both are started again. Afterwards:
// - every write the app acknowledged (201/200) is in the database, on every node (0 lost):
//   leads, moves, signatures, deposits the page showed as paid, and every payment the
//   payments fake took once its webhooks (and their retries) were delivered;
// - nothing was recorded twice: a lead, a stage move, a signature, a paid payment, a ledger
//   row, a deposit booking, a job (0 duplicates);
// - the restarted database node rejoined (Synced, cluster size 3) and holds the same rows;
// - the failed requests of each window (kill → recovered) are counted and reported.
// Exits 1 when a write is lost or doubled or the node did not rejoin. Figures in
// .data/cluster-test/results.json (docs/scaling.md quotes them).
import { createRequire } from "node:module";
import { writeFileSync } from "node:fs";
import path from "node:path";
import mysql from "mysql2/promise";
import { clusterInstance } from "./lib/cluster-instance";
import { prepareCluster, startAppNodeOf, startCluster, stopCluster } from "./lib/cluster";
import { nodePid, startNode, waitSynced } from "./lib/galera";
import { DEMO_PASSWORD } from "./lib/seed-demo";
import { checkMoney, homeownerWriter, providerPaidSessions, seedSentProposals, settleDeliveries, type Homeowner, type MoneyCheck, type Outcome } from "./lib/cluster-homeowners";

const c = clusterInstance("cluster-test");
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const t0 = Date.now();
const at = () => (Date.now() - t0) / 1000;
const log = (line: string) => console.log(`[${at().toFixed(1).padStart(6)} s] ${line}`);

/** Sent proposals waiting for the homeowners: more than two homeowners sign and pay in the run. */
const SENT_PROPOSALS = 60;
const outcomes: Outcome[] = [];
const windows: { name: string; from: number; to: number }[] = [];

async function signIn(email: string): Promise<string> {
  const res = await fetch(`${c.appUrl}/api/auth/sign-in/email`, {
    method: "POST",
    headers: { "content-type": "application/json", origin: c.appUrl },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  if (!res.ok) throw new Error(`sign-in as ${email} failed: HTTP ${res.status} ${await res.text()}`);
  return res.headers.getSetCookie().map((v) => v.split(";")[0]).join("; ");
}

type Acked = { dealId: string; name: string; lost: boolean };

/** One writer: a lead, then (every other lead) a move to Lost; each acknowledged write is kept. */
async function writer(cookie: string, id: number, until: () => boolean, acked: Acked[]) {
  const headers = { "content-type": "application/json", origin: c.appUrl, cookie };
  for (let n = 0; !until(); n++) {
    const name = `Faultline household w${id}-${n}`;
    const lead = {
      name, contactName: "Pat Faultline", street: `${n} Failover Lane`, city: "Greensboro", region: "NC", postalCode: "27401",
      latitude: 36.07, longitude: -79.79, source: "Referral",
    };
    try {
      const res = await fetch(`${c.appUrl}/api/deals`, { method: "POST", headers, body: JSON.stringify(lead), signal: AbortSignal.timeout(15_000) });
      outcomes.push({ at: at(), ok: res.status === 201, what: "lead", status: res.status });
      if (res.status !== 201) { await sleep(200); continue; }
      const { dealId } = ((await res.json()) as { data: { dealId: string } }).data;
      const record: Acked = { dealId, name, lost: false };
      acked.push(record);
      if (n % 2 === 1) {
        const move = await fetch(`${c.appUrl}/api/deals/${record.dealId}/stage`, { method: "PATCH", headers, body: JSON.stringify({ stage: "lost", reason: "fault test" }), signal: AbortSignal.timeout(15_000) });
        outcomes.push({ at: at(), ok: move.status === 200, what: "move", status: move.status });
        if (move.status === 200) record.lost = true;
      }
    } catch (err) {
      outcomes.push({ at: at(), ok: false, what: "write", status: err instanceof Error ? err.name : "error" });
      await sleep(200);
    }
  }
}

type AutocannonInstance = PromiseLike<{ requests: { total: number; average: number }; errors: number; non2xx: number }> & {
  on(event: "response", cb: (client: unknown, status: number, bytes: number, ms: number) => void): void;
  on(event: "reqError", cb: (err: Error) => void): void;
  stop(): void;
};

/** Readers: the deals table API and the Board page, 10 connections at 40 requests/s in all, until stopped. */
function readers(cookie: string): AutocannonInstance {
  const autocannon = createRequire(import.meta.url)("autocannon") as (o: Record<string, unknown>) => AutocannonInstance;
  const inst = autocannon({
    url: c.appUrl,
    connections: 10,
    overallRate: 40,
    duration: 3600,
    timeout: 10,
    requests: [
      { method: "GET", path: "/api/deals/table?page=1&pageSize=50", headers: { cookie } },
      { method: "GET", path: "/board", headers: { cookie } },
    ],
  });
  inst.on("response", (_c, status) => outcomes.push({ at: at(), ok: status < 400, what: "read", status }));
  inst.on("reqError", (err) => outcomes.push({ at: at(), ok: false, what: "read", status: err.name }));
  return inst;
}

async function nodeConn(port: number) {
  return mysql.createConnection({ host: "127.0.0.1", port, user: c.galera.user, password: c.galera.password, database: c.galera.database });
}

// long because: one scripted fault scenario, step by step, then its checks
async function main(): Promise<boolean> {
  await prepareCluster(c, ["galera", "s3", "outbox", "payments", "files", "logs"], log);
  await startCluster(c, log);
  const cookie = await signIn("office@tallgrass.example");
  const homeowners = await seedSentProposals(c.appEnv.DATABASE_URL, SENT_PROPOSALS);
  log(`· ${homeowners.length} sent proposals for the homeowners`);
  let stop = false;
  const acked: Acked[] = [];
  const queue = [...homeowners];
  const env = { appUrl: c.appUrl, mailUrl: c.mailUrl, mailKey: c.secrets.resendKey, record: (o: Omit<Outcome, "at">) => outcomes.push({ at: at(), ...o }) };
  const writers = [
    ...[1, 2, 3, 4].map((id) => writer(cookie, id, () => stop, acked)),
    ...[1, 2, 3].map(() => homeownerWriter(env, queue, () => stop)),
  ];
  const load = readers(cookie);
  const steady = at();
  await sleep(8_000);
  windows.push({ name: "before any fault", from: steady, to: at() });

  const db1 = c.galera.nodes[0];
  const dbPid = nodePid(db1);
  if (dbPid === null) throw new Error("db1 is not running");
  log(`kill -9 database node ${db1.name} (the balancer's writer, pid ${dbPid})`);
  const dbKill = at();
  process.kill(dbPid, "SIGKILL");
  await sleep(12_000);
  windows.push({ name: `database node ${db1.name} killed`, from: dbKill, to: at() });

  log("kill -9 app node 1");
  const appKill = at();
  const app1 = await appNodePid(c.ports.appNodes[0]);
  process.kill(app1, "SIGKILL");
  await sleep(10_000);
  windows.push({ name: "app node 1 killed", from: appKill, to: at() });

  log(`restart ${db1.name} (rejoins by state transfer) and app node 1`);
  const restart = at();
  startNode(c.galera, db1);
  startAppNodeOf(c, 0);
  await waitSynced(db1);
  for (let i = 0; i < 180 && !(await healthy(c.ports.appNodes[0])); i++) await sleep(500);
  windows.push({ name: "restarts", from: restart, to: at() });
  log("both back; load continues 8 s");
  const after = at();
  await sleep(8_000);
  windows.push({ name: "after recovery", from: after, to: at() });
  stop = true;
  load.stop();
  await Promise.all(writers);
  await load;
  const deliveries = await settleDeliveries(c.paymentsUrl, 60_000);
  await sleep(2_000); // let the last replicated writes apply everywhere
  const providerPaid = await providerPaidSessions(c.paymentsUrl, c.secrets.stripeKey);
  return verify(acked, { homeowners, providerPaid, deliveries });
}

async function healthy(port: number): Promise<boolean> {
  try {
    return (await fetch(`http://127.0.0.1:${port}/api/health`, { signal: AbortSignal.timeout(1_000) })).ok;
  } catch {
    return false;
  }
}

/** The pid of the process listening on an app node's port (the app server under its tsx wrapper). */
async function appNodePid(port: number): Promise<number> {
  const { execFileSync } = await import("node:child_process");
  const out = execFileSync("ss", ["-Hltnp", `sport = :${port}`], { encoding: "utf8" });
  const pid = Number(/pid=(\d+)/.exec(out)?.[1]);
  if (!pid) throw new Error(`no process listens on ${port}`);
  return pid;
}

/** Median and longest of a list of seconds. */
function spread(values: number[]): { median: number; longest: number } | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  return { median: Number(sorted[Math.floor(sorted.length / 2)].toFixed(1)), longest: Number(sorted[sorted.length - 1].toFixed(1)) };
}

function countBy<T>(items: T[], key: (item: T) => string): Record<string, number> {
  const out: Record<string, number> = {};
  for (const item of items) out[key(item)] = (out[key(item)] ?? 0) + 1;
  return out;
}

type Money = { homeowners: Homeowner[]; providerPaid: { paymentId: string }[]; deliveries: Awaited<ReturnType<typeof settleDeliveries>> };

// long because: every check of the run and the report, in one place
async function verify(acked: Acked[], money: Money): Promise<boolean> {
  const ids = acked.map((a) => a.dealId);
  const perNode: Record<string, { lost: number; wrongStage: number; deals: number; checksum: string; state: string; size: string; money: MoneyCheck }> = {};
  let duplicates = 0;
  for (const node of c.galera.nodes) {
    const conn = await nodeConn(node.sqlPort);
    const [rows] = ids.length ? await conn.query("SELECT id, CAST(stage AS CHAR) AS stage FROM deal WHERE id IN (?)", [ids]) : [[]];
    const found = new Map((rows as { id: string; stage: string }[]).map((r) => [r.id, r.stage]));
    const [dupRows] = await conn.query("SELECT name, COUNT(*) AS n FROM household WHERE name LIKE 'Faultline household %' GROUP BY name HAVING n > 1");
    const [moves] = ids.length
      ? await conn.query("SELECT deal_id, COUNT(*) AS n FROM timeline_event WHERE kind = 'stage.moved' AND deal_id IN (?) GROUP BY deal_id HAVING n > 1", [ids])
      : [[]];
    const [[count]] = (await conn.query("SELECT COUNT(*) AS n FROM deal")) as unknown as [[{ n: number }]];
    const [[sum]] = (await conn.query("CHECKSUM TABLE deal")) as unknown as [[{ Checksum: string }]];
    const [status] = await conn.query("SHOW STATUS WHERE Variable_name IN ('wsrep_local_state_comment', 'wsrep_cluster_size')");
    const st = Object.fromEntries((status as { Variable_name: string; Value: string }[]).map((r) => [r.Variable_name, r.Value]));
    duplicates += (dupRows as unknown[]).length + (moves as unknown[]).length;
    perNode[node.name] = {
      lost: acked.filter((a) => !found.has(a.dealId)).length,
      wrongStage: acked.filter((a) => a.lost && found.get(a.dealId) !== "lost").length,
      deals: Number(count.n),
      checksum: String(sum.Checksum),
      state: st.wsrep_local_state_comment,
      size: st.wsrep_cluster_size,
      money: await checkMoney(conn, money.homeowners, money.providerPaid),
    };
    await conn.end();
  }
  const failedIn = (w: { from: number; to: number }) => outcomes.filter((o) => !o.ok && o.at >= w.from && o.at < w.to);
  const countIn = (w: { from: number; to: number }) => outcomes.filter((o) => o.at >= w.from && o.at < w.to).length;
  const report = {
    acknowledgedLeads: acked.length,
    acknowledgedMoves: acked.filter((a) => a.lost).length,
    homeowners: {
      sentProposals: money.homeowners.length,
      taken: money.homeowners.filter((h) => h.taken).length,
      signedAcknowledged201: money.homeowners.filter((h) => h.signed === "201").length,
      signedSeenAfterLostAnswer: money.homeowners.filter((h) => h.signed === "409").length,
      depositsShownPaid: money.homeowners.filter((h) => h.paid).length,
      secondsFromProposalToPaid: spread(money.homeowners.flatMap((h) => (h.paidAfterMs === undefined ? [] : [h.paidAfterMs / 1000]))),
      paymentsTakenByProvider: money.providerPaid.length,
      webhooks: money.deliveries,
    },
    requests: outcomes.length,
    failed: outcomes.filter((o) => !o.ok).length,
    windows: windows.map((w) => ({ ...w, requests: countIn(w), failed: failedIn(w).length, kinds: countBy(failedIn(w), (o) => `${o.what} ${o.status}`) })),
    perNode,
    duplicates,
  };
  writeFileSync(path.join(c.dir, "results.json"), JSON.stringify(report, null, 2));
  console.log(JSON.stringify(report, null, 2));
  const nodes = Object.values(perNode);
  const ok =
    acked.length > 0 &&
    money.homeowners.some((h) => h.paid) &&
    money.deliveries.notDelivered === 0 &&
    nodes.every((n) => n.lost === 0 && n.wrongStage === 0 && n.state === "Synced" && n.size === "3" && Object.values(n.money).every((v) => v === 0)) &&
    new Set(nodes.map((n) => `${n.deals}/${n.checksum}`)).size === 1 &&
    duplicates === 0;
  console.log(ok ? "\n✓ cluster fault test: 0 lost (leads, moves, signatures, deposits), 0 duplicates (incl. payments, ledger rows, jobs), every node Synced with the same rows" : "\n✗ cluster fault test failed (see above)");
  return ok;
}

let passed = false;
try {
  passed = await main();
} catch (err) {
  console.error(err);
} finally {
  await stopCluster(c).catch((err) => console.error(err));
}
process.exit(passed ? 0 : 1);
