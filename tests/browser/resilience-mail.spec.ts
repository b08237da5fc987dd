// Mail that follows a commit survives the app being killed: the app process is killed (SIGKILL)
// right after a signing commits, while the mail service refuses the copies, and after a restart
// both e-mails go out, once each. Also: with real mail settings the dev outbox is not there (404).
//
// These tests start their own app processes (`next start` on the production build, on free ports,
// against the test database and the dev outbox) so they can kill and restart them; the app that
// `npm test` started keeps running. Its mail worker shares the database, so it may be the one that
// sends after the restart: either way, nothing the killed process held in memory was needed.
import { spawn, type ChildProcess } from "node:child_process";
import { once } from "node:events";
import { createServer } from "node:net";
import path from "node:path";
import sharp from "sharp";
import { expect, test, type APIRequestContext, type APIResponse } from "@playwright/test";
import { DEMO_PASSWORD, unique, waitForMail, withDb } from "./support";

const RATE_PLAN_ID = "7a11a55e-0000-4000-8000-000000002011";
const MODULE_ID = "7a11a55e-0000-4000-8000-000000001001";
const INVERTER_ID = "7a11a55e-0000-4000-8000-000000001011";
const NEXT_BIN = path.join(process.cwd(), "node_modules/next/dist/bin/next");

type OwnApp = { url: string; child: ChildProcess; output: string[] };

async function freePort(): Promise<number> {
  const server = createServer();
  server.listen(0, "127.0.0.1");
  await once(server, "listening");
  const { port } = server.address() as { port: number };
  server.close();
  await once(server, "close");
  return port;
}

/** `next start` on `port` with the test instance's settings, changed by `env` (undefined removes a variable). */
async function startOwnApp(port: number, env: Record<string, string | undefined> = {}): Promise<OwnApp> {
  const url = `http://127.0.0.1:${port}`;
  const merged: Record<string, string | undefined> = { ...process.env, APP_URL: url, NODE_ENV: "production", NEXT_TELEMETRY_DISABLED: "1", ...env };
  const childEnv = { ...merged, NODE_ENV: "production" } as NodeJS.ProcessEnv;
  for (const [k, v] of Object.entries(merged)) if (v === undefined) delete childEnv[k];
  const child = spawn(process.execPath, [NEXT_BIN, "start", "-H", "127.0.0.1", "-p", String(port)], { env: childEnv, stdio: ["ignore", "pipe", "pipe"] });
  const output: string[] = [];
  child.stdout?.on("data", (d: Buffer) => output.push(d.toString()));
  child.stderr?.on("data", (d: Buffer) => output.push(d.toString()));
  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the app exited at start (${child.exitCode}):\n${output.join("")}`);
    const up = await fetch(`${url}/api/health`).then((r) => r.status === 200, () => false);
    if (up) return { url, child, output };
    await new Promise((r) => setTimeout(r, 500));
  }
  child.kill("SIGKILL");
  throw new Error(`the app did not answer on ${url} within 90 s:\n${output.join("")}`);
}

async function stopOwnApp(app: OwnApp | null, signal: NodeJS.Signals = "SIGTERM"): Promise<void> {
  if (!app || app.child.exitCode !== null || app.child.signalCode !== null) return;
  const exited = once(app.child, "exit");
  app.child.kill(signal);
  await exited;
}

async function signInAt(request: APIRequestContext, appUrl: string, email: string): Promise<void> {
  const res = await request.post(`${appUrl}/api/auth/sign-in/email`, { data: { email, password: DEMO_PASSWORD }, headers: { Origin: appUrl } });
  expect(res.status(), await res.text()).toBe(200);
}

async function ok<T>(res: APIResponse): Promise<T> {
  expect(res.ok(), `${res.url()} → ${res.status()} ${await res.text()}`).toBe(true);
  return ((await res.json()) as { data: T }).data;
}

/** Makes the dev outbox refuse every send (503) until `refuse(false)`. */
async function refuse(on: boolean): Promise<void> {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/faults`, {
    method: on ? "POST" : "DELETE",
    headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}`, "Content-Type": "application/json" },
    body: on ? JSON.stringify({ refuseNext: 100_000 }) : undefined,
  });
  expect(res.status).toBe(200);
}

async function mailCount(to: string, subject: RegExp): Promise<number> {
  const res = await fetch(`${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}&limit=200`, { headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}` } });
  const { data } = (await res.json()) as { data: { subject: string }[] };
  return data.filter((m) => subject.test(m.subject)).length;
}

