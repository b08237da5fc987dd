// No account discovery: sign-up, password reset and invitations answer the same way, in about the
// same time, whether the e-mail has an account (here or in another company) or not; better-auth's
// bare sign-up endpoint is refused, so nobody is left without a company. Real better-auth, the
// test MariaDB and the dev outbox.
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { membership, user } from "@/db/schema";
import { env } from "@/env";
import { auth } from "@/server/auth";
import { stampedHeaders } from "@/server/client-address";
import { db } from "@/server/db";
import { invitePerson } from "@/server/people";
import type { Member } from "@/server/session";
import { signUp } from "@/server/sign-up";
import { newCompany, uniqueEmail } from "../support/fixtures";

const someAddress = () => `192.0.2.${Math.floor(Math.random() * 250) + 1}`;

function post(path: string, body: unknown, address: string): Promise<Response> {
  const headers = stampedHeaders(address, { "content-type": "application/json", origin: env().APP_URL });
  return auth().handler(new Request(`${env().APP_URL}/api/auth${path}`, { method: "POST", headers, body: JSON.stringify(body) }));
}

async function mailTo(to: string): Promise<{ subject: string }[]> {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}&limit=50`, { headers: { Authorization: `Bearer ${env().RESEND_API_KEY}` } });
  return ((await res.json()) as { data: { subject: string }[] }).data;
}

async function waitForMail(to: string, subject: RegExp): Promise<void> {
  const deadline = Date.now() + 10_000;
  while (Date.now() < deadline) {
    if ((await mailTo(to)).some((m) => subject.test(m.subject))) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail "${subject}" to ${to}`);
}

/**
 * Median times (ms) of `n` runs each of `known` and `unknown`, taken in turns so a busy moment
 * of the machine weighs on both alike; the median keeps one slow outlier from deciding.
 */
async function medians(n: number, known: (i: number) => Promise<unknown>, unknown: (i: number) => Promise<unknown>): Promise<{ known: number; unknown: number }> {
  const times = { known: [] as number[], unknown: [] as number[] };
  const time = async (f: () => Promise<unknown>) => {
    const t = performance.now();
    await f();
    return performance.now() - t;
  };
  for (let i = 0; i < n; i++) {
    times.known.push(await time(() => known(i)));
    times.unknown.push(await time(() => unknown(i)));
  }
  const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  return { known: median(times.known), unknown: median(times.unknown) };
}

let other: Member;
beforeAll(async () => {
  other = await newCompany("Another Solar Co");
});

describe("sign-up", () => {
  it("refuses better-auth's bare sign-up endpoint (a person without a company): 404, nobody stored", async () => {
    const email = uniqueEmail("bare");
    const res = await post("/sign-up/email", { name: "Bea Bare", email, password: "bare-password-2026" }, someAddress());
    expect(res.status).toBe(404);
    expect(await db().select().from(user).where(eq(user.email, email))).toEqual([]);
  });

  it("answers an existing e-mail like a new one, makes no second company, and mails its owner instead", async () => {
    const fresh = uniqueEmail("fresh");
    const input = (email: string) => ({ companyName: "Sunny Side Energy", name: "Sam Signup", email, password: "signup-password-2026" });
    const created = await signUp(input(fresh), stampedHeaders(someAddress()));
    const again = await signUp(input(other.email), stampedHeaders(someAddress()));
    expect(again).toEqual({ email: other.email });
    expect(created).toEqual({ email: fresh });
    // the new address has its person and company; the known one still has only its own
    const [newcomer] = await db().select({ id: user.id }).from(user).where(eq(user.email, fresh));
    expect(await db().select().from(membership).where(eq(membership.userId, newcomer.id))).toHaveLength(1);
    expect(await db().select().from(membership).where(eq(membership.userId, other.userId))).toHaveLength(1);
    await waitForMail(other.email, /already have a Kilowright account/);
    await waitForMail(fresh, /Confirm your e-mail/);
  });

  it("takes about the same time for a known and an unknown e-mail", async () => {
    const { known, unknown } = await medians(
      7,
      () => signUp({ companyName: "Timing Co", name: "Tim Ing", email: other.email, password: "timing-password-2026" }, stampedHeaders(someAddress())),
      () => signUp({ companyName: "Timing Co", name: "Tim Ing", email: uniqueEmail("timing"), password: "timing-password-2026" }, stampedHeaders(someAddress())),
    );
    console.info(`sign-up median: known ${known.toFixed(1)} ms, unknown ${unknown.toFixed(1)} ms`);
    expect(Math.abs(known - unknown)).toBeLessThan(Math.max(40, 0.5 * Math.max(known, unknown))); // generous: a password hash is ~50–100 ms here
  });
});

describe("password reset", () => {
  it("answers the same, in about the same time, for a known and an unknown e-mail", async () => {
    const address = someAddress();
    const ask = (email: string) => post("/request-password-reset", { email, redirectTo: "/reset-password" }, address);
    const a = await ask(other.email);
    const b = await ask(uniqueEmail("ghost"));
    expect(a.status).toBe(b.status);
    expect(await a.json()).toEqual(await b.json());
    // each e-mail gets its own turns (3 per 15 minutes), so timing uses fresh ones
    const knownPeople = await Promise.all(Array.from({ length: 7 }, () => newCompany("Reset Timing Co")));
    const { known, unknown } = await medians(
      7,
      (i) => post("/request-password-reset", { email: knownPeople[i].email }, someAddress()),
      () => post("/request-password-reset", { email: uniqueEmail("ghost") }, someAddress()),
    );
    console.info(`reset median: known ${known.toFixed(1)} ms, unknown ${unknown.toFixed(1)} ms`);
    expect(Math.abs(known - unknown)).toBeLessThan(Math.max(30, 0.5 * Math.max(known, unknown))); // generous: measured 2–25 ms apart on a busy 2-core machine
  });
});

describe("invitations", () => {
  it("answer an address of another company like a new one, in about the same time", async () => {
    const inviter = await newCompany("Inviting Solar");
    const elsewhere = await Promise.all(Array.from({ length: 7 }, () => newCompany("Elsewhere Solar")));
    const taken = await invitePerson(inviter, { email: other.email, role: "sales_rep" });
    expect(taken).toEqual({ id: expect.any(String) });
    const { known, unknown } = await medians(
      7,
      (i) => invitePerson(inviter, { email: elsewhere[i].email, role: "crew" }),
      () => invitePerson(inviter, { email: uniqueEmail("invitee"), role: "crew" }),
    );
    console.info(`invitation median: known ${known.toFixed(1)} ms, unknown ${unknown.toFixed(1)} ms`);
    expect(Math.abs(known - unknown)).toBeLessThan(Math.max(30, 0.5 * Math.max(known, unknown)));
  });
});
