// The public signed-PDF check through its route handler: each address gets VERIFY_LIMIT.max
// checks in the window, then 429 with the JSON error; another address is not held back.
import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import { VERIFY_LIMIT } from "@/server/public-limit";

async function check(address: string): Promise<Response> {
  const { POST } = await import("@/app/api/public/verify/route");
  const form = new FormData();
  form.set("file", new File([new TextEncoder().encode("%PDF-1.4 not a signed copy")], "copy.pdf", { type: "application/pdf" }));
  return POST(new NextRequest("http://localhost/api/public/verify", { method: "POST", body: form, headers: { "x-forwarded-for": `${address}, 10.0.0.1` } }));
}

describe("POST /api/public/verify", () => {
  it(`answers ${VERIFY_LIMIT.max} checks from one address, then 429; another address still gets an answer`, async () => {
    const address = "192.0.2.44"; // RFC 5737 documentation address
    for (let i = 0; i < VERIFY_LIMIT.max; i++) {
      const res = await check(address);
      expect(res.status, `check ${i + 1}`).toBe(200);
      expect(((await res.json()) as { data: { match: boolean } }).data.match).toBe(false);
    }
    const refused = await check(address);
    expect(refused.status).toBe(429);
    expect(((await refused.json()) as { error: { code: string; message: string } }).error).toMatchObject({ code: "too_many_checks", message: expect.stringMatching(/Try again in 10 minutes/) });
    expect((await check("192.0.2.45")).status).toBe(200);
  });
});
