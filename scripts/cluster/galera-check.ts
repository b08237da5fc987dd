// A Galera-aware health check for the balancer, one per database node: answers 200 on
// GALERA_CHECK_PORT while the node is a Synced member of the cluster's primary component
// (wsrep_local_state 4, wsrep_ready ON), 503 otherwise — a node that is still joining,
// donating its data, or cut off from the others takes no application traffic. The same idea
// as the "clustercheck" scripts commonly run beside Galera nodes (common practice).
import http from "node:http";
import mysql from "mysql2/promise";

const port = Number(process.env.GALERA_CHECK_PORT);
const socketPath = process.env.GALERA_NODE_SOCKET;
if (!port || !socketPath) throw new Error("GALERA_CHECK_PORT and GALERA_NODE_SOCKET are required");

async function synced(): Promise<string | null> {
  // A fresh connection per check (once a second): a pooled one would hide a restarted server.
  const conn = await mysql.createConnection({ socketPath, user: "root", connectTimeout: 800 });
  try {
    const [rows] = await conn.query("SELECT VARIABLE_NAME AS n, VARIABLE_VALUE AS v FROM information_schema.GLOBAL_STATUS WHERE VARIABLE_NAME IN ('WSREP_LOCAL_STATE', 'WSREP_READY')");
    const status = Object.fromEntries((rows as { n: string; v: string }[]).map((r) => [r.n, r.v]));
    if (status.WSREP_LOCAL_STATE === "4" && status.WSREP_READY === "ON") return null;
    return `wsrep_local_state ${status.WSREP_LOCAL_STATE ?? "?"}, wsrep_ready ${status.WSREP_READY ?? "?"}`;
  } finally {
    await conn.end().catch(() => undefined);
  }
}

http
  .createServer((_req, res) => {
    synced()
      .then((why) => {
        res.writeHead(why ? 503 : 200, { "content-type": "text/plain" }).end(why ?? "synced\n");
      })
      .catch((err: unknown) => {
        res.writeHead(503, { "content-type": "text/plain" }).end(`not answering: ${err instanceof Error ? err.message : String(err)}\n`);
      });
  })
  .listen(port, "127.0.0.1");
