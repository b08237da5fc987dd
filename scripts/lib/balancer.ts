// The balancer of the local cluster: Debian's HAProxy, one process with two fronts.
// - Database (TCP): one writer at a time. db1 takes every connection while its Galera check
//   says Synced; db2, then db3, are backups that take over when it is not. One writer avoids
//   most certification conflicts (two nodes committing to the same rows); the app retries the
//   few that remain. When a node is marked down its open connections are cut, so the app's
//   pool reconnects through the balancer to the next node at once; a connection refused by a
//   killed node marks it down at once and is passed on to the next node. When db1 is back, new
//   connections go to it while pooled ones stay on the backup until they idle out: for that
//   while two nodes take writes, and Galera's certification (retried by the app) keeps them
//   consistent.
// - App (HTTP): round-robin over the `next start` nodes, no stickiness (any node serves any
//   request: sessions live in MariaDB), /api/health as the active check; a request is sent to
//   another node only when its connection could not be made (never re-sent once it reached a
//   node, so a payment or a signature is never submitted twice by the balancer).
import { writeFileSync } from "node:fs";
import path from "node:path";
import type { ClusterInstance } from "./cluster-instance";

export function haproxyConfig(c: ClusterInstance): string {
  const db = c.galera.nodes
    .map((n, i) => `  server ${n.name} 127.0.0.1:${n.sqlPort} check port ${c.ports.healthChecks[i]}${i === 0 ? "" : " backup"}`)
    .join("\n");
  const apps = c.ports.appNodes.map((p, i) => `  server app${i + 1} 127.0.0.1:${p} check`).join("\n");
  return `global
  maxconn 4096
  # The runtime API (take a node out and back: the cluster benchmark's "1 app node" case).
  stats socket ${path.join(c.dir, "haproxy.sock")} mode 600 level admin
  log stdout format raw local0 warning

defaults
  log global
  timeout connect 2s
  timeout client 1h
  timeout server 1h
  retries 2

listen stats
  mode http
  bind 127.0.0.1:${c.ports.stats}
  stats enable
  stats uri /

frontend mariadb
  mode tcp
  bind 127.0.0.1:${c.ports.dbFront}
  default_backend galera

backend galera
  mode tcp
  option httpchk GET /
  http-check expect status 200
  # A killed node refuses connections at once (RST) before its check fails (≈ 1–2 s): the
  # first refused or timed-out connection marks it down (observe layer4, error-limit 1,
  # on-error mark-down), and the connection is retried on the next node rather than handed
  # back closed (option redispatch 1: every retry goes through the balancing again, so to the
  # backup once the node is down). Only connections are retried, never a query.
  option redispatch 1
  default-server inter 1s fastinter 500ms fall 2 rise 3 on-marked-down shutdown-sessions observe layer4 error-limit 1 on-error mark-down
${db}

frontend app
  mode http
  bind 127.0.0.1:${c.ports.front}
  option forwardfor
  timeout client 60s
  default_backend next

backend next
  mode http
  balance roundrobin
  timeout server 60s
  option httpchk GET /api/health
  http-check expect status 200
  option redispatch
  retry-on conn-failure
  # A node busy with a burst answers its check late rather than not at all: 3 s to answer,
  # 3 misses in a row (≈ 6–9 s) before it is taken out; a refused connection (a dead node)
  # is noticed at the next check. At most 32 requests at a time per node, the rest wait in
  # HAProxy's queue (up to 10 s) instead of piling onto a busy process.
  timeout check 3s
  timeout queue 10s
  default-server inter 2s fastinter 1s fall 3 rise 2 maxconn 32
${apps}
`;
}

export function writeHaproxyConfig(c: ClusterInstance): string {
  const file = path.join(c.dir, "haproxy.cfg");
  writeFileSync(file, haproxyConfig(c));
  return file;
}
