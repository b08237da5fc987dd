// The Kilowright app server: Next.js behind a plain Node HTTP server (Next's documented custom
// server API), so the client address is taken from the connection before Next sees the request.
// Next itself keeps a caller's X-Forwarded-For as it came and offers App Router handlers no
// socket address; here the address is computed by the rule in src/server/client-address.ts
// (TRUSTED_PROXIES) and handed to the app in a private header.
//
//   node --import tsx scripts/app-server.ts -H 127.0.0.1 -p 3000     (after `next build`)
import { createServer } from "node:http";
import { parseArgs } from "node:util";
import next from "next";
import { env } from "../src/env";
import { clientAddressOf, compileTrust, stampClientAddress } from "../src/server/client-address";

const { values } = parseArgs({
  options: { hostname: { type: "string", short: "H", default: "127.0.0.1" }, port: { type: "string", short: "p", default: "3000" } },
});
const hostname = values.hostname;
const port = Number(values.port);
if (!Number.isInteger(port) || port < 1 || port > 65535) throw new Error(`-p must be a port number (got "${values.port}")`);

const trust = compileTrust(env().TRUSTED_PROXIES);
const app = next({ dev: false, dir: process.cwd(), hostname, port });
const handle = app.getRequestHandler();
await app.prepare();

const server = createServer((req, res) => {
  stampClientAddress(req.headers, clientAddressOf(req, trust));
  void handle(req, res);
});
server.listen(port, hostname, () => console.log(`Kilowright listening on http://${hostname}:${port}`));

function stop() {
  server.close(() => process.exit(0));
  server.closeAllConnections();
  setTimeout(() => process.exit(0), 5_000).unref();
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
