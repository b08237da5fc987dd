import { expect, test } from "@playwright/test";
import { signIn, unique } from "./support";

test("an admin deletes an unused utility; one in use stays, with the reason naming what uses it", async ({ page }) => {
  const name = unique("Typo Power");
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/utilities");
  await page.getByLabel("Name (as its bills print it)").fill(name);
  await page.getByRole("button", { name: "Add utility" }).click();
  await expect(page.getByRole("cell", { name, exact: true })).toBeVisible();

  await page.getByRole("button", { name: `Delete ${name}` }).click();
  await page.getByRole("dialog").getByRole("button", { name: "Delete utility" }).click();
  await expect(page.getByText(`${name} deleted.`)).toBeVisible();
  await expect(page.getByRole("cell", { name, exact: true })).toHaveCount(0);

  await page.getByRole("button", { name: "Delete Piedmont Electric Cooperative" }).click();
  const dialog = page.getByRole("dialog");
  await expect(dialog).toContainText("it can be deleted only once nothing uses it");
  await dialog.getByRole("button", { name: "Delete utility" }).click();
  await expect(page.getByText(/^Piedmont Electric Cooperative is used by .*\d+ rate plans?.*, so it cannot be deleted\./)).toBeVisible();
  await expect(page.getByRole("button", { name: "Delete Piedmont Electric Cooperative" })).toBeVisible();
});
