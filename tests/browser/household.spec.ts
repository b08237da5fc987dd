import { expect, test } from "@playwright/test";
import { signIn } from "./support";

test.use({ viewport: { width: 820, height: 1180 } });

test("the rep corrects the household and sets the rate plan; bad input is named on its field", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/deals");
  await page.getByRole("link", { name: "Esposito household" }).click();
  await expect(page.getByLabel("Household name")).toHaveValue("Esposito household");

  await page.getByLabel("ZIP").fill("2726");
  await page.getByRole("button", { name: "Save household" }).click();
  await expect(page.locator("#postalCode-error")).toHaveText("Enter a ZIP code like 27401");
  await page.getByLabel("ZIP").fill("27262");
  await page.getByLabel("Phone").fill("336-555-0199");
  await page.getByRole("button", { name: "Save household" }).click();
  await expect(page.getByRole("status")).toContainText("Saved.");

  // Switch to another of the company's plans than the one the deal has.
  const plan = page.getByLabel("Rate plan");
  const before = await plan.inputValue();
  const values = (await plan.locator("option").evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value))).filter((v) => v !== "" && v !== before);
  expect(values.length).toBeGreaterThan(0);
  const chosen = values[0];
  await plan.selectOption(chosen);
  const saved = page.waitForResponse((r) => r.url().endsWith("/utility") && r.request().method() === "PUT");
  await page.getByRole("button", { name: "Save utility and plan" }).click();
  expect((await saved).status()).toBe(200);
  // Both forms now say so: the household's earlier notice and the utility form's own.
  await expect(page.getByText("Saved.")).toHaveCount(2);
  await page.reload();
  await expect(page.getByLabel("Phone")).toHaveValue("336-555-0199");
  await expect(page.getByLabel("Rate plan")).toHaveValue(chosen);

  await page.getByRole("link", { name: "Timeline" }).click();
  await expect(page.getByText("set the utility and rate plan")).toBeVisible();
});
