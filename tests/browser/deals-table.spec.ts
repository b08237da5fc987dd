import { readFile } from "node:fs/promises";
import { expect, test, type Page } from "@playwright/test";
import Papa from "papaparse";
import { signIn } from "./support";

type TablePage = { rows: Array<{ id: string; householdName: string; stage: string; ownerName: string | null }>; total: number };

/** The table route's answer for the same view, read with the page's own session. */
async function tableApi(page: Page, params: string): Promise<TablePage> {
  const res = await page.request.get(`/api/deals/table?${params}`);
  expect(res.status(), await res.text()).toBe(200);
  return ((await res.json()) as { data: TablePage }).data;
}

test("the office sorts the deals table by contract, filters by stage, hides a column and exports the view", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto("/deals");
  await expect(page.getByRole("heading", { name: "Deals", exact: true })).toBeVisible();
  await expect(page.getByRole("link", { name: "New lead" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Abernathy household" })).toHaveAttribute("href", /^\/deals\/[0-9a-f-]{36}$/);

  // Sort by contract value: largest first.
  await page.getByRole("button", { name: "Contract", exact: true }).click();
  await expect(page).toHaveURL(/sort=contractCents%3Adesc/);
  await expect(page.getByRole("columnheader", { name: "Contract" })).toHaveAttribute("aria-sort", "descending");
  const bySize = await tableApi(page, "sort=contractCents:desc&pageSize=3");
  for (const [i, row] of bySize.rows.entries()) {
    await expect(page.locator("tbody tr").nth(i).getByRole("link")).toHaveText(row.householdName);
  }

  // Filter by stage: only Permitting deals, as many as the route counts.
  await page.getByRole("combobox", { name: "Stage" }).selectOption("permitting");
  await expect(page).toHaveURL(/stage=permitting/);
  const permitting = await tableApi(page, "stage=permitting&sort=contractCents:desc");
  expect(permitting.total).toBeGreaterThan(0);
  await expect(page.locator("tbody tr")).toHaveCount(permitting.total);
  await expect(page.getByRole("link", { name: "Halvorsen household" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Abernathy household" })).toHaveCount(0);

  // Hide the City column; the choice is remembered by this browser.
  await expect(page.getByRole("columnheader", { name: "City" })).toBeVisible();
  await page.getByText("Columns", { exact: true }).click();
  await page.getByRole("checkbox", { name: "City" }).uncheck();
  await expect(page.getByRole("columnheader", { name: "City" })).toHaveCount(0);
  await page.reload();
  await expect(page.getByRole("combobox", { name: "Stage" })).toHaveValue("permitting");
  await expect(page.getByRole("columnheader", { name: "Contract" })).toBeVisible();
  await expect(page.getByRole("columnheader", { name: "City" })).toHaveCount(0);

  // Export the current view.
  const downloading = page.waitForEvent("download");
  await page.getByRole("link", { name: "Export CSV" }).click();
  const download = await downloading;
  expect(download.suggestedFilename()).toMatch(/\.csv$/);
  const text = await readFile((await download.path()) as string, "utf8");
  const parsed = Papa.parse<string[]>(text.trimEnd(), { skipEmptyLines: true });
  const [header, ...rows] = parsed.data;
  expect(header).toEqual(["Household", "City", "Stage", "System kW DC", "Contract USD", "In stage since", "Created", "Owner", "Source", "Deal ID"]);
  expect(rows).toHaveLength(permitting.total);
  expect(rows.every((r) => r[2] === "Permitting")).toBe(true);
  expect(rows.map((r) => r[0])).toEqual(permitting.rows.map((r) => r.householdName));

  // Show the column again so later runs start from the default.
  await page.getByText("Columns", { exact: true }).click();
  await page.getByRole("checkbox", { name: "City" }).check();
  await expect(page.getByRole("columnheader", { name: "City" })).toBeVisible();
});

test("a rep's deals table lists only their own deals", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/deals");
  await expect(page.getByRole("heading", { name: "Your deals" })).toBeVisible();
  await expect(page.getByRole("columnheader", { name: "Owner" })).toHaveCount(0);
  await expect(page.getByRole("combobox", { name: "Owner" })).toHaveCount(0);
  const mine = await tableApi(page, "pageSize=200");
  expect(mine.total).toBeGreaterThan(0);
  expect(new Set(mine.rows.map((r) => r.ownerName)).size).toBe(1);
  await expect(page.locator("tbody tr")).toHaveCount(mine.total);
  const shown = await page.locator("tbody tr td:first-child a").allTextContents();
  expect(shown.sort()).toEqual(mine.rows.map((r) => r.householdName).sort());

  // Asking the route for someone else's deals gives nothing.
  const others = await tableApi(page, "owner=00000000-0000-4000-8000-000000000000");
  expect(others.total).toBe(0);
});
