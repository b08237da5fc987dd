import { expect, test } from "@playwright/test";
import { signIn, withDb } from "./support";

test.use({ viewport: { width: 820, height: 1180 } }); // a tablet in portrait, where reps work

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
/** The demo rep's deal in "designing" (Calloway household, seed-demo.ts). */
const CALLOWAY_DEAL_ID = "7a11a55e-0000-4000-8000-000000000303";
/** Ridgewater RW-7600S from the demo catalog (scripts/lib/seed/catalog.ts). */
const STRING_INVERTER_ID = "7a11a55e-0000-4000-8000-000000001011";

/**
 * The deal starts without a design or offers (the rep lays it out from scratch), with twelve
 * monthly bills unless the demo already has some.
 */
async function prepareDeal(): Promise<void> {
  await withDb(async (conn) => {
    await conn.query("DELETE FROM offer WHERE company_id = ? AND deal_id = ?", [DEMO_COMPANY_ID, CALLOWAY_DEAL_ID]);
    await conn.query("DELETE FROM design WHERE company_id = ? AND deal_id = ?", [DEMO_COMPANY_ID, CALLOWAY_DEAL_ID]);
    const [rows] = await conn.query("SELECT COUNT(*) AS n FROM bill WHERE company_id = ? AND deal_id = ?", [DEMO_COMPANY_ID, CALLOWAY_DEAL_ID]);
    if ((rows as { n: number }[])[0].n > 0) return;
    const kwh = [1120, 980, 860, 720, 790, 1080, 1310, 1270, 1010, 760, 820, 1060];
    for (let m = 0; m < 12; m++) {
      const start = new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10);
      const end = new Date(Date.UTC(2025, m + 1, 0)).toISOString().slice(0, 10);
      await conn.query("INSERT INTO bill (id, company_id, deal_id, period_start, period_end, kwh) VALUES (UUID(), ?, ?, ?, ?, ?)", [DEMO_COMPANY_ID, CALLOWAY_DEAL_ID, start, end, kwh[m]]);
    }
  });
}

