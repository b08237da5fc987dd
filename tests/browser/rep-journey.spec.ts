import { expect, test, type Locator, type Page } from "@playwright/test";
import { readFileSync } from "node:fs";
import { signIn, unique } from "./support";

test.use({ viewport: { width: 820, height: 1180 } }); // a tablet in portrait, where reps work

// Two ways the bills arrive: a PDF bill, and a phone photo of a paper bill (read by OCR). Both
// from the test corpus (tests/fixtures/bills), each printing a usage history that gives the year.
const BILLS = [
  {
    way: "a PDF bill",
    path: "tests/fixtures/bills/cobble-creek-across.pdf",
    mimeType: "application/pdf",
    historyMonths: 12,
  },
  {
    way: "a phone photo of a paper bill",
    path: "tests/fixtures/bills/photos/larkhaven-classic-photo.jpg",
    mimeType: "image/jpeg",
    historyMonths: 12,
  },
];

for (const bill of BILLS) {
  test(`a rep takes a new lead to two compared offers at the kitchen table, from ${bill.way}`, async ({
    page,
  }) => {
    test.setTimeout(240_000);
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
      await p
        .getByTestId("bill-file-input")
        .setInputFiles({
          name: bill.path.split("/").pop()!,
          mimeType: bill.mimeType,
          buffer,
        });
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
    await expect(
      page.getByRole("heading", { name: `${household} household` }),
    ).toBeVisible();

    // Energy: one bill whose usage history gives all twelve months, confirmed in one table.
    await attach(page, readFileSync(bill.path));
    await expect(page.getByTestId("history-month")).toHaveCount(
      bill.historyMonths,
      { timeout: 60_000 },
    );
    await tap(page.getByRole("button", { name: "Save to the bills" }));
    await expect(page.getByRole("status")).toContainText("Saved 12 bills");
    await expect(page.getByText("12 of 12 months from bills")).toBeVisible();

    // Design: two roof faces, sized to a 100 % offset.
    await tap(page.getByRole("link", { name: "Design" }));
    await expect(
      page.getByRole("heading", { name: "Roof faces" }),
    ).toBeVisible();
    await tap(page.getByRole("button", { name: "Add a roof face" }));
    await type(page.getByLabel("Face 2 azimuth (°)"), "250");
    await tap(page.getByRole("button", { name: "Size to target offset" }));
    await expect(
      page.getByText(/Sized to 100 % offset|modules\./).first(),
    ).toBeVisible();
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
    await expect(table.getByRole("row", { name: /Payback/ })).toContainText(
      "years",
    );
    await expect(page.getByTestId("cashflow-chart")).toBeVisible();

    console.log(
      `rep journey from ${bill.way}: ${interactions} interactions from the deals list to two compared offers`,
    );
    expect(interactions).toBeLessThanOrEqual(25);
  });
}
