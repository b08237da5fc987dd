import { expect, test, type Locator, type Page } from "@playwright/test";
import { alertOf, signIn, watchBrowserProblems, withDb } from "./support";

// The office's board at desktop size: the stage rules refuse a move with their reason, an admin
// moves with a reason typed in the dialog, and the deal's Timeline shows who moved it and why.
test.use({ viewport: { width: 1440, height: 900 } });
test.describe.configure({ mode: "serial" });

const PERMIT_REASON = "No permit approval date is recorded for this deal";
const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
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
// A card is one element: the link to its deal, named by its visible text.
const halvorsen = (scope: Page | Locator) => scope.getByRole("link", { name: /^Halvorsen household/ });

/** Drags like a person: press, move in small steps (dnd-kit needs movement), release over the column. */
async function drag(page: Page, card: Locator, target: Locator) {
  await target.scrollIntoViewIfNeeded();
  await card.scrollIntoViewIfNeeded();
  const from = await card.boundingBox();
  const to = await target.boundingBox();
  if (!from || !to) throw new Error("The card or the column is not on screen");
  const startX = from.x + from.width / 2;
  const startY = from.y + from.height - 6;
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
  await expect(halvorsen(permitting)).toBeFocused(); // and the focus with it
  await expect(halvorsen(installBooked)).toHaveCount(0);
  await expect(page).toHaveURL(/\/board$/); // the drag did not follow the card's link

  // Nothing changed on the server either.
  await page.reload();
  await expect(halvorsen(column(page, "Permitting"))).toBeVisible();
});

/** Focuses the card and picks it up with Space, retried until the page has hydrated. */
async function pickUp(page: Page, card: Locator) {
  await card.scrollIntoViewIfNeeded();
  const live = page.locator('[id^="DndLiveRegion"]');
  await expect(async () => {
    await card.focus();
    await page.keyboard.press("Space");
    await expect(live).toContainText(/Picked up Halvorsen household|Halvorsen household is over/, { timeout: 2_000 });
  }).toPass({ timeout: 60_000 });
  return live;
}

test("refused by keyboard, the card is back in its column and keeps the focus", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto("/board");
  const live = await pickUp(page, halvorsen(column(page, "Permitting")));
  await page.keyboard.press("ArrowRight");
  await expect(live).toContainText("Halvorsen household is over Install booked");
  await page.keyboard.press("Space");
  await expect(alertOf(page)).toContainText(PERMIT_REASON);
  await expect(halvorsen(column(page, "Permitting"))).toBeFocused();
  // Still the card: Space picks it up again (over its own column), Escape puts it back.
  await page.keyboard.press("Space");
  await expect(live).toContainText(/Picked up Halvorsen household|Halvorsen household is over Permitting/);
  await page.keyboard.press("Escape");
  await expect(halvorsen(column(page, "Permitting"))).toBeFocused();
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
  const live = await pickUp(page, halvorsen(column(page, "Install booked")));
  await page.keyboard.press("ArrowRight");
  await expect(live).toContainText("Halvorsen household is over Installed");
  await page.keyboard.press("Space");
  await expect(halvorsen(column(page, "Installed"))).toBeVisible();
  await expect(page.getByTestId("board-notice")).toContainText("Halvorsen household moved to Installed");
  await expect(halvorsen(column(page, "Installed"))).toBeFocused();
  // Enter is the card's link: it opens the deal.
  await page.keyboard.press("Enter");
  await expect(page).toHaveURL(new RegExp(`/deals/${dealId}$`));
});

test("the overview shows every stage with its count and takes the focus to the column", async ({ page }) => {
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/board");
  const overview = page.getByRole("navigation", { name: "Stages" });
  await expect(overview.getByRole("link")).toHaveCount(15);
  const installed = column(page, "Installed");
  const shown = await installed.getByTestId("board-card").count();
  await expect(overview.getByRole("link", { name: `Installed ${shown} deals`, exact: true })).toBeVisible();

  // Live (PTO), the last pipeline column, is off screen to the right at first.
  const live = column(page, "Live (PTO)");
  await expect(live).not.toBeInViewport();
  await overview.getByRole("link", { name: /^Live \(PTO\) \d+ deals$/ }).click();
  await expect(live).toBeFocused();
  await expect(live).toBeInViewport();
});

test("On hold, Lost and Cancelled start closed with their counts, open on demand and stay as the person left them", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/board");
  const lost = column(page, "Lost");
  const [rows] = await withDb((conn) => conn.query("SELECT COUNT(*) AS n FROM deal WHERE company_id = ? AND stage = 'lost'", [DEMO_COMPANY_ID]));
  const n = Number((rows as { n: number }[])[0].n);
  expect(n).toBeGreaterThan(0);
  for (const name of ["On hold", "Lost", "Cancelled"]) {
    await expect(column(page, name).getByRole("button", { name: /^Show \d+ cards?$/ })).toHaveAttribute("aria-expanded", "false");
    await expect(column(page, name).getByTestId("board-card")).toHaveCount(0);
  }
  await expect(page.getByRole("navigation", { name: "Stages" }).getByRole("link", { name: `Lost ${n} deals`, exact: true })).toBeVisible();

  await lost.getByRole("button", { name: `Show ${n} ${n === 1 ? "card" : "cards"}` }).click();
  await expect(lost.getByTestId("board-card")).toHaveCount(n);
  await page.reload();
  await expect(column(page, "Lost").getByTestId("board-card")).toHaveCount(n); // remembered in this browser
  await expect(column(page, "On hold").getByTestId("board-card")).toHaveCount(0);
  await column(page, "Lost").getByRole("button", { name: "Hide the cards" }).click();
  await expect(column(page, "Lost").getByTestId("board-card")).toHaveCount(0);
});
