import { expect, test } from "@playwright/test";
import { noSidewaysScroll, signIn, unique } from "./support";

// Where the house is: a first position from the ZIP, the device's own location at the door (or
// a plain message when it is refused), the numbers typed by hand, and never 0, 0.

const AT_THE_HOUSE = { latitude: 36.0652, longitude: -79.8261 };

test.describe("on a phone with location allowed", () => {
  test.use({ viewport: { width: 390, height: 844 }, geolocation: AT_THE_HOUSE, permissions: ["geolocation"] });

  test("the ZIP gives a first position, the device the house's, and the deal shows its time zone and station", async ({ page }) => {
    await signIn(page, "rep@tallgrass.example");
    await page.goto("/deals/new");
    const name = unique("Sparrow");
    await page.getByLabel("Household name").fill(`${name} household`);
    await page.getByLabel("Main contact").fill("Sam Sparrow");
    await page.getByLabel("Street address").fill("77 Copperbeech Street");
    await page.getByLabel("City", { exact: true }).fill("");
    await page.getByLabel("ZIP", { exact: true }).fill("27403");
    await page.getByRole("button", { name: "Position from ZIP" }).click();
    await expect(page.getByText("Position of ZIP 27403 (Greensboro, NC)")).toBeVisible();
    await expect(page.getByLabel("City", { exact: true })).toHaveValue("Greensboro");
    expect(Math.abs(Number(await page.getByLabel("Latitude (°N)").inputValue()) - 36.06)).toBeLessThan(0.1);

    await page.getByRole("button", { name: "I'm at the house" }).click();
    await expect(page.getByText(/Position from this device/)).toBeVisible();
    await expect(page.getByLabel("Latitude (°N)")).toHaveValue("36.0652");
    await expect(page.getByLabel(/Longitude/)).toHaveValue("-79.8261");
    await noSidewaysScroll(page, page.url());

    await page.getByLabel("Rate plan").selectOption({ label: "Piedmont Electric Cooperative — Residential Service RS-1" });
    await expect(page.getByLabel("Utility")).toHaveValue(/.+/);
    await page.getByRole("button", { name: "Create lead and add bills" }).click();
    await expect(page.getByRole("heading", { name: `${name} household` })).toBeVisible();
    await page.getByRole("link", { name: "Household", exact: true }).click();
    await expect(page.getByTestId("site-time-zone")).toHaveText("America/New_York (from the coordinates)");
    await expect(page.getByTestId("site-station")).toContainText(/km away \(the nearest\)/);
    await noSidewaysScroll(page, page.url());
  });
});

test.describe("on a tablet with location refused", () => {
  test.use({ viewport: { width: 820, height: 1180 }, geolocation: AT_THE_HOUSE, permissions: [] });

  test("the rep is told how to go on, and 0, 0 or a dropped minus sign is refused with the reason", async ({ page }) => {
    await signIn(page, "rep@tallgrass.example");
    await page.goto("/deals");
    await page.getByRole("link", { name: "Esposito household" }).click();
    await expect(page.getByTestId("site-station")).toContainText("km away");

    await page.getByRole("button", { name: "I'm at the house" }).click();
    await expect(page.getByText("Location is blocked for Kilowright on this device.")).toBeVisible();

    const latitude = page.getByLabel("Latitude (°N)");
    const longitude = page.getByLabel(/Longitude/);
    await latitude.fill("0");
    await longitude.fill("0");
    await page.getByRole("button", { name: "Save household" }).click();
    await expect(page.getByText(/0, 0 is open sea off West Africa/).first()).toBeVisible();

    await latitude.fill("35.9821");
    await longitude.fill("80.0103");
    await page.getByRole("button", { name: "Save household" }).click();
    await expect(page.getByText(/km from ZIP 27262 \(High Point, NC\): check the coordinates or the ZIP/).first()).toBeVisible();

    // The rep adjusts the position by hand (a few metres from the stored one).
    await latitude.fill("35.9824");
    await longitude.fill("-80.0101");
    await page.getByRole("button", { name: "Save household" }).click();
    await expect(page.getByRole("status")).toContainText("Saved.");
    await noSidewaysScroll(page, page.url());
  });
});
