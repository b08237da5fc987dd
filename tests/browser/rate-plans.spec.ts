import { expect, test } from "@playwright/test";
import { apiSignIn, signIn, unique } from "./support";

test("an admin creates a time-of-use plan and sees the engine's sample bill", async ({ page }) => {
  const name = unique("Evening TOU");
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/rate-plans");
  await expect(page.getByRole("link", { name: "Residential Time-of-Use RT-2" })).toBeVisible();
  await page.getByRole("link", { name: "New rate plan" }).click();
  await expect(page.getByRole("heading", { name: "New rate plan" })).toBeVisible();

  await page.getByLabel("Utility").selectOption({ label: "Piedmont Electric Cooperative" });
  await page.getByLabel("Plan name").fill(name);
  await page.getByLabel("Fixed charge ($ / month)").fill("14");
  await page.getByRole("radio", { name: "Time-of-use" }).check();
  await page.locator("#period-0-price").fill("19");
  await page.locator("#period-1-price").fill("11.5");
  await page.getByRole("radio", { name: "Net billing" }).check();
  await page.getByLabel("Export credit (¢/kWh)").fill("6");

  // The preview bills 900 kWh a month through the engine as the plan is edited.
  const average = page.getByTestId("preview-average");
  await expect(average).toHaveText(/^\$\d{2,3}\.\d{2}$/);
  const dollars = Number((await average.textContent())!.replace(/[$,]/g, ""));
  // Between all-off-peak and all-on-peak: 14 + 900 × 0.115 = 117.50 and 14 + 900 × 0.19 = 185.
  expect(dollars).toBeGreaterThan(117.5);
  expect(dollars).toBeLessThan(185);
  await expect(page.getByTestId("preview-lines")).toContainText("On-peak");

  await page.getByRole("button", { name: "Create rate plan" }).click();
  await expect(page).toHaveURL(/\/rate-plans\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { name, level: 1 })).toBeVisible();
  await expect(page.getByTestId("preview-average")).toHaveText(`$${dollars.toFixed(2)}`);

  await page.goto("/rate-plans");
  await expect(page.getByRole("link", { name })).toBeVisible();
});

test("a season left without months is named and nothing is created", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/rate-plans/new");
  await page.getByLabel("Utility").selectOption({ label: "Piedmont Electric Cooperative" });
  await page.getByLabel("Plan name").fill(unique("Broken TOU"));
  await page.getByRole("radio", { name: "Time-of-use" }).check();
  await page.getByText("Jan", { exact: true }).click();
  await page.getByRole("button", { name: "Create rate plan" }).click();
  await expect(page.getByRole("list", { name: "Problems" })).toContainText("month 1 is in no season");
  await expect(page).toHaveURL(/\/rate-plans\/new$/);
});

test("a rep reads rate plans but the rate plan APIs refuse their writes", async ({ page, request }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/rate-plans");
  await expect(page.getByRole("link", { name: "New rate plan" })).toHaveCount(0);
  await page.getByRole("link", { name: "Residential Service RS-1" }).click();
  await expect(page.getByTestId("preview-average")).toBeVisible();
  await expect(page.getByLabel("Plan name")).toBeDisabled();

  await apiSignIn(request, "rep@tallgrass.example");
  const list = await request.get("/api/rate-plans");
  expect(list.status()).toBe(200);
  const plans = (await list.json()).data as { id: string; utilityId: string; active: boolean; plan: unknown }[];
  expect(plans.length).toBeGreaterThanOrEqual(2);
  const body = { utilityId: plans[0].utilityId, active: true, plan: plans[0].plan };
  const post = await request.post("/api/rate-plans", { data: body });
  expect(post.status()).toBe(403);
  expect((await post.json()).error.code).toBe("forbidden");
  const put = await request.put(`/api/rate-plans/${plans[0].id}`, { data: body });
  expect(put.status()).toBe(403);
});

test("an admin keeps the company's utilities; a new one is at once a plan's utility to pick", async ({ page }) => {
  const name = unique("Haw Creek Power");
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/utilities");
  await expect(page.getByRole("cell", { name: /^Piedmont Electric Cooperative/ })).toBeVisible();
  await page.getByLabel("Name (as its bills print it)").fill(name);
  await page.getByLabel("Time zone").selectOption("America/Chicago");
  await page.getByLabel("Territory notes").fill("North of the creek only.");
  await page.getByRole("button", { name: "Add utility" }).click();
  await expect(page.getByRole("status")).toContainText("Utility added.");
  await expect(page.getByRole("cell", { name: new RegExp(`^${name}`) })).toContainText("North of the creek only.");

  await page.getByLabel("Name (as its bills print it)").fill("piedmont electric cooperative");
  await page.getByRole("button", { name: "Add utility" }).click();
  await expect(page.getByText('"piedmont electric cooperative" is already in the list')).toBeVisible();

  await page.goto("/rate-plans/new");
  await page.getByLabel("Utility").selectOption({ label: name });
});
