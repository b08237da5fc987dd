// The public signed-PDF check through its route handler: each address gets LIMITS.verifyAddress
// checks in the window, then 429 with the JSON error and Retry-After; another address is not held
// back, and a caller cannot escape the count by writing another X-Forwarded-For.
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import { stampedHeaders } from "@/server/client-address";
import { LIMITS } from "@/server/limits";

/** A request as the app server hands it on: the connection's address stamped, the caller's own X-Forwarded-For kept beside. */
async function check(address: string, forged = "10.0.0.1"): Promise<Response> {
  const { POST } = await import("@/app/api/public/verify/route");
  const form = new FormData();
  form.set("file", new File([new TextEncoder().encode("%PDF-1.4 not a signed copy")], "copy.pdf", { type: "application/pdf" }));
  const headers = stampedHeaders(address);
  headers.set("x-forwarded-for", forged);
  return POST(new NextRequest("http://localhost/api/public/verify", { method: "POST", body: form, headers }));
}

describe("POST /api/public/verify", () => {
  it(`answers ${LIMITS.verifyAddress.points} checks from one address, then 429; another address still gets an answer`, async () => {
    const address = `192.0.2.${10 + Math.floor(Math.random() * 200)}`; // RFC 5737 documentation range
    for (let i = 0; i < LIMITS.verifyAddress.points; i++) {
      const res = await check(address, `198.51.100.${i}`); // a new forged hop each time changes nothing
      expect(res.status, `check ${i + 1}`).toBe(200);
      expect(((await res.json()) as { data: { match: boolean } }).data.match).toBe(false);
    }
    const refused = await check(address);
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get("retry-after"))).toBeGreaterThan(9 * 60);
    expect(((await refused.json()) as { error: { code: string; message: string } }).error).toMatchObject({ code: "too_many_verify_address", message: expect.stringMatching(/Try again in 10 minutes/) });
    expect((await check("2001:db8::45")).status).toBe(200);
  });
});
