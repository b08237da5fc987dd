// Starting and stopping the fakes' HTTP servers, the same way for each.
import type { Server } from "node:http";
import type { AddressInfo } from "node:net";

/** Listens on host:port (0: a free port) and answers the server's own URL. */
export async function listenOn(server: Server, port: number, host: string): Promise<string> {
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const actualPort = (server.address() as AddressInfo).port;
  return `http://${host.includes(":") ? `[${host}]` : host}:${actualPort}`;
}

/** Stops listening and drops open connections (kept-alive clients would hold it open). */
export function closeServer(server: Server): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    server.close((err) => (err ? reject(err) : resolve()));
    server.closeAllConnections();
  });
}
