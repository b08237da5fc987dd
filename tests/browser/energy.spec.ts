import { readFileSync } from "node:fs";
import { expect, test, type Page } from "@playwright/test";
import { PDFDocument, StandardFonts } from "pdf-lib";
import { alertOf, signIn } from "./support";

test.use({ viewport: { width: 820, height: 1180 } }); // a tablet in portrait, where reps work

async function textPdf(lines: string[]): Promise<Buffer> {
  const doc = await PDFDocument.create();
  const page = doc.addPage([612, 792]);
  const font = await doc.embedFont(StandardFonts.Helvetica);
  lines.forEach((line, i) => page.drawText(line, { x: 50, y: 740 - i * 18, size: 11, font }));
  return Buffer.from(await doc.save());
}

async function upload(page: Page, name: string, mimeType: string, buffer: Buffer) {
  await page.getByTestId("bill-file-input").setInputFiles({ name, mimeType, buffer });
}

async function openEnergy(page: Page, household: string) {
  await page.goto("/deals");
  await page.getByRole("link", { name: household }).click();
  await page.getByRole("link", { name: "Energy" }).click();
  await expect(page.getByRole("heading", { name: "Bills", exact: true })).toBeVisible();
}

test("bad files get a clear message each, and nothing is kept", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");

  const elf = Buffer.alloc(4096);
  elf.set([0x7f, 0x45, 0x4c, 0x46, 0x02, 0x01, 0x01, 0x00]);
  await upload(page, "bill.pdf", "application/pdf", elf);
  await expect(alertOf(page)).toContainText("is a program");

  await upload(page, "damaged.pdf", "application/pdf", Buffer.from("%PDF-1.7\n1 0 obj << /Type /Catalog >>\nnot a pdf\n%%EOF"));
  await expect(alertOf(page)).toContainText("cannot be read");

  const big = Buffer.alloc(11 * 1024 * 1024);
  big.write("%PDF-1.7\n");
  await upload(page, "huge.pdf", "application/pdf", big);
  await expect(alertOf(page)).toContainText("bill files up to 10 MB");

  await expect(page.getByRole("heading", { name: "Files", exact: true })).toBeVisible();
  await expect(page.getByTestId("upload-list")).toHaveCount(0);
});

test("a text PDF bill is read into one table to confirm; the usage year appears", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");
  const pdf = await textPdf(["Piedmont Electric Cooperative", "Billing period 01/03/2026 - 02/02/2026", "Energy used 1,024 kWh", "Amount due $142.37", "Total amount due $150.12"]);
  await upload(page, "january-bill.pdf", "application/pdf", pdf);
  const reading = page.getByTestId("bill-reading");
  await expect(reading.getByLabel("Period kWh")).toHaveValue("1024");
  await expect(reading.getByLabel("Period from")).toHaveValue("2026-01-03");
  await expect(reading).toContainText("page 1, line 3");
  // Two labelled amounts: both are offered, and the rep's pick is what is saved.
  await expect(reading.getByTestId("amount-alternatives").getByRole("radio")).toHaveCount(2);
  await reading.getByRole("radio", { name: /142\.37/ }).check();
  await reading.getByRole("button", { name: "Save to the bills" }).click();
  // The chart's tooltip is a status too once the pointer rests on it.
  await expect(page.getByRole("status").filter({ hasText: "Saved 1 bill" })).toBeVisible();
  await expect(page.getByLabel("Bill 1 amount")).toHaveValue("142.37");
  await expect(page.getByTestId("annual-kwh")).not.toHaveText("0");
  await expect(page.getByText("1 of 12 months from bills")).toBeVisible();
  await expect(page.getByTestId("upload-list")).toContainText("january-bill.pdf");

  // Overlapping bills are refused, naming the bill; the saved one stays.
  await page.getByRole("button", { name: "Add a bill" }).click();
  await page.getByLabel("Bill 2 from").fill("2026-01-20");
  await page.getByLabel("Bill 2 to").fill("2026-02-20");
  await page.getByLabel("Bill 2 kWh").fill("900");
  await page.getByRole("button", { name: "Save bills" }).click();
  await expect(alertOf(page).first()).toContainText("overlaps");
  await page.reload();
  await expect(page.getByTestId("bill-row")).toHaveCount(1);
});

test("a scanned bill is kept, with the request to type the numbers", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");
  const doc = await PDFDocument.create();
  const p = doc.addPage([612, 792]);
  p.drawRectangle({ x: 40, y: 600, width: 500, height: 120 }); // drawn, no text layer: like a scan
  await upload(page, "scan.pdf", "application/pdf", Buffer.from(await doc.save()));
  await expect(page.getByRole("status")).toContainText("scanned PDF with no text");
  await expect(page.getByTestId("upload-list")).toContainText("scan.pdf");
});

