import { expect, test, type Locator, type Page } from "@playwright/test";
import { alertOf, signIn, unique, withDb } from "./support";

// Issue #7: an office manager drags a deal to Install booked without a permit approval date and
// is refused with the reason; once the deal's job has the date, the same drag moves it and the
// Timeline shows the move. A deal of its own in the demo company, so no other journey is touched.
test.use({ viewport: { width: 1440, height: 900 } });
test.describe.configure({ mode: "serial" });

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const REP2_ID = "7a11a55e-0000-4000-8000-000000000105";
const PERMIT_REASON = "No permit approval date is recorded for this deal";
const name = `Quennell household ${unique("permit").slice(-5)}`;
const householdId = crypto.randomUUID();
const dealId = crypto.randomUUID();
const jobId = crypto.randomUUID();

test.beforeAll(async () => {
  await withDb(async (conn) => {
    await conn.query(
      `INSERT INTO household (id, company_id, name, contact_name, street, city, region, postal_code, latitude, longitude)
       VALUES (?, ?, ?, 'Ilse Quennell', '12 Larchmont Way', 'Kernersville', 'NC', '27284', 36.12, -80.07)`,
      [householdId, DEMO_COMPANY_ID, name],
    );
    await conn.query(
      `INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, stage_changed_at, source, system_dc_watts, contract_cents)
       VALUES (?, ?, ?, ?, 'permitting', NOW(3), 'Referral', 6800, 1972000)`,
      [dealId, DEMO_COMPANY_ID, householdId, REP2_ID],
    );
    // Its job: permit submitted, not yet approved.
    await conn.query(
      `INSERT INTO job (id, company_id, deal_id, permit_number, permit_submitted_on) VALUES (?, ?, ?, 'KRN-BP-26-0577', CURRENT_DATE - INTERVAL 10 DAY)`,
      [jobId, DEMO_COMPANY_ID, dealId],
    );
  });
});

// The deal, its job and its Timeline go with the household (foreign keys cascade).
test.afterAll(async () => {
  await withDb((conn) => conn.query("DELETE FROM household WHERE id = ? AND company_id = ?", [householdId, DEMO_COMPANY_ID]));
});

const column = (page: Page, stage: string) => page.getByRole("region", { name: stage, exact: true });
const card = (scope: Page | Locator) => scope.getByRole("link", { name: new RegExp(`^${name}`) });

/** Drags like a person: press, move in small steps (dnd-kit needs movement), release over the column. */
async function drag(page: Page, from: Locator, target: Locator) {
  await target.scrollIntoViewIfNeeded();
  await from.scrollIntoViewIfNeeded();
  const a = await from.boundingBox();
  const b = await target.boundingBox();
  if (!a || !b) throw new Error("The card or the column is not on screen");
  const startX = a.x + a.width / 2;
  const startY = a.y + a.height - 6;
  await page.mouse.move(startX, startY);
  await page.mouse.down();
  await page.mouse.move(startX + 12, startY + 4, { steps: 4 });
  await page.mouse.move(b.x + b.width / 2, b.y + 90, { steps: 15 });
  await page.mouse.move(b.x + b.width / 2 + 2, b.y + 92, { steps: 2 });
  await page.mouse.up();
}

test("without a permit approval date the office manager's drag is refused with the reason", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto("/board");
  const permitting = column(page, "Permitting");
  await expect(card(permitting)).toBeVisible();

  await drag(page, card(permitting), column(page, "Install booked"));

  await expect(alertOf(page)).toContainText(PERMIT_REASON);
  await expect(page.getByRole("dialog")).toHaveCount(0); // an office manager cannot override with a reason
  await expect(card(permitting)).toBeVisible();
  await expect(card(column(page, "Install booked"))).toHaveCount(0);

  await page.reload();
  await expect(card(column(page, "Permitting"))).toBeVisible();
  const [rows] = await withDb((conn) => conn.query("SELECT stage FROM deal WHERE id = ?", [dealId]));
  expect((rows as { stage: string }[])[0].stage).toBe("permitting");
});

test("once the job has its permit approval date, the same drag moves the deal and the Timeline shows it", async ({ page }) => {
  await withDb((conn) => conn.query("UPDATE job SET permit_approved_on = CURRENT_DATE - INTERVAL 1 DAY WHERE id = ? AND company_id = ?", [jobId, DEMO_COMPANY_ID]));

  await signIn(page, "office@tallgrass.example");
  await page.goto("/board");
  const permitting = column(page, "Permitting");
  const installBooked = column(page, "Install booked");
  await expect(card(permitting)).toBeVisible();

  await drag(page, card(permitting), installBooked);

  await expect(page.getByRole("dialog")).toHaveCount(0); // no reason asked: the date is on record
  await expect(page.getByTestId("board-notice")).toContainText(`${name} moved to Install booked`);
  await expect(card(installBooked)).toBeVisible();
  await expect(alertOf(page)).toHaveCount(0);

  await page.reload();
  await expect(card(column(page, "Install booked"))).toBeVisible();

  await page.goto(`/deals/${dealId}/timeline`);
  const timeline = page.getByRole("list", { name: "What happened" });
  await expect(timeline).toContainText(`Priya Castellanos moved ${name} from Permitting to Install booked`);
  await expect(timeline.getByRole("listitem").last()).toContainText("Priya Castellanos");
});
