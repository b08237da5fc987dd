import { createHash, randomBytes } from "node:crypto";
import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { signIn, unique, withDb } from "./support";

// Issue #18: every screen of every role passes axe-core's WCAG 2.0/2.1/2.2 A and AA rules, at a
// laptop's and a phone's size. One test per role and size walks its screens and fails once,
// listing every violation with its rule, impact, the elements' selectors and axe's own message
// (for contrast: the ratio, both colours and the font size), so the fix is plain from the output.
const SIZES = [
  { name: "desktop", viewport: { width: 1280, height: 800 } },
  { name: "phone", viewport: { width: 390, height: 844 } },
] as const;
const TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"];
/**
 * axe files these under best practice, not a WCAG tag; they hold here too: every piece of content
 * inside a landmark (header, nav, main…), one main, headings in order (WCAG 1.3.1, 2.4.6 in spirit).
 */
const ALSO = ["region", "landmark-one-main", "landmark-unique", "landmark-no-duplicate-main", "heading-order", "page-has-heading-one"];

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
/** The demo's Esposito deal (rep@'s): designed, offered, signed (scripts/lib/seed/proposals.ts). */
const ESPOSITO_DEAL_ID = "7a11a55e-0000-4000-8000-000000000305";
const REP_ID = "7a11a55e-0000-4000-8000-000000000104";
const DEAL_TABS = ["", "/energy", "/design", "/offers", "/proposal", "/money", "/timeline"];

type Screen = { path: string; ready?: (page: Page) => Promise<void> };
type Finding = { screen: string; lines: string[] };

const officeScreens = (dealId: string, extra: string[]): Screen[] =>
  ["/today", "/deals", "/deals/new", ...DEAL_TABS.map((t) => `/deals/${dealId}${t}`), "/board", "/catalog", "/price-book", "/utilities", "/rate-plans", "/rate-plans/new", "/weather", ...extra].map(
    (path) => ({ path }),
  );

/** axe's findings on the page as it is now, one line per element. */
async function audit(page: Page, screen: string): Promise<Finding | null> {
  const rules = Object.fromEntries(ALSO.map((id) => [id, { enabled: true }]));
  const result = await new AxeBuilder({ page }).options({ runOnly: { type: "tag", values: TAGS }, rules }).analyze();
  if (result.violations.length === 0) return null;
  const lines = result.violations.flatMap((v) => [
    `  ${v.id} (${v.impact ?? "?"}): ${v.help} ×${v.nodes.length}`,
    ...v.nodes.slice(0, 6).map((n) => `    ${n.target.join(" ")} — ${[...n.any, ...n.all, ...n.none].map((c) => c.message).join("; ")}`),
    ...(v.nodes.length > 6 ? [`    … and ${v.nodes.length - 6} more`] : []),
  ]);
  return { screen, lines };
}

/** Opens each screen, waits until it has drawn (its h1, the network quiet), and audits it. */
async function walk(page: Page, screens: Screen[]): Promise<Finding[]> {
  const found: Finding[] = [];
  for (const s of screens) {
    await page.goto(s.path);
    // Client parts fetch after the first paint; a panel that polls never idles, hence the cap.
    await page.waitForLoadState("networkidle", { timeout: 3_000 }).catch(() => undefined);
    await expect(page.locator("h1").first()).toBeVisible();
    if (s.ready) await s.ready(page);
    const f = await audit(page, `${s.path}`);
    if (f) found.push(f);
  }
  return found;
}

function expectClean(found: Finding[], where: string) {
  const report = found.map((f) => `${f.screen}\n${f.lines.join("\n")}`).join("\n");
  expect(found.length, `axe violations (${where}):\n${report}`).toBe(0);
}

/** The first job the signed-in person sees on /jobs. */
async function firstJobPath(page: Page): Promise<string> {
  await page.goto("/jobs");
  const href = await page.locator('a[href^="/jobs/"]').filter({ hasNotText: /crews/i }).first().getAttribute("href");
  if (!href) throw new Error("No job on /jobs to audit");
  return href;
}

/**
 * A homeowner's link we know: a new household and deal with a copy of Esposito's signed proposal,
 * as sent (`signed` false) or as signed. Removed with its household afterwards.
 */
async function proposalLink(signed: boolean): Promise<{ token: string; householdId: string }> {
  const token = randomBytes(32).toString("base64url");
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  const tag = unique("axe");
  await withDb(async (conn) => {
    await conn.query(
      "INSERT INTO household (id, company_id, name, contact_name, email, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, 'Ada Axe', ?, '9 Fernhill Road', 'High Point', 'NC', '27262', 35.9821, -80.0103)",
      [householdId, DEMO_COMPANY_ID, `Axe ${tag} household`, `${tag}@axe-spec.example`],
    );
    await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source, contract_cents) VALUES (?, ?, ?, ?, ?, 'Referral', 1972000)", [
      dealId,
      DEMO_COMPANY_ID,
      householdId,
      REP_ID,
      signed ? "signed" : "proposal_out",
    ]);
    const signedColumns = "chosen_position, signed_at, signer_name, signer_email, signed_storage_key, signed_sha256, cancel_deadline";
    await conn.query(
      `INSERT INTO proposal (id, company_id, deal_id, number, version, status, snapshot, pdf_storage_key, pdf_sha256, token_hash, expires_at, sent_to_email, in_home_sale
         ${signed ? `, ${signedColumns}` : ""})
       SELECT ?, company_id, ?, (SELECT MAX(number) + 1 + FLOOR(RAND() * 1000) FROM proposal WHERE company_id = ?), 1, ?, snapshot, pdf_storage_key, pdf_sha256, ?,
         DATE_ADD(NOW(3), INTERVAL 30 DAY), ?, in_home_sale
         ${signed ? ", chosen_position, NOW(3), 'Ada Axe', sent_to_email, signed_storage_key, ?, cancel_deadline" : ""}
       FROM proposal WHERE company_id = ? AND deal_id = ? AND status = 'signed' ORDER BY version DESC LIMIT 1`,
      [
        crypto.randomUUID(),
        dealId,
        DEMO_COMPANY_ID,
        signed ? "signed" : "sent",
        createHash("sha256").update(token).digest("hex"),
        `${tag}@axe-spec.example`,
        ...(signed ? [randomBytes(32).toString("hex")] : []),
        DEMO_COMPANY_ID,
        ESPOSITO_DEAL_ID,
      ],
    );
  });
  return { token, householdId };
}