test("the rep adds two roof faces, sizes to 100 % offset, then compares two offers", async ({ page }) => {
  test.setTimeout(120_000);
  await prepareDeal();
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/deals");
  await page.getByRole("link", { name: "Calloway household" }).click();
  await page.getByRole("link", { name: "Design" }).click();
  await expect(page.getByRole("heading", { name: "Roof faces" })).toBeVisible();

  // A string inverter, so the string check shows.
  await page.getByLabel("Inverter", { exact: true }).selectOption(STRING_INVERTER_ID);
  const faceCount = await page.getByTestId(/^face-\d+$/).count();
  const a = faceCount + 1;
  const b = faceCount + 2;
  await page.getByRole("button", { name: "Add a roof face" }).click();
  await page.getByLabel(`Face ${a} name`).fill("Garage south");
  await page.getByLabel(`Face ${a} tilt (°)`).fill("20");
  await page.getByLabel(`Face ${a} usable module slots`).fill("14");
  await page.getByRole("button", { name: "Add a roof face" }).click();
  await page.getByLabel(`Face ${b} name`).fill("Shed west");
  await page.getByLabel(`Face ${b} azimuth (°)`).fill("270");
  await page.getByLabel(`Face ${b} usable module slots`).fill("6");
  await page.getByLabel(`Face ${b} solar access (%)`).fill("85");

  // A bad tilt is named at once and holds the estimate.
  await page.getByLabel(`Face ${b} tilt (°)`).fill("95");
  await expect(page.getByText("Tilt must be 0–90°")).toBeVisible();
  await page.getByLabel(`Face ${b} tilt (°)`).fill("15");

  await page.getByLabel("Target offset (%)").fill("100");
  await page.getByRole("button", { name: "Size to target offset" }).click();
  await expect(page.getByText(/Sized to 100 % offset/)).toBeVisible();
  await expect(page.getByTestId("offset")).toHaveText(/^(99|10\d) %$/);
  await expect(page.getByTestId("production-chart")).toBeVisible();
  await expect(page.getByTestId("annual-kwh")).not.toHaveText("—");
  await expect(page.getByTestId("string-check")).toBeVisible();
  await expect(page.getByText(/licensed professional/).first()).toBeVisible();

  await page.getByRole("button", { name: "Save design" }).click();
  await expect(page.getByText("Design saved.")).toBeVisible();

  await page.getByRole("link", { name: "Offers" }).click();
  await page.getByRole("button", { name: "Add an offer" }).click();
  await page.getByLabel("Offer name").fill("Whole roof, cash");
  // The preview figures the inputs before saving: a $100 discount takes $100 off the price at once.
  const previewPrice = page.getByTestId("offer-preview").getByTestId("preview-price");
  await expect(previewPrice).toHaveText(/^\$[\d,]+/, { timeout: 30_000 });
  const dollars = async () => Number(((await previewPrice.textContent()) ?? "").replace(/[$,]/g, ""));
  const fullPrice = await dollars();
  expect(fullPrice).toBeGreaterThan(1_000);
  await page.getByLabel("Discount ($)").fill("100");
  await expect.poll(dollars, { timeout: 15_000 }).toBe(fullPrice - 100);
  await page.getByLabel("Discount ($)").fill("");
  await expect.poll(dollars, { timeout: 15_000 }).toBe(fullPrice);
  await page.getByRole("button", { name: "Create and compute" }).click();
  await expect(page.getByRole("article", { name: "Offer Whole roof, cash" })).toBeVisible({ timeout: 30_000 });

  await page.getByRole("button", { name: "Add an offer" }).click();
  await page.getByLabel("Offer name").fill("Whole roof, loan");
  await page.getByLabel("Loan").check();
  await page.getByLabel("APR (%)").fill("5.99");
  await page.getByLabel("Term (months)").fill("180");
  // A down payment below the deposit asked at signing is refused on its field.
  const downPayment = page.getByLabel(/Down payment/);
  await downPayment.fill("1");
  await page.getByRole("button", { name: "Create and compute" }).click();
  await expect(page.locator("#offer-down-payment-error")).toContainText("deposit is paid at signing");
  await downPayment.fill("5000");
  await expect(page.getByTestId("preview-down-payment")).toHaveText("$5,000", { timeout: 15_000 });
  await page.getByRole("button", { name: "Create and compute" }).click();
  const loanCard = page.getByRole("article", { name: "Offer Whole roof, loan" });
  await expect(loanCard).toBeVisible({ timeout: 30_000 });
  await expect(loanCard.getByTestId("loan-terms")).toContainText("$5,000 down at signing (year 0)");
  await expect(loanCard.getByTestId("figure-definitions")).toContainText("the $5,000 down payment plus all the loan's payments");
  await expect(page.getByRole("article", { name: "Offer Whole roof, cash" }).getByTestId("figure-definitions")).toContainText("Payback is the year in which the running total");

  const table = page.getByTestId("offer-comparison");
  await expect(table.getByRole("columnheader")).toHaveCount(3);
  await expect(table.getByRole("row", { name: /Payback/ })).toContainText("years");
  await expect(table.getByRole("row", { name: /Monthly loan payment/ })).toContainText("$");
  await expect(table.getByRole("row", { name: /Down payment/ })).toContainText("$5,000");
  await expect(table.getByRole("row", { name: /Loan amount/ })).toContainText("$");
  await expect(page.getByTestId("cashflow-chart")).toBeVisible();
  await expect(page.getByText(/Estimates, not a guarantee/)).toBeVisible();

  // Another utility's plan is marked as such and needs a reason, which the Timeline keeps.
  await page.getByRole("button", { name: "Add an offer" }).click();
  await page.getByLabel("Offer name").fill("Town plan");
  await page.getByLabel(/^Rate plan/).selectOption({ label: "Another utility — Cedar Fork Municipal Power: Town Residential R" });
  await page.getByRole("button", { name: "Create and compute" }).click();
  const reason = page.getByLabel("Why another utility's plan (kept on the Timeline)");
  await expect(page.getByText(/"Town Residential R" is a plan of Cedar Fork Municipal Power, not of Piedmont Electric Cooperative/).first()).toBeVisible({ timeout: 30_000 });
  await reason.fill("Annexed by the town in January; the meter moves then");
  await page.getByRole("button", { name: "Create and compute" }).click();
  await expect(page.getByRole("article", { name: "Offer Town plan" })).toBeVisible({ timeout: 30_000 });
  await page.getByRole("link", { name: "Timeline" }).click();
  await expect(page.getByText(/with Cedar Fork Municipal Power's plan "Town Residential R", not Piedmont Electric Cooperative's: Annexed by the town/)).toBeVisible();
});
