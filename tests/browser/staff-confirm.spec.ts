import { expect, test, type Locator, type Page } from "@playwright/test";
import { apiSignIn, linkIn, signIn, unique, waitForMail, withDb } from "./support";

// Staff screens that confirm and explain: a role change, a deactivation and replacing an open
// invitation each ask first and say what happens; the server refuses to replace an invitation
// silently; a form's status message sits beside its button and goes on the next edit.

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const CREW_NORTH_ID = "7a11a55e-0000-4000-8000-000000000801";

async function invite(page: Page, email: string, role: string) {
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Role", { exact: true }).selectOption(role);
  await page.getByRole("button", { name: "Send invitation" }).click();
}

/** The vertical distance between two elements' boxes (0 when they overlap in height). */
async function gap(a: Locator, b: Locator): Promise<number> {
  const [x, y] = [await a.boundingBox(), await b.boundingBox()];
  if (!x || !y) throw new Error("not laid out");
  return Math.max(0, Math.max(x.y, y.y) - Math.min(x.y + x.height, y.y + y.height));
}

test("re-inviting an address with an open invitation names both roles and replaces only when confirmed", async ({ page }) => {
  const email = `${unique("twice")}@tallgrass.example`;
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/settings/people");
  await invite(page, email, "crew");
  await expect(page.getByTestId(`invitation-${email}`)).toContainText("Installer crew");

  await invite(page, email, "admin");
  const dialog = page.getByRole("dialog");
  await expect(dialog).toContainText(`An invitation for ${email} as Installer crew is open; replace it with Admin?`);
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(page.getByTestId(`invitation-${email}`)).toContainText("Installer crew");

  await page.getByRole("button", { name: "Send invitation" }).click();
  await page.getByRole("dialog").getByRole("button", { name: "Replace with Admin" }).click();
  await expect(page.getByTestId(`invitation-${email}`)).toContainText("Admin");
  await expect(page.getByTestId(`invitation-${email}`)).toHaveCount(1);
});

test("the invitation route refuses a silent replacement with 409 unless the request says replace", async ({ request }) => {
  const email = `${unique("api-twice")}@tallgrass.example`;
  await apiSignIn(request, "admin@tallgrass.example");
  expect((await request.post("/api/people", { data: { email, role: "crew" } })).status()).toBe(201);
  const refused = await request.post("/api/people", { data: { email, role: "admin" } });
  expect(refused.status()).toBe(409);
  const { error } = await refused.json();
  expect(error.code).toBe("invitation_open");
  expect(error.message).toBe(`An invitation for ${email} as Installer crew is open. Send again with replace to replace it with Admin.`);
  const open = async () => ((await (await request.get("/api/people")).json()).data.invitations as { email: string; role: string }[]).filter((i) => i.email === email);
  expect((await open()).map((i) => i.role)).toEqual(["crew"]);

  expect((await request.post("/api/people", { data: { email, role: "admin", replace: true } })).status()).toBe(201);
  expect((await open()).map((i) => i.role)).toEqual(["admin"]);
});

test("a role change and a deactivation each ask first and say what they do", async ({ page, browser }) => {
  const email = `${unique("asked")}@tallgrass.example`;
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/settings/people");
  await invite(page, email, "crew");
  const link = linkIn(await waitForMail(email, /invited you/), "/invite/");
  const ctx = await browser.newContext();
  const person = await ctx.newPage();
  await person.goto(link);
  await person.getByLabel("Your name").fill("Ines Okafor");
  await person.getByLabel("Password", { exact: true }).fill("ines-okafor-pass");
  await person.getByLabel("The same again").fill("ines-okafor-pass");
  await person.getByRole("button", { name: "Join and sign in" }).click();
  await expect(person.getByTestId("role-label")).toHaveText("Installer crew");
  await ctx.close();

  await page.reload();
  const row = page.getByTestId(`person-${email}`);
  await row.getByRole("combobox").selectOption("office_manager");
  const dialog = page.getByRole("dialog");
  await expect(dialog).toContainText("Change Ines Okafor from Installer crew to Office manager?");
  await expect(dialog).toContainText(/Gains .+; loses .+\./);
  await dialog.getByRole("button", { name: "Cancel" }).click();
  await expect(row.getByRole("combobox")).toHaveValue("crew");

  await row.getByRole("combobox").selectOption("office_manager");
  await page.getByRole("dialog").getByRole("button", { name: "Make Office manager" }).click();
  await expect(page.getByRole("status")).toContainText("Ines Okafor is now Office manager");
  await expect(row.getByRole("combobox")).toHaveValue("office_manager");

  await row.getByRole("button", { name: "Deactivate" }).click();
  await expect(page.getByRole("dialog")).toContainText("signed out");
  await expect(page.getByRole("dialog")).toContainText("keeps");
  await page.getByRole("dialog").getByRole("button", { name: "Cancel" }).click();
  await expect(row).toContainText("Active");
  await row.getByRole("button", { name: "Deactivate" }).click();
  await page.getByRole("dialog").getByRole("button", { name: "Deactivate Ines Okafor" }).click();
  await expect(row).toContainText("Deactivated");
});

test("the job form's status sits beside its button, goes on the next edit, and never stays beside a new error", async ({ page }) => {
  const jobId = crypto.randomUUID();
  await withDb(async (conn) => {
    const householdId = crypto.randomUUID();
    const dealId = crypto.randomUUID();
    await conn.query(
      "INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, '9 Saddle Run', 'Greensboro', 'NC', '27405', 36.08, -79.79)",
      [householdId, DEMO_COMPANY_ID, `${unique("Status").replace(/[^A-Za-z0-9]/g, "")} household`],
    );
    await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) SELECT ?, ?, ?, id, 'deposit_paid', 'Referral' FROM user WHERE email = 'rep@tallgrass.example'", [dealId, DEMO_COMPANY_ID, householdId]);
    await conn.query("INSERT INTO job (id, company_id, deal_id, crew_id, checklist) VALUES (?, ?, ?, ?, '[]')", [jobId, DEMO_COMPANY_ID, dealId, CREW_NORTH_ID]);
  });
  await signIn(page, "office@tallgrass.example");
  await page.goto(`/jobs/${jobId}`);
  const saveButton = page.getByRole("button", { name: "Save job" });
  const status = page.getByRole("status").filter({ hasText: "Saved." });

  await page.getByLabel("Permit number").fill("BP-2207");
  await saveButton.click();
  await expect(status).toBeVisible();
  expect(await gap(status, saveButton)).toBeLessThan(24);

  // The next edit takes the message away; an invalid value then shows only its own error.
  await page.getByLabel("Permit number").fill("X".repeat(101));
  await expect(status).toHaveCount(0);
  await saveButton.click();
  await expect(page.getByText("Keep the permit number under 100 characters").first()).toBeVisible();
  await expect(page.getByText("Saved.")).toHaveCount(0);
  const notSaved = page.getByRole("alert").filter({ hasText: "Not saved" });
  await expect(notSaved).toContainText("Permit number");
  expect(await gap(notSaved, saveButton)).toBeLessThan(24);
});
