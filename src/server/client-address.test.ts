import { describe, expect, it } from "vitest";
import { clientAddress, clientAddressOf, compileTrust, stampClientAddress, stampedHeaders } from "./client-address";

const req = (peer: string, xff?: string) => ({ headers: xff === undefined ? {} : { "x-forwarded-for": xff }, socket: { remoteAddress: peer } });

describe("the client address rule", () => {
  it("trusts no proxy by default: a forged X-Forwarded-For is ignored, the socket peer counts", () => {
    const none = compileTrust("");
    expect(clientAddressOf(req("203.0.113.7", "198.51.100.1"), none)).toBe("203.0.113.7");
    expect(clientAddressOf(req("::ffff:203.0.113.7", "1.2.3.4, 5.6.7.8"), none)).toBe("203.0.113.7");
    expect(clientAddressOf(req("2001:DB8::1"), none)).toBe("2001:db8::1");
  });

  it("behind trusted proxies takes the right-most hop that is not a trusted proxy", () => {
    const trust = compileTrust("10.0.0.5, 10.1.0.0/16");
    // caller wrote "1.1.1.1"; the edge proxy 10.1.2.3 appended the real peer 198.51.100.9; the
    // inner proxy 10.0.0.5 appended 10.1.2.3 and connected to us.
    expect(clientAddressOf(req("10.0.0.5", "1.1.1.1, 198.51.100.9, 10.1.2.3"), trust)).toBe("198.51.100.9");
    // from an untrusted peer the header means nothing
    expect(clientAddressOf(req("192.0.2.50", "1.1.1.1"), trust)).toBe("192.0.2.50");
    // a trusted proxy without a header is itself the client
    expect(clientAddressOf(req("10.0.0.5"), trust)).toBe("10.0.0.5");
  });

  it("refuses a malformed proxy list", () => {
    expect(() => compileTrust("10.0.0.5, not-an-address")).toThrow();
  });

  it("the app reads only the address its own server stamped", () => {
    const headers: Record<string, string | string[] | undefined> = { "x-kilowright-client": "6.6.6.6", "x-kilowright-client-proof": "guess" };
    expect(clientAddress(new Headers(headers as Record<string, string>))).toBe("unknown");
    stampClientAddress(headers, "203.0.113.7");
    expect(clientAddress(new Headers(headers as Record<string, string>))).toBe("203.0.113.7");
    expect(clientAddress(stampedHeaders("192.0.2.1"))).toBe("192.0.2.1");
    expect(clientAddress(new Headers({ "x-forwarded-for": "6.6.6.6" }))).toBe("unknown");
  });
});
