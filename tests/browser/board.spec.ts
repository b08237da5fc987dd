import { expect, test, type Locator, type Page } from "@playwright/test";
import { alertOf, signIn, watchBrowserProblems, withDb } from "./support";

// The office's board at desktop size: the stage rules refuse a move with their reason, an admin
// moves with a reason typed in the dialog, and the deal's Timeline shows who moved it and why.
test.use({ viewport: { width: 1440, height: 900 } });
test.describe.configure({ mode: "serial" });

const PERMIT_REASON = "No permit approval date is recorded for this deal";
let dealId = "";
let original: { stage: string; stageChangedAt: Date } | null = null;

test.beforeAll(async () => {
  await withDb(async (conn) => {
    const [rows] = await conn.query(
      "SELECT d.id, d.stage, d.stage_changed_at AS changed FROM deal d JOIN household h ON h.id = d.household_id WHERE h.name = 'Halvorsen household' LIMIT 1",
    );
    const row = (rows as { id: string; stage: string; changed: Date }[])[0];
    dealId = row.id;
    original = { stage: row.stage, stageChangedAt: row.changed };
  });
  expect(original?.stage).toBe("permitting");
});

// Other journeys may expect the demo deal in Permitting: put it back.
test.afterAll(async () => {
  if (!original) return;
  await withDb((conn) => conn.query("UPDATE deal SET stage = ?, stage_changed_at = ? WHERE id = ?", [original!.stage, original!.stageChangedAt, dealId]));
});

const column = (page: Page, name: string) => page.getByRole("region", { name, exact: true });
const halvorsen = (scope: Page | Locator) => scope.getByRole("button", { name: /^Halvorsen household/ });

/** Drags like a person: press, move in small steps (dnd-kit needs movement), release over the column. */
async function drag(page: Page, card: Locator, target: Locator) {
  await target.scrollIntoViewIfNeeded();
  await card.scrollIntoViewIfNeeded();
  const from = await card.boundingBox();
  const to = await target.boundingBox();
  if (!from || !to) throw new Error("The card or the column is not on screen");
  const startX = from.x + from.width / 2;
  const startY = from.y + from.height - 6; // below the household link
  await page.mouse.move(startX, startY);
  await page.mouse.down();
  await page.mouse.move(startX + 12, startY + 4, { steps: 4 });
  await page.mouse.move(to.x + to.width / 2, to.y + 90, { steps: 15 });
  await page.mouse.move(to.x + to.width / 2 + 2, to.y + 92, { steps: 2 });
  await page.mouse.up();
}

test("the office manager is refused Install booked without a permit approval date, with the reason", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto("/board");
  await expect(page.getByRole("heading", { name: "Board", exact: true })).toBeVisible();
  const permitting = column(page, "Permitting");
  const installBooked = column(page, "Install booked");
  await expect(halvorsen(permitting)).toBeVisible();

  await drag(page, halvorsen(permitting), installBooked);

  await expect(alertOf(page)).toContainText(PERMIT_REASON);
  await expect(page.getByRole("dialog")).toHaveCount(0); // only an owner or admin may give a reason
  await expect(halvorsen(permitting)).toBeVisible(); // back in its column
  await expect(halvorsen(installBooked)).toHaveCount(0);

  // Nothing changed on the server either.
  await page.reload();
  await expect(halvorsen(column(page, "Permitting"))).toBeVisible();
});

test("the owner moves it with a reason, and the Timeline shows who and why", async ({ page }) => {
  const why = "Permit approved by phone; the paper copy follows";
  // Drag and drop (dnd-kit) under the app's CSP: no violation, no page error.
  const problems = await watchBrowserProblems(page.context());
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/board");
  const permitting = column(page, "Permitting");
  const installBooked = column(page, "Install booked");
  await expect(halvorsen(permitting)).toBeVisible();

  await drag(page, halvorsen(permitting), installBooked);

  const dialog = page.getByRole("dialog", { name: "Move Halvorsen household to Install booked" });
  await expect(dialog).toBeVisible();
  await expect(dialog).toContainText(PERMIT_REASON);
  await expect(dialog.getByLabel("Reason")).toBeFocused();
  await dialog.getByLabel("Reason").fill(why);
  await dialog.getByRole("button", { name: "Move deal" }).click();

  await expect(dialog).toHaveCount(0);
  await expect(halvorsen(installBooked)).toBeVisible();
  await expect(halvorsen(permitting)).toHaveCount(0);
  await expect(page.getByTestId("board-notice")).toContainText("Halvorsen household moved to Install booked");

  await page.reload();
  await expect(halvorsen(column(page, "Install booked"))).toBeVisible();

  await page.goto(`/deals/${dealId}/timeline`);
  const timeline = page.getByRole("list", { name: "What happened" });
  await expect(timeline).toContainText(`Maren Lindqvist moved Halvorsen household from Permitting to Install booked: ${why}`);
  await expect(timeline.getByRole("listitem").last()).toContainText("Maren Lindqvist");
  problems.expectNone();
});

test("a card moves by keyboard too (Space, arrows, Space), announced to screen readers", async ({ page }) => {
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/board");
  const card = halvorsen(column(page, "Install booked"));
  await card.scrollIntoViewIfNeeded();
  const live = page.locator('[id^="DndLiveRegion"]');
  // Retried until the page has hydrated and the card answers Space.
  await expect(async () => {
    await card.focus();
    await page.keyboard.press("Space");
    await expect(live).toContainText(/Picked up Halvorsen household|Halvorsen household is over Install booked/, { timeout: 2_000 });
  }).toPass({ timeout: 60_000 });
  await page.keyboard.press("ArrowRight");
  await expect(live).toContainText("Halvorsen household is over Installed");
  await page.keyboard.press("Space");
  await expect(halvorsen(column(page, "Installed"))).toBeVisible();
  await expect(page.getByTestId("board-notice")).toContainText("Halvorsen household moved to Installed");
});
