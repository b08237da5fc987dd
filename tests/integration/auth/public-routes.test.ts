// Sign-up and accepting an invitation through their route handlers (POST /api/public/sign-up,
// /api/public/invitations/accept): no session, so the origin is checked always (403), a bad body
// is refused naming the field (422), the sign-up limit answers 429 with Retry-After, and an
// accepted invitation leaves the new member signed in (a session row) in the inviting company.
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it } from "vitest";
import { company, membership, session, user } from "@/db/schema";
import { env } from "@/env";
import { stampedHeaders } from "@/server/client-address";
import { db } from "@/server/db";
import { LIMITS } from "@/server/limits";
import { invitePerson } from "@/server/people";
import type { Member } from "@/server/session";
import { newCompany, uniqueEmail } from "../support/fixtures";

type Route = (req: NextRequest) => Promise<Response>;
type ErrorBody = { error: { code: string; message: string; fields?: Record<string, string[]> } };

let signUpRoute: Route;
let acceptRoute: Route;
let owner: Member;

const someAddress = () => `198.51.100.${Math.floor(Math.random() * 250) + 1}`;

function post(route: Route, path: string, body: unknown, opts: { address?: string; origin?: string | null } = {}): Promise<Response> {
  const init: Record<string, string> = { "content-type": "application/json" };
  const origin = opts.origin === undefined ? env().APP_URL : opts.origin;
  if (origin) init.origin = origin;
  const headers = stampedHeaders(opts.address ?? someAddress(), init);
  return route(new NextRequest(`${env().APP_URL}${path}`, { method: "POST", headers, body: JSON.stringify(body) }));
}

async function refusedNaming(res: Response, field: string): Promise<void> {
  expect(res.status).toBe(422);
  const body = (await res.json()) as ErrorBody;
  expect(body.error.code).toBe("validation_failed");
  expect(Object.keys(body.error.fields ?? {})).toContain(field);
}

async function invitationToken(to: string): Promise<string> {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}&limit=1`, {
    headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}` },
  });
  const [mail] = ((await res.json()) as { data: { html: string }[] }).data;
  const match = mail?.html.match(/\/invite\/([A-Za-z0-9_-]+)/);
  if (!match) throw new Error(`no invitation link to ${to}`);
  return match[1];
}

const usersWith = (email: string) => db().select().from(user).where(eq(user.email, email));
const signUpInput = (email: string) => ({ companyName: "Route Founders Solar", name: "Rae Founder", email, password: "route-founder-2026" });

beforeAll(async () => {
  signUpRoute = (await import("@/app/api/public/sign-up/route")).POST;
  acceptRoute = (await import("@/app/api/public/invitations/accept/route")).POST;
  owner = await newCompany("Inviting Route Solar");
});

describe("POST /api/public/sign-up", () => {
  it("makes the company and its owner", async () => {
    const email = uniqueEmail("founder");
    const res = await post(signUpRoute, "/api/public/sign-up", signUpInput(email));
    expect(res.status).toBe(201);
    expect(((await res.json()) as { data: { email: string } }).data.email).toBe(email);
    const [u] = await usersWith(email);
    const [m] = await db().select().from(membership).innerJoin(company, eq(company.id, membership.companyId)).where(eq(membership.userId, u.id));
    expect(m.membership.role).toBe("owner");
    expect(m.company.name).toBe("Route Founders Solar");
  });

  it("refuses a bad body naming the field, and a request from another origin or none (403)", async () => {
    await refusedNaming(await post(signUpRoute, "/api/public/sign-up", { ...signUpInput(uniqueEmail("short")), password: "short" }), "password");
    await refusedNaming(await post(signUpRoute, "/api/public/sign-up", { ...signUpInput("not-an-address") }), "email");
    for (const origin of ["http://attacker.example", null]) {
      const email = uniqueEmail("csrf");
      const res = await post(signUpRoute, "/api/public/sign-up", signUpInput(email), { origin });
      expect(res.status).toBe(403);
      expect(await usersWith(email)).toEqual([]);
    }
  });

  it("answers 429 with Retry-After past the sign-ups an address may make", async () => {
    const address = someAddress();
    for (let i = 0; i < LIMITS.signUpAddress.points; i++) {
      expect((await post(signUpRoute, "/api/public/sign-up", signUpInput(uniqueEmail("many")), { address })).status).toBe(201);
    }
    const email = uniqueEmail("one-too-many");
    const res = await post(signUpRoute, "/api/public/sign-up", signUpInput(email), { address });
    expect(res.status).toBe(429);
    expect(Number(res.headers.get("retry-after"))).toBeGreaterThan(0);
    expect(((await res.json()) as ErrorBody).error.message).toMatch(/^Too many sign-ups from this address\. Try again in \d+ minutes?\.$/);
    expect(await usersWith(email)).toEqual([]);
  });
});

describe("POST /api/public/invitations/accept", () => {
  it("creates the member in the inviting company and signs them in, once", async () => {
    const email = uniqueEmail("joiner");
    await invitePerson(owner, { email, role: "sales_rep", name: "Jo Joiner" });
    const token = await invitationToken(email);
    const body = { token, name: "Jo Joiner", password: "joiner-password-1", confirm: "joiner-password-1" };

    await refusedNaming(await post(acceptRoute, "/api/public/invitations/accept", { ...body, confirm: "something-else" }), "confirm");
    expect((await post(acceptRoute, "/api/public/invitations/accept", body, { origin: "http://attacker.example" })).status).toBe(403);
    expect(await usersWith(email)).toEqual([]);

    const res = await post(acceptRoute, "/api/public/invitations/accept", body);
    expect(res.status).toBe(201);
    const [u] = await usersWith(email);
    const [m] = await db().select().from(membership).where(eq(membership.userId, u.id));
    expect(m).toMatchObject({ companyId: owner.companyId, role: "sales_rep" });
    expect(await db().select().from(session).where(eq(session.userId, u.id))).toHaveLength(1);

    const again = await post(acceptRoute, "/api/public/invitations/accept", { ...body, name: "Second Go" });
    expect(again.status).toBe(410);
    expect(((await again.json()) as ErrorBody).error.code).toBe("invitation_closed");
  });
});