/** A deal of the demo rep with a year of bills, a design and one cash offer, sent as a proposal to a fresh address. */
async function sentProposal(rep: APIRequestContext, appUrl: string, household: string): Promise<{ email: string; token: string }> {
  const email = `${unique("killtest")}@homeowner.example`;
  const { dealId } = await ok<{ dealId: string }>(
    await rep.post(`${appUrl}/api/deals`, {
      data: { name: household, contactName: "Ines Kill", email, street: "3 Larkspur Bend", city: "Greensboro", region: "NC", postalCode: "27408", latitude: 36.09, longitude: -79.82, source: "Door to door", ratePlanId: RATE_PLAN_ID },
    }),
  );
  const kwh = [1150, 990, 870, 730, 800, 1110, 1320, 1280, 1020, 770, 830, 1070];
  const bills = kwh.map((k, m) => ({ periodStart: new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10), periodEnd: new Date(Date.UTC(2025, m + 1, 0)).toISOString().slice(0, 10), kwh: k }));
  await ok(await rep.put(`${appUrl}/api/deals/${dealId}/bills`, { data: { bills } }));
  await ok(await rep.put(`${appUrl}/api/deals/${dealId}/service-panel`, { data: { serviceBusbarA: 200, serviceMainBreakerA: 200, serviceVoltageV: 240 } }));
  const faces = [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 20, solarAccessPct: 95, moduleCount: 18 }];
  await ok(await rep.put(`${appUrl}/api/designs`, { data: { dealId, document: { moduleId: MODULE_ID, inverterId: INVERTER_ID, faces, weather: { kind: "nearest" }, stringPlan: { stringSizes: [9, 9], lowestTempC: -10, highestTempC: 35 } } } }));
  await ok(await rep.post(`${appUrl}/api/offers`, { data: { dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } } }));
  await ok(await rep.post(`${appUrl}/api/proposals`, { data: { dealId, toEmail: email } }));
  const link = await waitForMail(email, /solar proposal/);
  const token = /\/p\/([A-Za-z0-9_-]{43})/.exec(link.html ?? "")?.[1];
  if (!token) throw new Error("no proposal link in the e-mail");
  return { email, token };
}

test("the app is killed right after a signing commits; after a restart both copies go out, once each", async ({ playwright }) => {
  test.setTimeout(300_000);
  const port = await freePort();
  let app: OwnApp | null = await startOwnApp(port);
  // A browser on the app's own pages sends their origin with every change (checked by the app).
  const rep = await playwright.request.newContext({ extraHTTPHeaders: { Origin: app.url } });
  const customer = await playwright.request.newContext();
  try {
    await signInAt(rep, app.url, "rep@tallgrass.example");
    const household = `Killtest ${unique("hh")} household`;
    const { email, token } = await sentProposal(rep, app.url, household);
    const api = `${app.url}/api/public/proposals/${token}`;
    await ok(await customer.post(`${api}/code`, { headers: { Origin: app.url } }));
    const code = /Your signing code: (\d{6})/.exec((await waitForMail(email, /Your signing code/)).subject)?.[1];
    await ok(await customer.post(`${api}/verify-code`, { data: { code }, headers: { Origin: app.url } }));
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="300" height="100"><path d="M10 70 C 60 10, 90 90, 140 40 S 220 80, 290 30" stroke="#1F2933" stroke-width="3" fill="none"/></svg>`;
    const signaturePng = `data:image/png;base64,${(await sharp(Buffer.from(svg)).png().toBuffer()).toString("base64")}`;

    // The mail service refuses from now on, so the copies cannot leave before the kill.
    await refuse(true);
    try {
      const signed = await customer.post(`${api}/sign`, { data: { position: 1, signerName: "Ines Kill", consent: true, signaturePng }, headers: { Origin: app.url } });
      expect(signed.status(), await signed.text()).toBe(201);
      await stopOwnApp(app, "SIGKILL");
      app = null;

      const rows = await withDb(async (conn) => {
        const [r] = await conn.query(
          "SELECT m.kind, m.status FROM outbound_mail m JOIN proposal p ON m.idempotency_key IN (CONCAT('signed-copy-customer-', p.id), CONCAT('signed-copy-rep-', p.id)) WHERE p.sent_to_email = ? ORDER BY m.kind",
          [email],
        );
        return r as { kind: string; status: string }[];
      });
      expect(rows).toEqual([
        { kind: "signed-copy-customer", status: "pending" },
        { kind: "signed-copy-rep", status: "pending" },
      ]);
      expect(await mailCount(email, /Your signed agreement/)).toBe(0);

      app = await startOwnApp(port);
    } finally {
      await refuse(false);
    }
    // The worker's back-off after the refused first try is 5 s; it looks every 3 s.
    await waitForMail(email, /Your signed agreement/, 60_000);
    await waitForMail("rep@tallgrass.example", new RegExp(`^Signed: the ${household}`), 60_000);
    expect(await mailCount(email, /Your signed agreement/)).toBe(1);
    expect(await mailCount("rep@tallgrass.example", new RegExp(`^Signed: the ${household}`))).toBe(1);
  } finally {
    await rep.dispose();
    await customer.dispose();
    await stopOwnApp(app);
    await refuse(false);
  }
});

test("with real mail settings (no RESEND_BASE_URL) the dev outbox answers 404, also to an owner", async ({ playwright }) => {
  test.setTimeout(180_000);
  const app = await startOwnApp(await freePort(), { RESEND_BASE_URL: undefined });
  const owner = await playwright.request.newContext();
  try {
    await signInAt(owner, app.url, "owner@tallgrass.example");
    const res = await owner.get(`${app.url}/dev/outbox`, { maxRedirects: 0 });
    expect(res.status()).toBe(404);
    expect(await res.text()).not.toContain("No access");
    const today = await owner.get(`${app.url}/today`);
    expect(today.status()).toBe(200);
    expect(await today.text()).not.toContain("Dev outbox");
  } finally {
    await owner.dispose();
    await stopOwnApp(app);
  }
});
