// Cross-site requests against the route handlers (issue #14, item 5): a page of another site can
// make the browser send our cookie with a form post or a no-cors fetch. Such a mutation must be
// refused (403 for a foreign or missing Origin, 415 for a text/plain body) before anything is
// written. The signed-in person comes from a stand-in session module, so the session would
// accept the request: only the origin and body checks stand between it and a new lead.
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { household } from "@/db/schema";
import { db } from "@/server/db";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";

const session = vi.hoisted(() => ({ member: null as Member | null }));
vi.mock("@/server/session", async () => {
  const { can } = await import("@/lib/permissions");
  const { forbidden, unauthorized } = await import("@/server/errors");
  return {
    getSession: async () => null,
    getMember: async () => session.member,
    requireMember: async (permission: Parameters<typeof can>[1]) => {
      if (!session.member) throw unauthorized();
      if (!can(session.member.role, permission)) throw forbidden();
      return session.member;
    },
  };
});

const APP_URL = process.env.APP_URL ?? "";
const EVIL = "http://attacker.example";
const COOKIE = "better-auth.session_token=whatever-the-browser-holds";

let dealsRoute: typeof import("@/app/api/deals/route");
let owner: Member;

const lead = (name: string) => ({
  name,
  contactName: "Ada Crossley",
  email: "ada@example.com",
  street: "1 Cross Street",
  city: "Greensboro",
  region: "NC",
  postalCode: "27408",
  latitude: 36.09,
  longitude: -79.82,
  source: "Door to door",
});

async function postLead(name: string, headers: Record<string, string>, body = JSON.stringify(lead(name))) {
  session.member = owner;
  try {
    const res = await dealsRoute.POST(new NextRequest(`${APP_URL}/api/deals`, { method: "POST", headers, body }), { params: Promise.resolve({}) });
    return { status: res.status, body: (await res.json()) as { error?: { code: string; message: string } } };
  } finally {
    session.member = null;
  }
}

const householdsNamed = async (name: string) => db().select().from(household).where(eq(household.name, name));

beforeAll(async () => {
  dealsRoute = await import("@/app/api/deals/route");
  owner = await newCompany("Cross Site Solar");
});

describe("cookie-authenticated mutations (withMember)", () => {
  it("creates a lead from our own origin with a JSON body (the control)", async () => {
    const res = await postLead("Own origin household", { Cookie: COOKIE, Origin: APP_URL, "Content-Type": "application/json" });
    expect(res.status).toBe(201);
    expect(await householdsNamed("Own origin household")).toHaveLength(1);
  });

  it("refuses a foreign Origin with 403 and writes nothing", async () => {
    const res = await postLead("Foreign origin household", { Cookie: COOKIE, Origin: EVIL, "Content-Type": "application/json" });
    expect(res.status).toBe(403);
    expect(res.body.error?.code).toBe("cross_origin");
    expect(await householdsNamed("Foreign origin household")).toHaveLength(0);
  });

  it("refuses a cookie mutation with neither Origin nor Referer (403), and judges a Referer by its origin", async () => {
    const none = await postLead("No origin household", { Cookie: COOKIE, "Content-Type": "application/json" });
    expect(none.status).toBe(403);
    expect(none.body.error?.code).toBe("origin_required");
    const foreignReferer = await postLead("Foreign referer household", { Cookie: COOKIE, Referer: `${EVIL}/page`, "Content-Type": "application/json" });
    expect(foreignReferer.status).toBe(403);
    expect(await householdsNamed("No origin household")).toHaveLength(0);
    expect(await householdsNamed("Foreign referer household")).toHaveLength(0);
  });

  it("refuses a text/plain form body with 415 (even from our own origin) and writes nothing", async () => {
    // What `<form enctype="text/plain">` sends: a CORS "simple" request, no preflight.
    const form = await postLead("Text plain household", { Cookie: COOKIE, Origin: APP_URL, "Content-Type": "text/plain" });
    expect(form.status).toBe(415);
    expect(form.body.error?.message).toContain("application/json");
    const urlencoded = await postLead("Urlencoded household", { Cookie: COOKIE, Origin: APP_URL, "Content-Type": "application/x-www-form-urlencoded" }, "name=Urlencoded+household");
    expect(urlencoded.status).toBe(415);
    const crossSiteForm = await postLead("Cross site form household", { Cookie: COOKIE, Origin: EVIL, "Content-Type": "text/plain" });
    expect(crossSiteForm.status).toBe(403);
    for (const name of ["Text plain household", "Urlencoded household", "Cross site form household"]) expect(await householdsNamed(name)).toHaveLength(0);
  });
});

describe("public customer mutations (/api/public/proposals/<token>/…)", () => {
  it("refuses a question posted from another origin, or with no origin, and stores nothing", async () => {
    const route = await import("@/app/api/public/proposals/[token]/question/route");
    const token = "x".repeat(43); // the origin is judged before the token is looked up
    const ctx = { params: Promise.resolve({ token }) };
    const send = (headers: Record<string, string>) =>
      route.POST(new NextRequest(`${APP_URL}/api/public/proposals/${token}/question`, { method: "POST", headers, body: JSON.stringify({ question: "Is this real?" }) }), ctx);
    const foreign = await send({ Origin: EVIL, "Content-Type": "application/json" });
    expect(foreign.status).toBe(403);
    const none = await send({ "Content-Type": "application/json" });
    expect(none.status).toBe(403);
    const textPlain = await send({ Origin: APP_URL, "Content-Type": "text/plain" });
    expect(textPlain.status).toBe(415);
    // Our own page with an unknown token gets as far as the token: not found.
    expect((await send({ Origin: APP_URL, "Content-Type": "application/json" })).status).toBe(404);
  });

  it("refuses the Pay button from another origin", async () => {
    const route = await import("@/app/api/public/proposals/[token]/deposit/route");
    const token = "y".repeat(43);
    const res = await route.POST(new Request(`${APP_URL}/api/public/proposals/${token}/deposit`, { method: "POST", headers: { Origin: EVIL } }), { params: Promise.resolve({ token }) });
    expect(res.status).toBe(403);
  });
});