test("a bill with a 13-month history fills the usage year in one step, its months marked", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");
  // The test above saved a bill on this deal: start from an empty table.
  while ((await page.getByLabel("Bill 1 kWh").inputValue()) !== "") await page.getByRole("button", { name: "Remove bill 1" }).click();
  await upload(page, "larkhaven-classic.pdf", "application/pdf", readFileSync("tests/fixtures/bills/larkhaven-classic.pdf"));
  const reading = page.getByTestId("bill-reading");
  await expect(reading.getByTestId("history-month")).toHaveCount(13);
  await expect(reading.getByLabel("Amount due")).toHaveValue("142.91");
  await reading.getByRole("button", { name: "Save to the bills" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Saved 12 bills" })).toBeVisible();
  await expect(page.getByTestId("from-history")).toHaveCount(11);
  await expect(page.getByText("12 of 12 months from bills")).toBeVisible();
});

test("a history month the reader is unsure of is flagged, and saved only once the rep has compared it", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");
  while ((await page.getByLabel("Bill 1 kWh").inputValue()) !== "") await page.getByRole("button", { name: "Remove bill 1", exact: true }).click();
  const months = ["Dec", "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov"];
  const kwh = ["900", "1010", "1230", "1130", "1010", "31", "1180", "1260", "1240", "1050", "880", "972"]; // May: a day count where the kWh belongs
  const pdf = await textPdf(["Fenbury Electric", "Billing period 10/28/2025 - 11/25/2025", "Energy used 972 kWh", "Amount due $120.00", "Month        kWh", ...months.map((m, i) => `${m}          ${kwh[i]}`)]);
  await upload(page, "fenbury.pdf", "application/pdf", pdf);
  const reading = page.getByTestId("bill-reading");
  await expect(reading.getByTestId("history-month")).toHaveCount(12);
  const unsure = reading.locator('[data-testid="history-month"][data-unsure="true"]');
  await expect(unsure).toHaveCount(1);
  await expect(unsure).toContainText("May 2025");
  await expect(unsure).toContainText("Not sure: its figure looks like a day count");
  // Not saved while the flagged month has not been compared.
  await reading.getByRole("button", { name: "Save to the bills" }).click();
  await expect(reading.getByText(/Compare May 2025 with the bill/)).toBeVisible();
  await expect(page.getByLabel("Bill 1 kWh")).toHaveValue("");
  await reading.getByLabel("May 2025 kWh").fill("940");
  await reading.getByTestId("history-checked").getByRole("checkbox").check();
  await reading.getByRole("button", { name: "Save to the bills" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Saved 12 bills" })).toBeVisible();
});

test("a photo of a bill is read by OCR while the rep sees it being read, then the same table to confirm", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");
  await upload(page, "bill-photo.jpg", "image/jpeg", readFileSync("tests/fixtures/bills/photos/cobble-creek-across-photo.jpg"));
  // The upload is quick; OCR takes seconds, and the screen says so while it runs.
  await expect(page.getByTestId("upload-stage")).toContainText("read by OCR");
  const reading = page.getByTestId("bill-reading");
  await expect(reading).toHaveAttribute("data-source", "ocr", { timeout: 60_000 });
  await expect(reading.getByText("source: ocr")).toBeVisible();
  await expect(reading.getByLabel("Amount due")).toHaveValue("121.37");
  await expect(reading.getByTestId("history-month")).toHaveCount(12);
  await expect(page.getByRole("status")).toContainText("It was read from a picture: check each figure.");
});

test("photos of a bill's two pages, chosen together, are read as one bill", async ({ page }) => {
  test.setTimeout(180_000);
  await signIn(page, "rep@tallgrass.example");
  await openEnergy(page, "Abernathy household");
  const dir = "tests/fixtures/bills/photo-sets/birchfield-two-page";
  await page.getByTestId("bill-file-input").setInputFiles(["page-1.jpg", "page-2.jpg"].map((name) => ({ name, mimeType: "image/jpeg", buffer: readFileSync(`${dir}/${name}`) })));
  const reading = page.getByTestId("bill-reading");
  await expect(reading).toHaveAttribute("data-source", "ocr", { timeout: 150_000 });
  // Page 1 prints the period and amount, page 2 the history: both in the one table.
  await expect(reading.getByLabel("Period from")).toHaveValue("2025-09-30");
  await expect(reading.getByLabel("Amount due")).toHaveValue("88.15");
  await expect(reading.getByTestId("history-month")).toHaveCount(12);
  await expect(page.getByRole("status")).toContainText("page-1.jpg + page-2.jpg");
});
