// Who is on the other end of a request: the one rule for the client address, and the one place
// app code reads it. The app server (scripts/app-server.ts) computes the address from the
// socket before Next sees the request and hands it on in a private header; the caller's own
// X-Forwarded-For counts only when it came through a proxy listed in TRUSTED_PROXIES.
//
// No `import "server-only"` here: the app server loads this file in plain Node, outside the
// React server bundle (where that marker package throws). Nothing in the browser imports it.
import { randomBytes, timingSafeEqual } from "node:crypto";
import proxyaddr from "proxy-addr";

/** The private header carrying the address (any copy a caller sends is removed first). */
export const CLIENT_HEADER = "x-kilowright-client";
/** Proof that the header was set by this process's app server and not by a caller. */
const PROOF_HEADER = "x-kilowright-client-proof";

type Trust = (addr: string, i: number) => boolean;

/**
 * Parses TRUSTED_PROXIES: a comma list of addresses or CIDR ranges (and proxy-addr's names
 * `loopback`, `linklocal`, `uniquelocal`). Empty trusts no proxy. Throws on a bad entry.
 */
export function compileTrust(list: string | undefined): Trust {
  const entries = (list ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  return proxyaddr.compile(entries);
}

type RequestLike = { headers: Record<string, string | string[] | undefined>; socket: { remoteAddress?: string } };

/**
 * The client address of a request: the socket's peer, or, when that peer is a trusted proxy,
 * the right-most X-Forwarded-For hop that is not a trusted proxy (the left part of the header
 * is whatever the caller wrote, so it never counts). As in proxy-addr and RFC 7239 §5.2.
 */
export function clientAddressOf(req: RequestLike, trust: Trust): string {
  if (!req.socket.remoteAddress) return "unknown";
  const addr = proxyaddr(req as unknown as Parameters<typeof proxyaddr>[0], trust);
  return normalize(addr);
}

/** IPv4 peers of a dual-stack socket arrive as ::ffff:a.b.c.d; the certificate shows a.b.c.d. */
function normalize(addr: string): string {
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/i.exec(addr);
  return (mapped ? mapped[1] : addr).toLowerCase();
}

// One random proof per process, made on first use and shared by the app server and the app
// code of this process (same globalThis). A caller cannot know it, so a request reaching the
// app some other way (e.g. plain `next start`) never has a trusted address.
const globalForProof = globalThis as unknown as { kilowrightClientProof?: string };
function proof(): string {
  globalForProof.kilowrightClientProof ??= randomBytes(24).toString("base64url");
  return globalForProof.kilowrightClientProof;
}

/** Sets the private headers on an incoming request (removing any copy the caller sent). */
export function stampClientAddress(headers: Record<string, string | string[] | undefined>, address: string): void {
  delete headers[CLIENT_HEADER];
  delete headers[PROOF_HEADER];
  headers[CLIENT_HEADER] = address;
  headers[PROOF_HEADER] = proof();
  // Libraries that read X-Forwarded-For (Next fills it only when absent) see the same address.
  headers["x-forwarded-for"] = address;
}

/** The same on a Fetch Headers object (tests that call route handlers directly). */
export function stampedHeaders(address: string, init?: HeadersInit): Headers {
  const h = new Headers(init);
  h.set(CLIENT_HEADER, address);
  h.set(PROOF_HEADER, proof());
  h.set("x-forwarded-for", address);
  return h;
}

export type ClientMeta = { ip: string; userAgent: string };

/** Only what the app server stamped counts; anything else is an unknown address. */
export function clientAddress(headers: Headers): string {
  const given = headers.get(PROOF_HEADER);
  const expected = Buffer.from(proof());
  const ok = given !== null && Buffer.byteLength(given) === expected.length && timingSafeEqual(Buffer.from(given), expected);
  const address = ok ? headers.get(CLIENT_HEADER)?.trim() : undefined;
  return address ? address.slice(0, 64) : "unknown";
}

/** The caller's address (from the connection) and browser (as the browser names itself). */
export function clientMeta(headers: Headers): ClientMeta {
  return { ip: clientAddress(headers), userAgent: (headers.get("user-agent") ?? "unknown").slice(0, 500) };
}
