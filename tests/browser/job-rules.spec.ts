import { expect, test } from "@playwright/test";
import { signIn, unique, withDb } from "./support";

// What people see of the job's workflow rules: a cancelled job is read only and says why, and
// has left the Jobs list; the job form names the first install day after the buyer's right to
// cancel; before its install date the crew cannot mark a job installed (the office confirms,
// with a reason). The jobs are made here, so the demo's jobs stay as other journeys expect them.
test.describe.configure({ mode: "serial" });

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const CREW_NORTH_ID = "7a11a55e-0000-4000-8000-000000000801";
const REASON = "the buyer cancelled P-9901 v1 on Thursday, December 3, 2026, inside the right-to-cancel window";

const made = { cancelled: "", early: "", windowed: "", earlyName: "", cancelledName: "", windowEnd: "" };

/** Job days are calendar days in the company's time zone (the demo's: America/New_York). */
const zoneDay = (offsetDays: number) => {
  const d = new Date(Date.now() + offsetDays * 86_400_000);
  return new Intl.DateTimeFormat("en-CA", { timeZone: "America/New_York", year: "numeric", month: "2-digit", day: "2-digit" }).format(d);
};

test.beforeAll(async () => {
  await withDb(async (conn) => {
    const newJob = async (name: string, stage: string, job: Record<string, unknown>) => {
      const householdId = crypto.randomUUID();
      const dealId = crypto.randomUUID();
      const jobId = crypto.randomUUID();
      await conn.query(
        "INSERT INTO household (id, company_id, name, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, '7 Vane Court', 'Greensboro', 'NC', '27405', 36.08, -79.79)",
        [householdId, DEMO_COMPANY_ID, name],
      );
      await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) SELECT ?, ?, ?, id, ?, 'Referral' FROM user WHERE email = 'rep@tallgrass.example'", [dealId, DEMO_COMPANY_ID, householdId, stage]);
      const cols = Object.keys(job);
      await conn.query(`INSERT INTO job (id, company_id, deal_id, crew_id, checklist${cols.map((c) => `, ${c}`).join("")}) VALUES (?, ?, ?, ?, '[]'${cols.map(() => ", ?").join("")})`, [
        jobId,
        DEMO_COMPANY_ID,
        dealId,
        CREW_NORTH_ID,
        ...Object.values(job),
      ]);
      return { jobId, dealId };
    };
    made.cancelledName = `${unique("Cancelled").replace(/[^A-Za-z0-9]/g, "")} household`;
    made.cancelled = (await newJob(made.cancelledName, "cancelled", { survey_date: zoneDay(2), cancelled_at: new Date(), cancel_reason: REASON })).jobId;
    made.earlyName = `${unique("Early").replace(/[^A-Za-z0-9]/g, "")} household`;
    made.early = (await newJob(made.earlyName, "install_booked", { install_date: zoneDay(5), permit_approved_on: zoneDay(-3) })).jobId;

    // A deal signed at home today: a copy of a demo signed proposal, moved to this deal, window open.
    const windowed = await newJob(`${unique("Window").replace(/[^A-Za-z0-9]/g, "")} household`, "deposit_paid", {});
    made.windowed = windowed.jobId;
    made.windowEnd = zoneDay(6);
    const proposalId = crypto.randomUUID();
    await conn.query("CREATE TEMPORARY TABLE signed_copy SELECT * FROM proposal WHERE company_id = ? AND status = 'signed' AND in_home_sale = 1 LIMIT 1", [DEMO_COMPANY_ID]);
    await conn.query("UPDATE signed_copy SET id = ?, deal_id = ?, number = 90000 + FLOOR(RAND() * 9999), token_hash = SHA2(?, 256), signed_sha256 = NULL, cancel_deadline = ?", [
      proposalId,
      windowed.dealId,
      proposalId,
      made.windowEnd,
    ]);
    await conn.query("INSERT INTO proposal SELECT * FROM signed_copy");
    await conn.query("DROP TEMPORARY TABLE signed_copy");
    await conn.query("UPDATE job SET proposal_id = ? WHERE id = ?", [proposalId, made.windowed]);
  });
});

test("the office sees a cancelled job read only with the reason, and not in the Jobs list", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto(`/jobs/${made.cancelled}`);
  await expect(page.getByTestId("job-cancelled")).toContainText(`Job cancelled: ${REASON}. It is read only`);
  await expect(page.getByTestId("job-stage")).toHaveText("Cancelled");
  await expect(page.getByLabel("Site survey (planned)")).toBeDisabled();
  await expect(page.getByRole("button", { name: "Save job" })).toHaveCount(0);
  await expect(page.getByRole("button", { name: "Mark installed" })).toHaveCount(0);
  await page.goto("/jobs");
  await expect(page.getByText(made.earlyName).first()).toBeVisible();
  await expect(page.getByText(made.cancelledName)).toHaveCount(0);
});

test("the job form names the first install day after the buyer's window and refuses an earlier one", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto(`/jobs/${made.windowed}`);
  const first = new Intl.DateTimeFormat("en-US", { weekday: "long", month: "long", day: "numeric", year: "numeric", timeZone: "UTC" }).format(new Date(`${zoneDay(7)}T00:00:00Z`));
  await expect(page.getByText(`The buyer's right to cancel ends first: the earliest install day is ${first}.`)).toBeVisible();
  await page.locator("#job-installDate").fill(made.windowEnd);
  await page.getByRole("button", { name: "Save job" }).click();
  await expect(page.getByText(/The install cannot be booked before the buyer's right to cancel ends/).first()).toBeVisible();
});

test("before its install date the crew cannot mark the job installed; the office confirms with a reason", async ({ page, browser }) => {
  await signIn(page, "crew@tallgrass.example");
  await page.goto(`/jobs/${made.early}`);
  await expect(page.getByTestId("install-early-note")).toContainText("Installing earlier needs the office's confirmation");
  await expect(page.getByRole("button", { name: "Mark installed" })).toHaveCount(0);

  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office@tallgrass.example");
  await office.goto(`/jobs/${made.early}`);
  await office.getByLabel(/Why was it installed before its install date/).fill("Dry weather moved the crew up");
  await office.getByRole("button", { name: "Confirm early install" }).click();
  await office.getByRole("button", { name: "Yes, installed" }).click();
  await expect(office.getByTestId("installed-status")).toBeVisible();
  await expect(office.getByTestId("job-stage")).toHaveText("Installed");
});
