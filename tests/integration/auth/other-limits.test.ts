// Every other limit of limits.ts answers 429 with the wait named (and Retry-After on HTTP): sign-up,
// forgot-password, verification re-sends, invitations, proposal questions and signing codes.
// (/verify: tests/integration/proposals/verify-limit.test.ts.)
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { env } from "@/env";
import type { MailFake } from "@/fakes/mail-server";
import { auth } from "@/server/auth";
import { stampedHeaders } from "@/server/client-address";
import { HttpError } from "@/server/errors";
import { LIMITS, TooManyRequests } from "@/server/limits";
import { invitePerson } from "@/server/people";
import { signUp } from "@/server/sign-up";
import { newCompany, uniqueEmail } from "../support/fixtures";
import { latestToken, newDeal, newWorld, startMailIfNeeded, type World } from "../proposals/support";

const someAddress = () => `203.0.113.${Math.floor(Math.random() * 250) + 1}`;

function post(path: string, body: unknown, address: string): Promise<Response> {
  const headers = stampedHeaders(address, { "content-type": "application/json", origin: env().APP_URL });
  return auth().handler(new Request(`${env().APP_URL}/api/auth${path}`, { method: "POST", headers, body: JSON.stringify(body) }));
}

async function refusal(p: Promise<unknown>): Promise<TooManyRequests> {
  const err = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(err).toBeInstanceOf(TooManyRequests);
  expect((err as HttpError).status).toBe(429);
  return err as TooManyRequests;
}

async function expect429(res: Response, message: RegExp): Promise<void> {
  expect(res.status).toBe(429);
  expect(Number(res.headers.get("retry-after"))).toBeGreaterThan(0);
  const body = (await res.json()) as { message?: string; error?: { message: string } };
  expect(body.message ?? body.error?.message).toMatch(message);
}

let fake: MailFake | null = null;
let w: World;
beforeAll(async () => {
  fake = await startMailIfNeeded();
  w = await newWorld("Limits Solar");
}, 180_000);
afterAll(async () => {
  await fake?.close();
});

describe("limits naming the wait", () => {
  it("sign-up: 5 an hour from one address", async () => {
    const address = someAddress();
    const input = () => ({ companyName: "Many Signups Co", name: "Manny Signup", email: uniqueEmail("many"), password: "many-signups-2026" });
    for (let i = 0; i < LIMITS.signUpAddress.points; i++) await signUp(input(), stampedHeaders(address));
    const err = await refusal(signUp(input(), stampedHeaders(address)));
    expect(err.message).toMatch(/^Too many sign-ups from this address\. Try again in \d+ minutes?\.$/);
  });

  it("forgot-password: 3 links per e-mail in 15 minutes, known or not", async () => {
    for (const email of [(await newCompany()).email, uniqueEmail("nobody")]) {
      for (let i = 0; i < LIMITS.resetEmail.points; i++) expect((await post("/request-password-reset", { email }, someAddress())).status).toBe(200);
      await expect429(await post("/request-password-reset", { email }, someAddress()), /try again in \d+ minutes?\.$/);
    }
  });

  it("verification e-mail re-sends: 3 per e-mail in 15 minutes", async () => {
    const email = uniqueEmail("unconfirmed");
    for (let i = 0; i < LIMITS.verificationEmail.points; i++) expect((await post("/send-verification-email", { email }, someAddress())).status).toBe(200);
    await expect429(await post("/send-verification-email", { email }, someAddress()), /ask again in \d+ minutes?\.$/);
  });

  it("invitation e-mails: 3 an hour to one address", async () => {
    const email = uniqueEmail("invitee");
    for (let i = 0; i < LIMITS.invitationEmail.points; i++) await invitePerson(w.owner, { email, role: "crew", replace: true });
    const err = await refusal(invitePerson(w.owner, { email, role: "crew", replace: true }));
    expect(err.message).toMatch(/Try again in \d+ minutes?\.$/);
  });

  it("proposal questions: 20 an hour on one link, then 429 over HTTP", async () => {
    const d = await newDeal(w);
    const { sendProposal } = await import("@/server/proposals");
    await sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
    const token = await latestToken(d.email);
    const { POST } = await import("@/app/api/public/proposals/[token]/question/route");
    const ask = (i: number) =>
      POST(new NextRequest(`http://localhost/api/public/proposals/${token}/question`, { method: "POST", headers: stampedHeaders(someAddress(), { "content-type": "application/json", origin: env().APP_URL }), body: JSON.stringify({ question: `Question number ${i}?` }) }), {
        params: Promise.resolve({ token }),
      });
    for (let i = 0; i < LIMITS.questionLink.points; i++) expect((await ask(i)).status, `question ${i + 1}`).toBeLessThan(300);
    await expect429(await ask(99), /Try again in \d+ minutes?, or call them\.$/);
  });

  it("signing codes: a second at once is refused naming the seconds, over HTTP", async () => {
    const d = await newDeal(w);
    const { sendProposal } = await import("@/server/proposals");
    await sendProposal(w.rep, { dealId: d.dealId, toEmail: d.email, inHomeSale: true });
    const token = await latestToken(d.email);
    const { POST } = await import("@/app/api/public/proposals/[token]/code/route");
    const send = () => POST(new NextRequest(`http://localhost/api/public/proposals/${token}/code`, { method: "POST", headers: stampedHeaders(someAddress(), { origin: env().APP_URL }) }), { params: Promise.resolve({ token }) });
    const both = await Promise.all([send(), send(), send()]);
    expect(both.map((r) => r.status).sort()).toEqual([201, 429, 429]);
    await expect429(both.find((r) => r.status === 429)!, /ask again in \d+ seconds\.$/);
  });
});
