import { expect, test } from "@playwright/test";
import { linkIn, signIn, unique, waitForMail, alertOf } from "./support";

test("an admin invites a rep, who sets a password from the e-mail and signs in", async ({ page, browser }) => {
  const email = `${unique("newrep")}@tallgrass.example`;
  await signIn(page, "admin@tallgrass.example");
  await page.getByRole("link", { name: "Settings" }).click();
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Name (optional)").fill("Juniper Vale");
  await page.getByLabel("Role", { exact: true }).selectOption("sales_rep");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByRole("status")).toContainText(`Invitation sent to ${email}`);
  await expect(page.getByTestId(`invitation-${email}`)).toContainText("Sales rep");

  const mail = await waitForMail(email, /invited you/);
  const link = linkIn(mail, "/invite/");

  const fresh = await browser.newContext();
  const invitee = await fresh.newPage();
  await invitee.goto(link);
  await expect(invitee.getByRole("heading", { name: "Join Tallgrass Bright Energy" })).toBeVisible();
  await invitee.getByLabel("Password", { exact: true }).fill("juniper-secret-9");
  await invitee.getByLabel("The same again").fill("juniper-secret-9");
  await invitee.getByRole("button", { name: "Join and sign in" }).click();
  await expect(invitee).toHaveURL(/\/today$/);
  await expect(invitee.getByTestId("role-label")).toHaveText("Sales rep");

  // The link works once.
  await invitee.goto(link);
  await expect(alertOf(invitee)).toContainText("already used");
  await fresh.close();

  // And the new rep signs in with the password they chose.
  const again = await browser.newContext();
  const repPage = await again.newPage();
  await signIn(repPage, email, "juniper-secret-9");
  await again.close();

  await page.reload();
  await expect(page.getByTestId(`person-${email}`)).toContainText("Juniper Vale");
});

test("an admin changes a role and deactivates a person, who can no longer sign in", async ({ page, browser }) => {
  const email = `${unique("crew")}@tallgrass.example`;
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/settings/people");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption("crew");
  await page.getByRole("button", { name: "Send invitation" }).click();
  const link = linkIn(await waitForMail(email, /invited you/), "/invite/");

  const ctx = await browser.newContext();
  const person = await ctx.newPage();
  await person.goto(link);
  await person.getByLabel("Your name").fill("Sol Ferreira");
  await person.getByLabel("Password", { exact: true }).fill("sol-ferreira-pass");
  await person.getByLabel("The same again").fill("sol-ferreira-pass");
  await person.getByRole("button", { name: "Join and sign in" }).click();
  await expect(person.getByTestId("role-label")).toHaveText("Installer crew");

  await page.reload();
  const row = page.getByTestId(`person-${email}`);
  await row.getByRole("combobox").selectOption("office_manager");
  await page.getByRole("dialog").getByRole("button", { name: "Make Office manager" }).click();
  await expect(page.getByRole("status")).toContainText("Sol Ferreira is now Office manager");
  await row.getByRole("button", { name: "Deactivate" }).click();
  await page.getByRole("dialog").getByRole("button", { name: "Deactivate Sol Ferreira" }).click();
  await expect(page.getByRole("status")).toContainText("deactivated");

  // Their open session ends at once, and signing in again is refused with the reason.
  await person.goto("/today");
  await expect(person).toHaveURL(/\/sign-in/);
  await person.getByLabel("E-mail").fill(email);
  await person.getByLabel("Password").fill("sol-ferreira-pass");
  await person.getByRole("button", { name: "Sign in" }).click();
  await expect(alertOf(person)).toContainText("deactivated");
  await ctx.close();
});
