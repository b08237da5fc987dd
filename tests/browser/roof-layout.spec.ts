import { expect, test } from "@playwright/test";
import { signIn } from "./support";

// A crew lead on a phone (390 × 844) opens a demo job's packet: the roof layout of each face is
// drawn with its pathways kept clear, says itself in words, zooms inside its own scroll region
// (the page never scrolls sideways), and the bill of materials lists racking with its counts.
test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

/** Crew North's demo job (the Galloway household: microinverters, two faces with measured outlines). */
const GALLOWAY_JOB_ID = "7a11a55e-0000-4000-8000-000000000822";

const pageOverflow = (page: import("@playwright/test").Page) => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

test("a crew lead opens the roof layout on the job page from a phone", async ({ page }) => {
  await signIn(page, "crew@tallgrass.example");
  await page.goto(`/jobs/${GALLOWAY_JOB_ID}`);
  const layout = page.getByTestId("roof-layout-section");
  await expect(layout.getByRole("heading", { name: "Roof layout" })).toBeVisible();
  await expect(layout).toContainText("2021 IRC R324.6");

  const garage = layout.getByTestId("roof-sketch").first();
  const drawing = garage.getByRole("img", { name: "Roof layout of Garage south" });
  await drawing.scrollIntoViewIfNeeded();
  await expect(drawing).toBeVisible();
  // The drawing: 12 modules in rows, and a pathway and a ridge setback hatched.
  await expect(drawing.locator("[data-module]")).toHaveCount(12);
  await expect(drawing.locator('[data-keep-clear="pathway"]')).toHaveCount(1);
  await expect(drawing.locator('[data-keep-clear="ridge"]')).toHaveCount(1);
  // The same in words, tied to the drawing.
  await expect(garage.getByTestId("roof-sketch-text")).toContainText("Garage south: 9.5 m eave × 4.7 m slope, portrait; 12 of 12 modules placed (row 1: 7, row 2: 5)");

  // Zoomed in, the drawing scrolls inside its region; the page itself never scrolls sideways.
  const region = garage.getByRole("region", { name: "Roof layout of Garage south" });
  expect(await region.evaluate((el) => el.scrollWidth - el.clientWidth)).toBeLessThanOrEqual(1);
  await garage.getByRole("button", { name: "3×" }).click();
  await expect(garage.getByRole("button", { name: "3×" })).toHaveAttribute("aria-pressed", "true");
  expect(await region.evaluate((el) => el.scrollWidth - el.clientWidth)).toBeGreaterThan(300);
  expect(await pageOverflow(page)).toBeLessThanOrEqual(0);
  await region.evaluate((el) => el.scrollBy({ left: 400 }));
  await expect(garage.locator('[data-scroll-cue="start"]')).toBeVisible();

  // The bill of materials beneath: racking counted from the rows, with how it was counted.
  const bom = page.getByTestId("bom");
  await bom.scrollIntoViewIfNeeded();
  await expect(bom).toContainText("Racking rail");
  await expect(bom).toContainText("Ridgeway Mounts RW-100 rail");
  await expect(bom).toContainText("Roof attachment");
  expect(await pageOverflow(page)).toBeLessThanOrEqual(0);
});
