import { expect, test } from "@playwright/test";
import { alertOf, createCompany, linkIn, signIn, waitForMail } from "./support";

test("a person resets a forgotten password by e-mail; the link works once", async ({ page }) => {
  const { email, password: oldPassword } = await createCompany("Lantern Hill Solar");
  await page.goto("/sign-in");
  await page.getByRole("link", { name: "Forgot your password?" }).click();
  // The sign-in page has an "E-mail" field too: fill the reset page's, once it is shown.
  await expect(page.getByRole("heading", { name: "Reset your password" })).toBeVisible();
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Send the link" }).click();
  await expect(page.getByRole("status")).toContainText("a reset link is on its way");

  const mail = await waitForMail(email, /Reset your Kilowright password/);
  const link = linkIn(mail, "/reset-password");
  await page.goto(link);
  await expect(page.getByRole("heading", { name: "Choose a new password" })).toBeVisible();
  await page.getByLabel("New password").fill("lantern-new-pass-7");
  await page.getByLabel("The same again").fill("lantern-other-7");
  await page.getByRole("button", { name: "Save the new password" }).click();
  await expect(page.getByText("The two passwords differ")).toBeVisible();
  await page.getByLabel("The same again").fill("lantern-new-pass-7");
  await page.getByRole("button", { name: "Save the new password" }).click();
  await expect(page).toHaveURL(/\/sign-in\?notice=password-reset/);

  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(oldPassword);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(alertOf(page)).toContainText("Wrong e-mail or password");
  await signIn(page, email, "lantern-new-pass-7");

  // The same link again no longer works.
  await page.context().clearCookies();
  await page.goto(link);
  await expect(page.getByRole("heading", { name: "This link no longer works" })).toBeVisible();
});

test("the dev outbox lists sent mail for owners and admins only", async ({ browser }) => {
  const owner = await (await browser.newContext()).newPage();
  await signIn(owner, "owner@tallgrass.example");
  await owner.getByRole("link", { name: "Dev outbox" }).click();
  await expect(owner.getByRole("heading", { name: "Dev outbox" })).toBeVisible();
  await expect(owner.locator("summary").first()).toBeVisible();

  const rep = await (await browser.newContext()).newPage();
  await signIn(rep, "rep@tallgrass.example");
  await rep.goto("/dev/outbox");
  await expect(alertOf(rep)).toContainText("No access to the dev outbox");
});
