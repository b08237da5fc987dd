import { expect, test } from "@playwright/test";
import { instance } from "../../scripts/lib/instance";
import { isMariaDbUp, startMariaDb, stopMariaDb } from "../../scripts/lib/mariadb";

test("the database stops and starts under the running app: 503 on health, then recovery by itself", async ({ request, page }) => {
  const inst = instance("test");
  const healthy = await request.get("/api/health");
  expect(healthy.status()).toBe(200);
  const body = await healthy.json();
  expect(body.database.reachable).toBe(true);
  expect(body.migrations.upToDate).toBe(true);
  expect(typeof body.version).toBe("string");

  await stopMariaDb(inst.db);
  try {
    expect(isMariaDbUp(inst.db)).toBe(false);
    const down = await request.get("/api/health");
    expect(down.status()).toBe(503);
    expect((await down.json()).database.reachable).toBe(false);
    const api = await request.get("/api/people");
    expect([401, 503]).toContain(api.status());
  } finally {
    await startMariaDb(inst.db);
  }
  await expect
    .poll(async () => (await request.get("/api/health")).status(), { timeout: 30_000, intervals: [250, 500, 1000] })
    .toBe(200);
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("office@tallgrass.example");
  await page.getByLabel("Password").fill("tallgrass-demo-2026");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/today$/);
});
