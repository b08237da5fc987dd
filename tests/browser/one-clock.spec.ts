// One clock everywhere, on the pages: a company in Honolulu (UTC−10) whose deal has a Timeline
// event and a paid deposit at 05:30 UTC on December 6, which is 7:30 PM on December 5 there.
// The Timeline and the Money tab say December 5 with the zone named; UTC would say December 6.
import { expect, test } from "@playwright/test";
import { createCompany, signIn, unique, withDb } from "./support";

const AT_UTC = "2026-12-06 05:30:00.000"; // stored as UTC (the app's connections use "Z")
const HONOLULU_TEXT = "Dec 5, 2026, 7:30 PM HST";

test("the Timeline and the Money tab show a Honolulu company's times on its own clock", async ({ page }) => {
  const owner = await createCompany("Island Clock Energy");
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  const proposalId = crypto.randomUUID();
  await withDb(async (conn) => {
    await conn.query("UPDATE company SET settings = JSON_OBJECT('timeZone', 'Pacific/Honolulu') WHERE id = ?", [owner.companyId]);
    await conn.query(
      "INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, 'Kalani household', '1 Lanai Way', 'Hilo', 'HI', '96720', 19.7, -155.08)",
      [householdId, owner.companyId],
    );
    await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage) SELECT ?, ?, ?, user_id, 'deposit_paid' FROM membership WHERE company_id = ?", [
      dealId,
      owner.companyId,
      householdId,
      owner.companyId,
    ]);
    await conn.query("INSERT INTO timeline_event (id, company_id, deal_id, kind, summary, created_at) VALUES (?, ?, ?, 'note', 'Deposit confirmed by the bank', ?)", [
      crypto.randomUUID(),
      owner.companyId,
      dealId,
      AT_UTC,
    ]);
    // The deposit belongs to a signed proposal: a copy of a demo one, moved to this deal.
    await conn.query("CREATE TEMPORARY TABLE clock_proposal AS SELECT * FROM proposal WHERE status = 'signed' LIMIT 1");
    const hex = () => Buffer.from(crypto.getRandomValues(new Uint8Array(32))).toString("hex"); // unique columns: token and signed-file hashes
    await conn.query("UPDATE clock_proposal SET id = ?, company_id = ?, deal_id = ?, token_hash = ?, signed_sha256 = ?, replaced_by_proposal_id = NULL", [
      proposalId,
      owner.companyId,
      dealId,
      hex(),
      hex(),
    ]);
    await conn.query("INSERT INTO proposal SELECT * FROM clock_proposal");
    await conn.query(
      "INSERT INTO payment (id, company_id, deal_id, proposal_id, checkout_session_id, amount_cents, paid_cents, status, paid_at, created_at) VALUES (?, ?, ?, ?, ?, 150000, 150000, 'paid', ?, ?)",
      [crypto.randomUUID(), owner.companyId, dealId, proposalId, unique("cs_test_clock"), AT_UTC, AT_UTC],
    );
  });

  await signIn(page, owner.email, owner.password);
  await page.goto(`/deals/${dealId}/timeline`);
  const event = page.getByRole("listitem").filter({ hasText: "Deposit confirmed by the bank" });
  await expect(event).toContainText(HONOLULU_TEXT);
  await expect(event).not.toContainText("Dec 6");

  await page.goto(`/deals/${dealId}/money`);
  await expect(page.getByText("$1,500.00").first()).toBeVisible();
  await expect(page.locator("main")).toContainText(HONOLULU_TEXT);
  await expect(page.locator("main")).not.toContainText("Dec 6, 2026");
});
