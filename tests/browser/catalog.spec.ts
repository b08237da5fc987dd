import { expect, test, type Page } from "@playwright/test";
import { apiSignIn, signIn, unique, withDb } from "./support";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const HEADER = "manufacturer,model,stc_watts,voc_v,isc_a,vmp_v,imp_a,gamma_pmax_pct_per_c,beta_voc_pct_per_c,length_mm,width_mm,cell_technology,construction,encapsulant";
const row = (model: string, vmpV = "31.2") => `Testfield,${model},400,37.5,13.6,${vmpV},12.82,-0.30,-0.25,1722,1134,topcon,glass_glass,POE`;

async function modelsInDb(models: string[]): Promise<string[]> {
  return withDb(async (conn) => {
    const [rows] = await conn.query("SELECT model FROM module_model WHERE company_id = ? AND model IN (?)", [DEMO_COMPANY_ID, models]);
    return (rows as { model: string }[]).map((r) => r.model).sort();
  });
}

async function uploadModules(page: Page, csv: string, mode?: "Import only the good rows") {
  const panel = page.locator(".card", { has: page.getByRole("heading", { name: "Import modules from CSV" }) });
  await panel.getByLabel("CSV file (modules)").setInputFiles({ name: "modules.csv", mimeType: "text/csv", buffer: Buffer.from(csv) });
  if (mode) await panel.getByLabel(mode).check();
  await panel.getByRole("button", { name: "Import modules", exact: true }).click();
}

test("admin imports a modules CSV with one bad row: the line is named and nothing is imported", async ({ page }) => {
  const good = unique("TF-good");
  const bad = unique("TF-bad");
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/catalog");
  await expect(page.getByRole("heading", { name: "Catalog", exact: true })).toBeVisible();

  await uploadModules(page, [HEADER, row(good), row(bad, "39")].join("\n"));
  const result = page.getByTestId("module-import-result");
  await expect(result).toContainText("Nothing was imported");
  await expect(result.getByTestId("import-error").first()).toContainText("Line 3");
  await expect(result).toContainText("vmp_v");
  await expect(result).toContainText("must be below Voc");
  expect(await modelsInDb([good, bad])).toEqual([]);
  await expect(page.getByTestId(`module-${good}`)).toHaveCount(0);

  // The same file with "import only the good rows" takes the good one and still lists line 3.
  await uploadModules(page, [HEADER, row(good), row(bad, "39")].join("\n"), "Import only the good rows");
  await expect(result).toContainText("Imported 1 new module");
  await expect(result).toContainText("Line 3");
  await expect(page.getByTestId(`module-${good}`)).toBeVisible();
  expect(await modelsInDb([good, bad])).toEqual([good]);
});

test("admin adds a module through the form; a physical slip is named on its field", async ({ page }) => {
  const model = unique("TF-form");
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/catalog");
  await page.getByRole("button", { name: "Add module" }).click();
  const form = page.getByRole("region", { name: "Add a module" });
  await form.getByLabel("Manufacturer").fill("Testfield");
  await form.getByLabel("Model").fill(model);
  const values: [string, string][] = [
    ["STC watts (W)", "400"],
    ["Voc (V)", "37.5"],
    ["Isc (A)", "13.6"],
    ["Vmp (V)", "39"],
    ["Imp (A)", "12.82"],
    ["Pmax temperature coefficient (%/°C)", "-0.30"],
    // In %/°C this is far outside any module: the unit is what the datasheet prints.
    ["Voc temperature coefficient", "-97.5"],
    ["Maximum series fuse (A, optional)", "25"],
    ["Length (mm)", "1722"],
    ["Width (mm)", "1134"],
  ];
  for (const [label, value] of values) await form.getByLabel(label, { exact: true }).fill(value);
  await form.getByRole("button", { name: "Add module" }).click();
  await expect(form.locator("#module-vmpV-error")).toContainText("must be below Voc");
  await expect(form.locator(".field-error").filter({ hasText: "-97.5 %/°C is -97.5 %/°C of the 37.5 V Voc" })).toBeVisible();
  await form.getByLabel("Vmp (V)", { exact: true }).fill("31.2");
  await form.getByLabel("Voc coefficient unit").selectOption("mV/°C");
  await form.getByRole("button", { name: "Add module" }).click();
  const added = page.getByTestId(`module-${model}`);
  await expect(added).toBeVisible();
  await expect(added).toContainText("-97.5 mV/°C");
  expect(
    await withDb(async (conn) => {
      const [rows] = await conn.query("SELECT beta_voc_pct_per_c AS pct, voc_coeff_unit AS unit, max_series_fuse_a AS fuse FROM module_model WHERE company_id = ? AND model = ?", [DEMO_COMPANY_ID, model]);
      return rows;
    }),
  ).toEqual([{ pct: -0.26, unit: "mv_per_c", fuse: 25 }]);

  // Deactivate: stays listed for the admin, marked deactivated, and leaves the active list.
  await page.getByRole("button", { name: `Deactivate Testfield ${model}` }).click();
  await expect(page.getByTestId(`module-${model}`)).toContainText("Deactivated");
  const active = await page.request.get("/api/module-models?active=1");
  const ids = ((await active.json()) as { data: { model: string }[] }).data.map((m) => m.model);
  expect(ids).not.toContain(model);
});

test("a sales rep sees the catalog read-only, and the write API answers 403", async ({ page, request }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/catalog");
  await expect(page.getByRole("heading", { name: "Catalog", exact: true })).toBeVisible();
  await expect(page.getByTestId("module-PL-410T")).toBeVisible();
  await expect(page.getByTestId("inverter-RW-7600S")).toBeVisible();
  await expect(page.getByRole("button", { name: "Add module" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Add inverter" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^(Edit|Deactivate|Reactivate) / })).toHaveCount(0);
  await expect(page.getByRole("button", { name: /^Import / })).toHaveCount(0);

  await apiSignIn(request, "rep@tallgrass.example");
  const list = await request.get("/api/module-models");
  expect(list.status()).toBe(200);
  const [first] = ((await list.json()) as { data: { id: string }[] }).data;
  const create = await request.post("/api/module-models", { data: { manufacturer: "X", model: "Y" } });
  expect(create.status()).toBe(403);
  expect((await create.json()).error.code).toBe("forbidden");
  expect((await request.patch(`/api/module-models/${first.id}`, { data: { active: false } })).status()).toBe(403);
  expect((await request.delete(`/api/module-models/${first.id}`)).status()).toBe(403);
  const importRes = await request.post("/api/module-models/import?mode=good_rows", { data: HEADER, headers: { "Content-Type": "text/csv" } });
  expect(importRes.status()).toBe(403);
  expect((await request.post("/api/inverter-models", { data: {} })).status()).toBe(403);
});
