// `npm run cluster`: Kilowright as it runs on several machines, here on loopback — a 3-node
// MariaDB Galera cluster, two app nodes behind HAProxy, files in S3-compatible storage, the
// dev outbox and payments fakes. Ctrl-C stops all of it. See docs/scaling.md.
import path from "node:path";
import { clusterInstance } from "./lib/cluster-instance";
import { startCluster, stopCluster } from "./lib/cluster";
import { DEMO_PASSWORD } from "./lib/seed-demo";

const c = clusterInstance("cluster");
let stopping = false;

async function shutdown(code: number) {
  if (stopping) return;
  stopping = true;
  console.log("\n· stopping the app nodes, the balancer, the fakes, storage and the Galera nodes…");
  await stopCluster(c).catch((err) => console.error(err));
  process.exit(code);
}
process.on("SIGINT", () => void shutdown(0));
process.on("SIGTERM", () => void shutdown(0));
process.on("SIGHUP", () => void shutdown(0)); // the terminal closed: stop cleanly rather than leave it to the guardian

try {
  await startCluster(c);
  console.log(`
Kilowright (cluster) is running: ${c.appUrl}
  app nodes ${c.ports.appNodes.map((p) => `127.0.0.1:${p}`).join(", ")} behind HAProxy (stats: http://127.0.0.1:${c.ports.stats}/)
  Galera nodes ${c.galera.nodes.map((n) => `${n.name} 127.0.0.1:${n.sqlPort}`).join(", ")}; the app writes through 127.0.0.1:${c.ports.dbFront}
  files in S3-compatible storage at ${c.s3.endpoint} (bucket ${c.s3.bucket})
Demo accounts as in \`npm run demo\` (password ${DEMO_PASSWORD}).
Logs: ${path.relative(process.cwd(), c.logDir)}/  ·  Ctrl-C stops everything.`);
} catch (err) {
  console.error(`\nThe cluster could not start: ${err instanceof Error ? err.message : String(err)}`);
  await shutdown(1);
}