const households: string[] = [];
test.afterAll(async () => {
  await withDb(async (conn) => {
    for (const id of households) await conn.query("DELETE FROM household WHERE id = ? AND company_id = ?", [id, DEMO_COMPANY_ID]);
  });
});

async function asRole(browser: Browser, viewport: { width: number; height: number }, email: string, screens: (page: Page) => Promise<Screen[]>) {
  const context = await browser.newContext({ viewport });
  const page = await context.newPage();
  await signIn(page, email);
  const found = await walk(page, await screens(page));
  await context.close();
  return found;
}

for (const { name, viewport } of SIZES) {
  test.describe(`axe at ${name} size`, () => {
    test.describe.configure({ timeout: 240_000 });

    test(`the owner's screens (${name})`, async ({ browser }) => {
      const found = await asRole(browser, viewport, "owner@tallgrass.example", async (page) => [
        ...officeScreens(ESPOSITO_DEAL_ID, ["/jobs", await firstJobPath(page), "/jobs/crews", "/settings/people", "/settings/company", "/settings/checklists", "/money/reconciliation", "/dev/outbox"]),
        { path: `/jobs/${crypto.randomUUID()}` }, // the job's own not-found
        // The Board with its Lost column opened.
        { path: "/board", ready: (p) => p.getByRole("region", { name: "Lost", exact: true }).getByRole("button", { name: /^Show \d+ cards?$/ }).click() },
      ]);
      expectClean(found, `owner, ${name}`);
    });

    test(`the office manager's and the rep's screens (${name})`, async ({ browser }) => {
      // The owner's walk has every screen; these are the ones their rights draw differently
      // (read-only lists, a deal room without money or approval buttons, their own queues).
      const deal = (tab: string) => `/deals/${ESPOSITO_DEAL_ID}${tab}`;
      const office = await asRole(browser, viewport, "office@tallgrass.example", async (page) =>
        ["/today", "/deals", deal(""), deal("/offers"), deal("/money"), "/board", "/jobs", await firstJobPath(page), "/catalog", "/utilities", "/weather", "/settings/people"].map((path) => ({ path })),
      );
      const rep = await asRole(browser, viewport, "rep@tallgrass.example", async () =>
        ["/today", "/deals", deal(""), deal("/design"), deal("/offers"), deal("/proposal"), deal("/money"), "/board", "/jobs", "/catalog", "/price-book", "/rate-plans"].map((path) => ({ path })),
      );
      expectClean([...office.map((f) => ({ ...f, screen: `office ${f.screen}` })), ...rep.map((f) => ({ ...f, screen: `rep ${f.screen}` }))], `office and rep, ${name}`);
    });

    test(`the crew's screens (${name})`, async ({ browser }) => {
      const found = await asRole(browser, viewport, "crew@tallgrass.example", async (page) => [{ path: "/today" }, { path: "/jobs" }, { path: await firstJobPath(page) }, { path: "/board" }]);
      expectClean(found, `crew, ${name}`);
    });

    test(`the public screens: sign-in and its neighbours, /verify, not found (${name})`, async ({ browser }) => {
      const context = await browser.newContext({ viewport });
      const page = await context.newPage();
      const found = await walk(
        page,
        ["/sign-in", "/sign-up", "/forgot-password", "/reset-password?token=not-a-token", "/check-email", `/invite/${randomBytes(16).toString("hex")}`, "/verify", "/verify?lang=es", "/no-such-page", `/p/${randomBytes(32).toString("base64url")}`].map(
          (path) => ({ path }),
        ),
      );
      await context.close();
      expectClean(found, `public, ${name}`);
    });

    test(`the homeowner's page before and after signing, and the payment page (${name})`, async ({ browser }) => {
      const sent = await proposalLink(false);
      const signed = await proposalLink(true);
      households.push(sent.householdId, signed.householdId);
      const context = await browser.newContext({ viewport, ...(name === "phone" ? { isMobile: true, hasTouch: true } : {}) });
      const page = await context.newPage();
      const found = await walk(page, [{ path: `/p/${sent.token}` }, { path: `/p/${signed.token}` }]);
      // The deposit's checkout page (our dev payments server's, src/fakes/payments/page.ts).
      await page.getByTestId("deposit-panel").getByRole("button", { name: /^Pay the deposit/ }).click();
      await expect(page).toHaveURL(/\/pay\/cs_/, { timeout: 30_000 });
      const pay = await audit(page, "the payment page");
      if (pay) found.push(pay);
      await context.close();
      expectClean(found, `homeowner, ${name}`);
    });
  });
}
