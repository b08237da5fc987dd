import { expect, test } from "@playwright/test";
import { signIn, unique, withDb } from "./support";

// Each person's Today: a rep's opened proposal and the customer's question, a crew member's jobs
// today and this week (their crew's only), the office's jobs to schedule. Rows of their own in
// the demo company, removed afterwards.
test.describe.configure({ mode: "serial" });

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const REP2_ID = "7a11a55e-0000-4000-8000-000000000105";
const CREW_NORTH_ID = "7a11a55e-0000-4000-8000-000000000801"; // crew@ (scripts/lib/seed/jobs.ts)
const CREW_SOUTH_ID = "7a11a55e-0000-4000-8000-000000000802";
const tag = unique("d").slice(-5);
const homes = {
  proposal: `Ulverston ${tag} household`,
  today: `Wickersham ${tag} household`,
  week: `Yarborough ${tag} household`,
  south: `Zennor ${tag} household`,
};
const ids = Object.fromEntries(Object.keys(homes).map((k) => [k, { household: crypto.randomUUID(), deal: crypto.randomUUID(), job: crypto.randomUUID() }])) as Record<
  keyof typeof homes,
  { household: string; deal: string; job: string }
>;
const question = `Could the inverter go in the garage instead? (${tag})`;

/** The company's calendar day (America/New_York, its setting in the demo), shifted by whole days. */
function day(offset: number): string {
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/New_York", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
  return new Date(Date.parse(`${today}T00:00:00Z`) + offset * 86_400_000).toISOString().slice(0, 10);
}

test.beforeAll(async () => {
  await withDb(async (conn) => {
    const stages: Record<keyof typeof homes, string> = { proposal: "proposal_out", today: "install_booked", week: "permitting", south: "install_booked" };
    for (const key of Object.keys(homes) as (keyof typeof homes)[]) {
      await conn.query(
        `INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude)
         VALUES (?, ?, ?, '8 Fallow Court', 'Summerfield', 'NC', '27358', 36.2, -79.9)`,
        [ids[key].household, DEMO_COMPANY_ID, homes[key]],
      );
      await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) VALUES (?, ?, ?, ?, ?, 'Referral')", [
        ids[key].deal,
        DEMO_COMPANY_ID,
        ids[key].household,
        REP2_ID,
        stages[key],
      ]);
    }
    // A proposal the customer opened two days ago, with a question, not signed.
    const proposalId = crypto.randomUUID();
    await conn.query(
      `INSERT INTO proposal (id, company_id, deal_id, number, version, status, snapshot, pdf_storage_key, pdf_sha256, token_hash, expires_at, sent_to_email, first_opened_at, last_viewed_at)
       VALUES (?, ?, ?, 90000 + FLOOR(RAND() * 9000), 1, 'sent', '{}', ?, REPEAT('0', 64), ?, NOW(3) + INTERVAL 20 DAY, 'ulverston@homeowner.example', NOW(3) - INTERVAL 2 DAY, NOW(3) - INTERVAL 1 DAY)`,
      [proposalId, DEMO_COMPANY_ID, ids.proposal.deal, `proposals/${proposalId}.pdf`, crypto.randomUUID().replaceAll("-", "").padEnd(64, "a")],
    );
    await conn.query("INSERT INTO proposal_event (id, company_id, proposal_id, kind, body) VALUES (?, ?, ?, 'question', ?)", [
      crypto.randomUUID(),
      DEMO_COMPANY_ID,
      proposalId,
      question,
    ]);
    // Crew North: an install today and a survey in three days; Crew South: an install today; no crew yet: to schedule.
    await conn.query("INSERT INTO job (id, company_id, deal_id, crew_id, install_date) VALUES (?, ?, ?, ?, ?)", [ids.today.job, DEMO_COMPANY_ID, ids.today.deal, CREW_NORTH_ID, day(0)]);
    await conn.query("INSERT INTO job (id, company_id, deal_id, crew_id, survey_date) VALUES (?, ?, ?, ?, ?)", [ids.week.job, DEMO_COMPANY_ID, ids.week.deal, CREW_NORTH_ID, day(3)]);
    await conn.query("INSERT INTO job (id, company_id, deal_id, crew_id, install_date) VALUES (?, ?, ?, ?, ?)", [ids.south.job, DEMO_COMPANY_ID, ids.south.deal, CREW_SOUTH_ID, day(0)]);
    await conn.query("INSERT INTO job (id, company_id, deal_id) VALUES (?, ?, ?)", [ids.proposal.job, DEMO_COMPANY_ID, ids.proposal.deal]);
  });
});

test.afterAll(async () => {
  await withDb(async (conn) => {
    for (const key of Object.keys(homes) as (keyof typeof homes)[]) {
      await conn.query("DELETE FROM household WHERE id = ? AND company_id = ?", [ids[key].household, DEMO_COMPANY_ID]);
    }
  });
});

test("a rep sees the customer's question and the opened proposal, each linking to the Proposal tab", async ({ page }) => {
  await signIn(page, "rep2@tallgrass.example");
  const questions = page.getByTestId("customer-questions");
  await expect(questions).toContainText(homes.proposal);
  await expect(questions).toContainText(question);
  await expect(questions.getByRole("link", { name: homes.proposal })).toHaveAttribute("href", `/deals/${ids.proposal.deal}/proposal`);
  const opened = page.getByTestId("proposals-opened");
  await expect(opened.getByRole("link", { name: homes.proposal })).toHaveAttribute("href", `/deals/${ids.proposal.deal}/proposal`);
  // The office's queues are not a rep's.
  await expect(page.getByTestId("jobs-to-schedule")).toHaveCount(0);
});

test("a crew member sees their crew's jobs today and this week, not another crew's", async ({ page }) => {
  await signIn(page, "crew@tallgrass.example");
  const today = page.getByTestId("crew-today");
  await expect(today.getByRole("link", { name: `Install: ${homes.today}` })).toHaveAttribute("href", `/jobs/${ids.today.job}`);
  const week = page.getByTestId("crew-week");
  await expect(week.getByRole("link", { name: `Site survey: ${homes.week}` })).toHaveAttribute("href", `/jobs/${ids.week.job}`);
  await expect(page.getByText(homes.south)).toHaveCount(0);
  await expect(page.getByText(homes.proposal)).toHaveCount(0);
});

test("the office sees the job without a crew or an install date among the jobs to schedule", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  const toSchedule = page.getByTestId("jobs-to-schedule");
  await expect(toSchedule.getByRole("link", { name: homes.proposal })).toHaveAttribute("href", `/jobs/${ids.proposal.job}`);
  await expect(toSchedule).not.toContainText(homes.today);
  // The rep's own queue is the rep's.
  await expect(page.getByTestId("customer-questions")).toHaveCount(0);
});
