import { expect, test } from "@playwright/test";
import { apiSignIn, signIn, withDb } from "./support";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";

async function savedBandPrice(index: number): Promise<number> {
  return withDb(async (conn) => {
    const [rows] = await conn.query("SELECT document FROM price_book WHERE company_id = ?", [DEMO_COMPANY_ID]);
    const raw = (rows as { document: unknown }[])[0].document;
    const doc = (typeof raw === "string" ? JSON.parse(raw) : raw) as { bands: { centsPerWattDc: number }[] };
    return doc.bands[index].centsPerWattDc;
  });
}

test("an admin changes a size band's price per watt and it stays saved", async ({ page, request }) => {
  // Other journeys price offers from the demo book: put it back afterwards.
  await apiSignIn(request, "admin@tallgrass.example");
  const original = (await (await request.get("/api/price-books")).json()).data.document;
  const before = await savedBandPrice(1);
  const next = before === 289 ? 287 : 289;
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/price-book");
  await expect(page.getByRole("heading", { name: "Price book", level: 1 })).toBeVisible();
  // The demo's ended incentive is shown as never offered.
  await expect(page.getByTestId("incentive-piedmont-coop-early-bonus")).toContainText("never offered");

  const price = page.getByLabel("Band 2 price, $ per watt");
  await price.fill(String(next / 100));
  await page.getByRole("button", { name: /Save/ }).click();
  await expect(page.getByRole("status").filter({ hasText: "Price book saved." })).toBeVisible();
  expect(await savedBandPrice(1)).toBe(next);

  await page.reload();
  await expect(page.getByLabel("Band 2 price, $ per watt")).toHaveValue(String(next / 100));

  expect((await request.post("/api/price-books", { data: original })).status()).toBe(200);
  expect(await savedBandPrice(1)).toBe(before);
});

test("an overlapping or missing value is named beside its field and nothing is saved", async ({ page }) => {
  const before = await savedBandPrice(0);
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/price-book");
  await page.getByLabel("Band 1 price, $ per watt").fill("");
  await page.getByRole("button", { name: /Save/ }).click();
  await expect(page.locator("#band-0-price-error")).toHaveText("Band 1 price, $ per watt is required");
  expect(await savedBandPrice(0)).toBe(before);
});

test("a rep reads the price book but cannot change it; the price book API refuses their POST", async ({ page, request }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/price-book");
  await expect(page.getByRole("heading", { name: "Price book", level: 1 })).toBeVisible();
  await expect(page.getByLabel("Band 1 price, $ per watt")).toBeDisabled();
  await expect(page.getByRole("button", { name: /Save/ })).toHaveCount(0);
  await expect(page.getByTestId("price-check-contract")).toBeVisible();

  await apiSignIn(request, "rep@tallgrass.example");
  const read = await request.get("/api/price-books");
  expect(read.status()).toBe(200);
  const { data } = await read.json();
  const post = await request.post("/api/price-books", { data: data.document });
  expect(post.status()).toBe(403);
  expect((await post.json()).error.code).toBe("forbidden");
});

test("the price book API names an overlapping band's field", async ({ request }) => {
  await apiSignIn(request, "admin@tallgrass.example");
  const { data } = await (await request.get("/api/price-books")).json();
  const doc = { ...data.document, bands: [{ minWatts: 0, maxWatts: 6000, centsPerWattDc: 310 }, { minWatts: 5000, maxWatts: null, centsPerWattDc: 285 }] };
  const res = await request.post("/api/price-books", { data: doc });
  expect(res.status()).toBe(422);
  const body = await res.json();
  expect(body.error.fields["bands.1.minWatts"]).toEqual(["overlaps the band before, which runs to 6000 W"]);
});
