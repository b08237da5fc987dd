import { expect, test, type Locator, type Page } from "@playwright/test";
import { PDFDocument, StandardFonts } from "pdf-lib";
import { signIn, unique } from "./support";

test.use({ viewport: { width: 820, height: 1180 } }); // a tablet in portrait, where reps work

/** A bill PDF with this period's amount and a 12-month usage history, as utilities print them. */
async function billWithHistory(): Promise<Buffer> {
  const doc = await PDFDocument.create();
  const page = doc.addPage([612, 792]);
  const font = await doc.embedFont(StandardFonts.Helvetica);
  const kwh = [1180, 1020, 890, 760, 820, 1110, 1340, 1290, 1030, 790, 850, 1090];
  const lines = ["Piedmont Electric Cooperative", "Account 0042-7781", "Usage history (last 12 bills)"];
  for (let m = 0; m < 12; m++) {
    const start = new Date(Date.UTC(2025, m, 1));
    const end = new Date(Date.UTC(2025, m + 1, 1));
    const us = (d: Date) => `${d.getUTCMonth() + 1}/${d.getUTCDate()}/${d.getUTCFullYear()}`;
    lines.push(`${us(start)} - ${us(end)}   ${kwh[m].toLocaleString("en-US")} kWh   Amount due $${(kwh[m] * 0.135 + 14).toFixed(2)}`);
  }
  lines.forEach((line, i) => page.drawText(line, { x: 50, y: 740 - i * 18, size: 11, font }));
  return Buffer.from(await doc.save());
}

test("a rep takes a new lead to two compared offers at the kitchen table", async ({ page }) => {
  test.setTimeout(180_000);
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/deals");

  // Every tap, typed field, pick or upload the rep makes is counted (README: "Interactions").
  let interactions = 0;
  const tap = async (target: Locator) => {
    interactions += 1;
    await target.click();
  };
  const type = async (target: Locator, text: string) => {
    interactions += 1;
    await target.fill(text);
  };
  const pick = async (target: Locator, index: number) => {
    interactions += 1;
    await target.selectOption({ index });
  };
  const check = async (target: Locator) => {
    interactions += 1;
    await target.check();
  };
  const attach = async (p: Page, buffer: Buffer) => {
    interactions += 1;
    await p.getByTestId("bill-file-input").setInputFiles({ name: "bill-with-history.pdf", mimeType: "application/pdf", buffer });
  };

  // Lead
  const household = unique("Juniper");
  await tap(page.getByRole("link", { name: "New lead" }));
  await type(page.getByLabel("Household name"), `${household} household`);
  await type(page.getByLabel("Main contact"), "Robin Juniper");
  await type(page.getByLabel("Street address"), "58 Larkspur Bend");
  await pick(page.getByLabel(/Or start from a recent site/), 1);
  await pick(page.getByLabel("Rate plan"), 1);
  await tap(page.getByRole("button", { name: "Create lead and add bills" }));
  await expect(page.getByRole("heading", { name: `${household} household` })).toBeVisible();

  // Energy: one bill PDF with its usage history gives all twelve months.
  await attach(page, await billWithHistory());
  await expect(page.getByTestId("bill-suggestions").getByRole("checkbox")).toHaveCount(12);
  await tap(page.getByRole("button", { name: "Add to the table" }));
  await tap(page.getByRole("button", { name: "Save bills" }));
  await expect(page.getByRole("status")).toContainText("Saved 12 bills");
  await expect(page.getByTestId("annual-kwh")).toHaveText("12,170");

  // Design: two roof faces, sized to a 100 % offset.
  await tap(page.getByRole("link", { name: "Design" }));
  await expect(page.getByRole("heading", { name: "Roof faces" })).toBeVisible();
  await tap(page.getByRole("button", { name: "Add a roof face" }));
  await type(page.getByLabel("Face 2 azimuth (°)"), "250");
  await tap(page.getByRole("button", { name: "Size to target offset" }));
  await expect(page.getByText(/Sized to 100 % offset|modules\./).first()).toBeVisible();
  await expect(page.getByTestId("production-chart")).toBeVisible();
  await tap(page.getByRole("button", { name: "Save design" }));
  await expect(page.getByText("Design saved.")).toBeVisible();

  // Offers: cash and loan, compared side by side.
  await tap(page.getByRole("link", { name: "Offers" }));
  await tap(page.getByRole("button", { name: "Add an offer" }));
  await tap(page.getByRole("button", { name: "Create and compute" }));
  await expect(page.getByRole("article")).toHaveCount(1, { timeout: 30_000 });
  await tap(page.getByRole("button", { name: "Add an offer" }));
  await check(page.getByLabel("Loan"));
  await tap(page.getByRole("button", { name: "Create and compute" }));
  await expect(page.getByRole("article")).toHaveCount(2, { timeout: 30_000 });

  const table = page.getByTestId("offer-comparison");
  await expect(table.getByRole("columnheader")).toHaveCount(3);
  await expect(table.getByRole("row", { name: /Payback/ })).toContainText("years");
  await expect(page.getByTestId("cashflow-chart")).toBeVisible();

  console.log(`rep journey: ${interactions} interactions from the deals list to two compared offers`);
  expect(interactions).toBeLessThanOrEqual(25);
});
