import { expect, test, type Page } from "@playwright/test";
import { apiSignIn, signIn, unique, withDb } from "./support";

// The deals table's bulk actions and saved views, and Settings → Company's stall limits, at
// desktop size. Deals of their own in the demo company; every change is undone afterwards.
test.use({ viewport: { width: 1440, height: 900 } });
test.describe.configure({ mode: "serial" });

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const REP_ID = "7a11a55e-0000-4000-8000-000000000104";
const tag = unique("t").slice(-5);
const word = `Tamsworth${tag}`;
const names = [`${word} North household`, `${word} South household`];
const householdIds = names.map(() => crypto.randomUUID());
const dealIds = names.map(() => crypto.randomUUID());
const viewName = `Surveys ${tag}`;
let company: { settings: unknown; license: string | null } | null = null;

test.beforeAll(async () => {
  await withDb(async (conn) => {
    for (const [i, name] of names.entries()) {
      await conn.query(
        `INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude)
         VALUES (?, ?, ?, '3 Quarry Lane', 'Oak Ridge', 'NC', '27310', 36.17, -79.98)`,
        [householdIds[i], DEMO_COMPANY_ID, name],
      );
      await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) VALUES (?, ?, ?, ?, 'survey', 'Website')", [
        dealIds[i],
        DEMO_COMPANY_ID,
        householdIds[i],
        REP_ID,
      ]);
    }
    const [rows] = await conn.query("SELECT settings, license_number AS license FROM company WHERE id = ?", [DEMO_COMPANY_ID]);
    company = (rows as { settings: unknown; license: string | null }[])[0];
  });
});

test.afterAll(async () => {
  await withDb(async (conn) => {
    for (const id of householdIds) await conn.query("DELETE FROM household WHERE id = ? AND company_id = ?", [id, DEMO_COMPANY_ID]);
    await conn.query("DELETE FROM saved_view WHERE company_id = ? AND name = ?", [DEMO_COMPANY_ID, viewName]);
    if (company) {
      const settings = typeof company.settings === "string" ? company.settings : JSON.stringify(company.settings);
      await conn.query("UPDATE company SET settings = ?, license_number = ? WHERE id = ?", [settings, company.license, DEMO_COMPANY_ID]);
    }
  });
});

async function searchOurDeals(page: Page) {
  await page.goto("/deals");
  await page.getByLabel("Search deals").fill(word);
  await page.getByRole("button", { name: "Search", exact: true }).click();
  await expect(page.locator("tbody tr")).toHaveCount(2);
}

async function stageOf(dealId: string): Promise<string> {
  const [rows] = await withDb((conn) => conn.query("SELECT stage FROM deal WHERE id = ?", [dealId]));
  return (rows as { stage: string }[])[0].stage;
}

test("the office moves selected deals: refused without a reason, moved with one", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await searchOurDeals(page);
  for (const name of names) await page.getByRole("checkbox", { name: `Select ${name}` }).check();
  const bar = page.getByRole("region", { name: "Selected deals" });
  await expect(bar).toContainText("2 selected");

  await bar.getByRole("button", { name: "Move to stage…" }).click();
  await bar.getByLabel("Move the selected deals to").selectOption("on_hold");
  await bar.getByRole("button", { name: "Move 2 deals" }).click();
  const result = page.getByTestId("bulk-result");
  await expect(result).toContainText("0 moved, 2 refused");
  await expect(result.getByRole("list", { name: "Refused deals" })).toContainText(`${names[0]}: Say why the deal is on hold.`);
  await expect(bar).toContainText("2 selected"); // the refused stay selected
  expect(await stageOf(dealIds[0])).toBe("survey");

  await bar.getByRole("button", { name: "Move to stage…" }).click();
  await bar.getByLabel("Move the selected deals to").selectOption("on_hold");
  await bar.getByLabel(/^Reason/).fill("Roof replacement first");
  await bar.getByRole("button", { name: "Move 2 deals" }).click();
  await expect(result).toContainText("2 moved");
  await expect(page.getByRole("region", { name: "Selected deals" })).toHaveCount(0);
  await expect(page.locator("tbody tr").first()).toContainText("On hold");
  expect(await stageOf(dealIds[0])).toBe("on_hold");
  expect(await stageOf(dealIds[1])).toBe("on_hold");

  await page.goto(`/deals/${dealIds[1]}/timeline`);
  await expect(page.getByRole("list", { name: "What happened" })).toContainText(
    `Priya Castellanos moved ${names[1]} from Survey to On hold: Roof replacement first`,
  );
});

test("the office reassigns selected deals to another rep, and the Timeline says who and to whom", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await searchOurDeals(page);
  await page.getByRole("checkbox", { name: "Select every deal on this page" }).check();
  const bar = page.getByRole("region", { name: "Selected deals" });
  await expect(bar).toContainText("2 selected");
  await bar.getByRole("button", { name: "Reassign to rep…" }).click();
  await bar.getByLabel("Reassign to").selectOption({ label: "Ines Okonkwo" });
  await bar.getByRole("button", { name: "Reassign 2 deals" }).click();
  await expect(page.getByTestId("bulk-result")).toContainText("2 reassigned");
  await expect(page.locator("tbody tr").first()).toContainText("Ines Okonkwo");

  await page.goto(`/deals/${dealIds[0]}/timeline`);
  await expect(page.getByRole("list", { name: "What happened" })).toContainText(`Priya Castellanos reassigned ${names[0]} from Tobias Wren to Ines Okonkwo`);
});

