import { expect, test } from "@playwright/test";
import { linkIn, unique, waitForMail, withDb, alertOf } from "./support";

test("sign-up creates a company and its owner, confirmed by e-mail", async ({ page }) => {
  const email = `${unique("founder")}@newinstaller.example`;
  await page.goto("/sign-up");
  await page.getByLabel("Company name").fill("Prairie Current Solar");
  await page.getByLabel("Your name").fill("Avery Stone");
  await page.getByLabel("Work e-mail").fill(email);
  await page.getByLabel("Password").fill("a-long-password-1");
  await page.getByRole("button", { name: "Create company" }).click();
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();

  // Not signed in until the address is confirmed.
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("a-long-password-1");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(alertOf(page)).toContainText("Confirm your e-mail");

  const mail = await waitForMail(email, /Confirm your e-mail/);
  await page.goto(linkIn(mail, "/api/auth/verify-email"));
  await expect(page).toHaveURL(/\/today$/);
  await expect(page.getByTestId("company-name")).toHaveText("Prairie Current Solar");
  await expect(page.getByTestId("role-label")).toHaveText("Owner");

  // The new company's dev outbox holds only its own mail (the confirmation), none of the demo company's.
  await page.goto("/dev/outbox");
  await expect(page.getByRole("heading", { name: "Dev outbox" })).toBeVisible();
  const recipients = await page.locator("li summary").allTextContents();
  expect(recipients.length).toBeGreaterThan(0);
  expect(recipients.filter((r) => !r.includes(`to ${email}`))).toEqual([]);

  const rows = await withDb(async (conn) => {
    const [r] = await conn.query(
      "SELECT c.name, m.role FROM membership m JOIN company c ON c.id = m.company_id JOIN user u ON u.id = m.user_id WHERE u.email = ?",
      [email],
    );
    return r as { name: string; role: string }[];
  });
  expect(rows).toEqual([{ name: "Prairie Current Solar", role: "owner" }]);
});

test("a malformed sign-up form shows an error on each field", async ({ page }) => {
  await page.goto("/sign-up");
  await page.getByLabel("Work e-mail").fill("not-an-address");
  await page.getByLabel("Password").fill("short");
  await page.getByRole("button", { name: "Create company" }).click();
  await expect(page.getByText("Enter your company's name")).toBeVisible();
  await expect(page.getByText("Enter a name")).toBeVisible();
  await expect(page.getByText("Enter a valid e-mail address")).toBeVisible();
  await expect(page.getByText("Use at least 10 characters")).toBeVisible();
  await expect(page.getByLabel("Work e-mail")).toHaveAttribute("aria-invalid", "true");
});
