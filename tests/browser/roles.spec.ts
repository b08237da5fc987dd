import { expect, test } from "@playwright/test";
import { apiSignIn, signIn, alertOf } from "./support";

// Sections each demo role sees (src/lib/sections.ts and the permission table in src/lib/permissions.ts).
const ROLES = [
  { email: "owner@tallgrass.example", label: "Owner", sections: ["Today", "Deals", "Board", "Jobs", "Catalog", "Price book", "Utilities", "Rate plans", "Weather", "Settings", "Dev outbox"] },
  { email: "admin@tallgrass.example", label: "Admin", sections: ["Today", "Deals", "Board", "Jobs", "Catalog", "Price book", "Utilities", "Rate plans", "Weather", "Settings", "Dev outbox"] },
  { email: "office@tallgrass.example", label: "Office manager", sections: ["Today", "Deals", "Board", "Jobs", "Catalog", "Price book", "Utilities", "Rate plans", "Weather"] },
  { email: "rep@tallgrass.example", label: "Sales rep", sections: ["Today", "Deals", "Board", "Catalog", "Price book", "Utilities", "Rate plans", "Weather"] },
  { email: "crew@tallgrass.example", label: "Installer crew", sections: ["Today", "Jobs"] },
];

for (const role of ROLES) {
  test(`${role.label} signs in and sees their sections`, async ({ page }) => {
    await signIn(page, role.email);
    await expect(page.getByTestId("role-label")).toHaveText(role.label);
    const nav = page.getByRole("navigation", { name: "Sections" });
    await expect(nav.getByRole("link")).toHaveText(role.sections);
  });
}

test("a sales rep sees only their own deals; the office sees all", async ({ browser }) => {
  const rep = await (await browser.newContext()).newPage();
  await signIn(rep, "rep@tallgrass.example");
  await rep.goto("/deals");
  await expect(rep.getByRole("heading", { name: "Your deals" })).toBeVisible();
  const repRows = await rep.locator("tbody tr").count();
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office@tallgrass.example");
  await office.goto("/deals");
  await expect(office.getByRole("heading", { name: "Deals", exact: true })).toBeVisible();
  const officeRows = await office.locator("tbody tr").count();
  expect(repRows).toBeGreaterThan(0);
  expect(officeRows).toBeGreaterThan(repRows);
});

test("a sales rep cannot open Settings → People, and the people API answers 403", async ({ page, request }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/settings/people");
  await expect(alertOf(page)).toContainText("No access to Settings → People");

  await apiSignIn(request, "rep@tallgrass.example");
  const res = await request.get("/api/people");
  expect(res.status()).toBe(403);
  const body = await res.json();
  expect(body.error.code).toBe("forbidden");
  expect(typeof body.error.message).toBe("string");
  const invite = await request.post("/api/people", { data: { email: "x@example.com", role: "admin" } });
  expect(invite.status()).toBe(403);
});

test("without a session the API answers 401 with a JSON error", async ({ playwright }) => {
  const anonymous = await playwright.request.newContext({ baseURL: process.env.APP_URL });
  const res = await anonymous.get("/api/people");
  expect(res.status()).toBe(401);
  expect((await res.json()).error.code).toBe("unauthorized");
  await anonymous.dispose();
});

test("Today shows the office the stalled deals, and a rep only their own", async ({ browser }) => {
  // The demo's Galloway household has been in Survey for 19 days (limit 14, src/lib/stage-rules.ts);
  // it belongs to rep@.
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office@tallgrass.example");
  await expect(office.getByTestId("stalled-deals")).toContainText("Galloway household");
  const rep2 = await (await browser.newContext()).newPage();
  await signIn(rep2, "rep2@tallgrass.example");
  await expect(rep2.getByRole("heading", { name: /Good day/ })).toBeVisible();
  await expect(rep2.getByText("Galloway household")).toHaveCount(0);
});