test("a saved view keeps filters and sort, comes back from the menu, and can be deleted", async ({ page, playwright }) => {
  await signIn(page, "office@tallgrass.example");
  await searchOurDeals(page);
  await page.getByRole("combobox", { name: "Stage", exact: true }).selectOption("on_hold");
  await page.getByRole("button", { name: "Household", exact: true }).click();
  await expect(page).toHaveURL(/sort=household%3Aasc/);

  await page.getByRole("button", { name: "Save view" }).click();
  await page.getByLabel("View name").fill(viewName);
  await page.getByRole("button", { name: "Save", exact: true }).click();
  await expect(page.getByText(`Saved the view “${viewName}”.`)).toBeVisible();

  await page.getByRole("button", { name: "Clear filters" }).click();
  await expect(page).not.toHaveURL(/stage=on_hold/);
  await expect(page.getByRole("button", { name: `Save changes to “${viewName}”` })).toBeVisible();

  await page.getByText(`View: ${viewName}`).click();
  await page.getByRole("list", { name: "Your saved views" }).getByRole("button", { name: viewName, exact: true }).click();
  await expect(page).toHaveURL(/stage=on_hold/);
  await expect(page).toHaveURL(new RegExp(`q=${word}`));
  await expect(page.getByRole("combobox", { name: "Stage", exact: true })).toHaveValue("on_hold");
  await expect(page.locator("tbody tr")).toHaveCount(2);
  await expect(page.locator("tbody tr").first()).toContainText(names[0]);

  // Private to its person: the rep's API does not find it.
  const [rows] = await withDb((conn) => conn.query("SELECT id FROM saved_view WHERE company_id = ? AND name = ?", [DEMO_COMPANY_ID, viewName]));
  const viewId = (rows as { id: string }[])[0].id;
  expect((await page.request.get(`/api/saved-views/${viewId}`)).status()).toBe(200);
  const rep = await playwright.request.newContext({ baseURL: process.env.APP_URL });
  await apiSignIn(rep, "rep@tallgrass.example");
  expect((await rep.get(`/api/saved-views/${viewId}`)).status()).toBe(404);
  expect(((await (await rep.get("/api/saved-views")).json()) as { data: { id: string }[] }).data.map((v) => v.id)).not.toContain(viewId);
  await rep.dispose();

  await page.getByText(`View: ${viewName}`).click();
  await page.getByRole("button", { name: `Delete the view ${viewName}` }).click();
  await page.getByRole("list", { name: "Your saved views" }).getByRole("button", { name: "Delete", exact: true }).click();
  await expect(page.getByText(`Deleted the view “${viewName}”.`)).toBeVisible();
  expect((await page.request.get(`/api/saved-views/${viewId}`)).status()).toBe(404);
});

test("an admin sets the company's stall limit for a stage, and the Board flags by it", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/settings/company");
  const nav = page.getByRole("navigation", { name: "Settings" });
  await expect(nav.getByRole("link", { name: "Company" })).toHaveAttribute("aria-current", "page");
  await expect(nav.getByRole("link", { name: "People" })).toBeVisible();

  await page.getByLabel("Survey", { exact: true }).fill("0");
  await page.getByRole("button", { name: "Save company settings" }).click();
  // Named on the field itself (the line beside the Save button repeats it).
  await expect(page.getByLabel("Survey", { exact: true })).toHaveAccessibleDescription(/Whole days from 1 to 365, or leave empty for never/);

  // The demo's Galloway household has been in Survey for 19 days: flagged at the default 14.
  await page.getByLabel("Survey", { exact: true }).fill("30");
  await page.getByLabel("Contractor licence number").fill("NC-UE 40417");
  await page.getByRole("button", { name: "Save company settings" }).click();
  await expect(page.getByText("Company settings saved.")).toBeVisible();
  await page.reload();
  await expect(page.getByLabel("Survey", { exact: true })).toHaveValue("30");
  await expect(page.getByLabel("Contractor licence number")).toHaveValue("NC-UE 40417");

  await page.goto("/board");
  const survey = page.getByRole("region", { name: "Survey", exact: true });
  await expect(survey).toContainText("Flag after 30 days");
  await expect(survey.getByRole("link", { name: /^Galloway household/ })).not.toHaveAccessibleName(/Stalled/);
});

test("an admin sets the savings assumptions of new offers; a slip is named on its field", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/settings/company");
  await expect(page.getByRole("heading", { name: "Savings assumptions" })).toBeVisible();
  const degradation = page.getByLabel("Module output falls (%/yr)");
  await expect(degradation).toHaveValue("0.5");

  // 25 typed for 2.5: refused, named on its field, nothing saved.
  await page.getByLabel("Utility prices rise (%/yr)").fill("25");
  await page.getByRole("button", { name: "Save company settings" }).click();
  await expect(page.getByLabel("Utility prices rise (%/yr)")).toHaveAccessibleDescription(/A number from -2 to 8 \(%\/yr\)/);
  await page.reload();
  await expect(page.getByLabel("Utility prices rise (%/yr)")).toHaveValue("2.5");

  await page.getByLabel("Utility prices rise (%/yr)").fill("3");
  await degradation.fill("0.7");
  await page.getByLabel("Years the savings run").fill("30");
  await page.getByRole("button", { name: "Save company settings" }).click();
  await expect(page.getByText("Company settings saved.")).toBeVisible();
  await page.reload();
  await expect(page.getByLabel("Utility prices rise (%/yr)")).toHaveValue("3");
  await expect(degradation).toHaveValue("0.7");
  await expect(page.getByLabel("Years the savings run")).toHaveValue("30");

  // Back to the defaults, as the other journeys expect them.
  await page.getByRole("button", { name: "Use the defaults for the savings assumptions" }).click();
  await expect(degradation).toHaveValue("0.5");
  await page.getByRole("button", { name: "Save company settings" }).click();
  await expect(page.getByText("Company settings saved.")).toBeVisible();
  await page.reload();
  await expect(page.getByLabel("Years the savings run")).toHaveValue("25");
});
