// Request bodies are capped before they are read (src/server/body-limit.ts): a body over its
// route's cap answers 413 with the JSON error naming the limit, whether it declares its
// Content-Length or comes chunked, and the stream is not read to its end.
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { deal, household } from "@/db/schema";
import { BODY_CAPS, type BodyCap } from "@/server/body-limit";
import { db } from "@/server/db";
import { newCompany } from "../support/fixtures";
import { signedInHeaders } from "../support/sign-in";

const CHUNK = 64 * 1024;

/** A body of `chunks` × 64 kB handed out one chunk per pull, counting how many were taken. */
function countingBody(chunks: number) {
  let handed = 0;
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        if (handed >= chunks) return controller.close();
        handed++;
        controller.enqueue(new Uint8Array(CHUNK).fill(0x7b)); // "{"
      },
    },
    { highWaterMark: 0 },
  );
  return { stream, handed: () => handed, total: chunks * CHUNK };
}

type Case = { declare: boolean };
const cases: Case[] = [{ declare: true }, { declare: false }];

function request(url: string, body: ReturnType<typeof countingBody>, opts: Case & { headers?: Record<string, string> }) {
  const headers: Record<string, string> = { ...opts.headers };
  if (opts.declare) headers["content-length"] = String(body.total);
  return new NextRequest(`http://localhost${url}`, { method: "POST", body: body.stream, headers, duplex: "half" } as ConstructorParameters<typeof NextRequest>[1]);
}

/** Chunks over the cap, so a reader that stops at the cap has left most of them unread. */
const chunksOver = (cap: BodyCap) => Math.ceil((cap.bytes * 2) / CHUNK) + 4;
/** At most the chunks that fit under the cap plus the one that crossed it. */
const readAtMost = (cap: BodyCap) => Math.ceil(cap.bytes / CHUNK) + 1;

async function expect413(res: Response, cap: BodyCap, body: ReturnType<typeof countingBody>, declared: boolean) {
  expect(res.status).toBe(413);
  const json = (await res.json()) as { error: { code: string; message: string } };
  expect(json.error).toEqual({ code: "body_too_large", message: cap.message });
  expect(json.error.message).toMatch(/up to \d+(\.\d)? MB/);
  // Declared too large: not a byte is read. Chunked: reading stops at the cap.
  if (declared) expect(body.handed()).toBe(0);
  else expect(body.handed()).toBeLessThanOrEqual(readAtMost(cap));
  expect(body.handed()).toBeLessThan(chunksOver(cap));
}

let cookieHeaders: Record<string, string>;
let dealId: string;

beforeAll(async () => {
  const owner = await newCompany("Body Cap Solar");
  cookieHeaders = await signedInHeaders(owner);
  const householdId = crypto.randomUUID();
  dealId = crypto.randomUUID();
  await db().insert(household).values({ id: householdId, companyId: owner.companyId, name: "Capped household", street: "1 Cap Road", city: "Testville", region: "NC", postalCode: "27000", latitude: 36, longitude: -79.8 });
  await db().insert(deal).values({ id: dealId, companyId: owner.companyId, householdId, ownerUserId: owner.userId, stage: "lead", source: "Referral" });
});

describe.each(cases)("a body over its cap (Content-Length declared: $declare)", ({ declare }) => {
  it(`the Stripe webhook answers 413 past ${BODY_CAPS.webhook.bytes} bytes`, async () => {
    const { POST } = await import("@/app/api/webhooks/stripe/route");
    const body = countingBody(chunksOver(BODY_CAPS.webhook));
    const res = await POST(request("/api/webhooks/stripe", body, { declare, headers: { "content-type": "application/json", "stripe-signature": "t=1,v1=00" } }));
    await expect413(res, BODY_CAPS.webhook, body, declare);
  });

  it("a JSON route (new lead) answers 413 past the JSON cap", async () => {
    const { POST } = await import("@/app/api/deals/route");
    const body = countingBody(chunksOver(BODY_CAPS.json));
    const res = await POST(request("/api/deals", body, { declare, headers: { ...cookieHeaders, "content-type": "application/json" } }), { params: Promise.resolve({}) });
    await expect413(res, BODY_CAPS.json, body, declare);
  });

  it("sign-in answers 413 past the auth cap", async () => {
    const { POST } = await import("@/app/api/auth/[...all]/route");
    const body = countingBody(chunksOver(BODY_CAPS.auth));
    const res = await POST(request("/api/auth/sign-in/email", body, { declare, headers: { "content-type": "application/json", origin: cookieHeaders.origin } }));
    await expect413(res, BODY_CAPS.auth, body, declare);
  });

  it("/verify answers 413 past its PDF size", async () => {
    const { POST } = await import("@/app/api/public/verify/route");
    const body = countingBody(chunksOver(BODY_CAPS.verify));
    const res = await POST(request("/api/public/verify", body, { declare, headers: { "content-type": "multipart/form-data; boundary=x" } }));
    await expect413(res, BODY_CAPS.verify, body, declare);
  });

  it("a deal upload answers 413 past its kind's size", async () => {
    const { POST } = await import("@/app/api/deals/[id]/uploads/route");
    const body = countingBody(chunksOver(BODY_CAPS.dealUpload));
    const res = await POST(request(`/api/deals/${dealId}/uploads`, body, { declare, headers: { ...cookieHeaders, "content-type": "multipart/form-data; boundary=x" } }), { params: Promise.resolve({ id: dealId }) });
    await expect413(res, BODY_CAPS.dealUpload, body, declare);
  });

  it("a site photo answers 413 past the photo size", async () => {
    const { POST } = await import("@/app/api/deals/[id]/site-photos/route");
    const body = countingBody(chunksOver(BODY_CAPS.photo));
    const res = await POST(request(`/api/deals/${dealId}/site-photos`, body, { declare, headers: { ...cookieHeaders, "content-type": "multipart/form-data; boundary=x" } }), { params: Promise.resolve({ id: dealId }) });
    await expect413(res, BODY_CAPS.photo, body, declare);
  });
});

describe("a body under its cap", () => {
  it("is read whole and handled (sign-in with a wrong password answers 401, not 413)", async () => {
    const { POST } = await import("@/app/api/auth/[...all]/route");
    const res = await POST(
      new NextRequest("http://localhost/api/auth/sign-in/email", {
        method: "POST",
        body: JSON.stringify({ email: "nobody-cap@integration.example", password: "wrong-password-123" }),
        headers: { "content-type": "application/json", origin: cookieHeaders.origin },
      }),
    );
    expect(res.status).toBe(401);
  });
});
