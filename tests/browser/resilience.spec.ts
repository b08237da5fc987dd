import { expect, test } from "@playwright/test";
import { instance } from "../../scripts/lib/instance";
import { isMariaDbUp, startMariaDb, stopMariaDb } from "../../scripts/lib/mariadb";
import { apiSignIn } from "./support";

test("the database stops and starts under the running app: 503 with a short page or JSON body, then recovery by itself", async ({ request, page }) => {
  const inst = instance("test");
  const healthy = await request.get("/api/health");
  expect(healthy.status()).toBe(200);
  const body = await healthy.json();
  expect(body.database.reachable).toBe(true);
  expect(body.migrations.upToDate).toBe(true);
  expect(typeof body.version).toBe("string");

  // A signed-in API client, so its request reaches the database (without a cookie it is simply 401).
  await apiSignIn(request, "owner@tallgrass.example");

  await stopMariaDb(inst.db);
  try {
    expect(isMariaDbUp(inst.db)).toBe(false);
    const down = await request.get("/api/health");
    expect(down.status()).toBe(503);
    const downText = await down.text();
    expect(JSON.parse(downText).database.reachable).toBe(false);
    // Reachable or not, and nothing an attacker could use: no host, port or driver error text.
    for (const secret of ["127.0.0.1", "localhost", String(inst.ports.db), "ECONNREFUSED", "connect", "error"]) expect(downText).not.toContain(secret);

    // Pages and sign-in: a short "we'll be back" page with 503, not a 500 or an error page with 200.
    await expect
      .poll(async () => (await request.get("/sign-in")).status(), { timeout: 10_000 })
      .toBe(503);
    const signInPage = await request.get("/sign-in");
    expect(signInPage.headers()["content-type"]).toContain("text/html");
    expect(signInPage.headers()["retry-after"]).toBeDefined();
    expect(await signInPage.text()).toContain("We'll be back shortly");
    const shown = await page.goto("/today");
    expect(shown?.status()).toBe(503);
    await expect(page.getByRole("heading", { name: "We'll be back shortly" })).toBeVisible();

    // The API answers with its JSON error body: sign-in itself and a staff route.
    const signIn = await request.post("/api/auth/sign-in/email", { data: { email: "office@tallgrass.example", password: "tallgrass-demo-2026" } });
    expect(signIn.status()).toBe(503);
    expect(await signIn.json()).toMatchObject({ error: { code: "database_unavailable" } });
    const api = await request.get("/api/people");
    expect(api.status(), await api.text()).toBe(503);
    expect(await api.json()).toMatchObject({ error: { code: "database_unavailable" } });
  } finally {
    await startMariaDb(inst.db);
  }
  await expect
    .poll(async () => (await request.get("/api/health")).status(), { timeout: 30_000, intervals: [250, 500, 1000] })
    .toBe(200);
  // Pages follow within a second: the proxy's liveness answer is kept that long (src/server/db-liveness.ts).
  await expect
    .poll(async () => (await request.get("/sign-in")).status(), { timeout: 5_000, intervals: [250, 500] })
    .toBe(200);
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("office@tallgrass.example");
  await page.getByLabel("Password").fill("tallgrass-demo-2026");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/today$/);
});
