// The deposit, end to end: a signed proposal (a copy of the demo's signed one, written to the
// database with a link token we know), the customer pays on the dev payments server's hosted
// page, the webhook books it, the office sees Deposit paid and the receipt is in the dev outbox.
// A declined card shows a clear message, and a second try with a good card goes through.
import { createHash, randomBytes } from "node:crypto";
import { expect, test, type BrowserContext, type Page } from "@playwright/test";
import { apiSignIn, unique, waitForMail, withDb } from "./support";

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
/** The demo's Esposito deal: at Signed, with a signed proposal (scripts/lib/seed/proposals.ts). */
const TEMPLATE_DEAL_ID = "7a11a55e-0000-4000-8000-000000000305";
const REP_ID = "7a11a55e-0000-4000-8000-000000000104";
const PHONE = { width: 390, height: 844 };
const GOOD_CARD = "4242 4242 4242 4242";
const DECLINED_CARD = "4000 0000 0000 0002";
/** Generous waits: the webhook and the page's polling run on a shared, sometimes busy test host. */
const SLOW = { timeout: 45_000 };
const EXPIRY = `12 / ${String((new Date().getUTCFullYear() + 5) % 100).padStart(2, "0")}`;

type SignedDeal = { token: string; dealId: string; email: string; householdName: string; depositText: string };

const money = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

/** A new household and deal at Signed with its own signed proposal, copied from the demo's. */
async function signedDeal(label: string): Promise<SignedDeal> {
  const token = randomBytes(32).toString("base64url");
  const tokenHash = createHash("sha256").update(token).digest("hex");
  const tag = unique(label);
  const email = `${tag}@deposit-spec.example`;
  const householdName = `Depositspec ${tag} household`;
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  const proposalId = crypto.randomUUID();
  const depositCents = await withDb(async (conn) => {
    const [rows] = await conn.query(
      "SELECT snapshot, chosen_position, pdf_storage_key, pdf_sha256, signed_storage_key, cancel_deadline, in_home_sale FROM proposal WHERE company_id = ? AND deal_id = ? AND status = 'signed' ORDER BY version DESC LIMIT 1",
      [DEMO_COMPANY_ID, TEMPLATE_DEAL_ID],
    );
    const [p] = rows as { snapshot: unknown; chosen_position: number; pdf_storage_key: string; pdf_sha256: string; signed_storage_key: string | null; cancel_deadline: string | null; in_home_sale: number }[];
    if (!p) throw new Error("The demo seed has no signed proposal on the Esposito deal to copy");
    const snapshotText = typeof p.snapshot === "string" ? p.snapshot : JSON.stringify(p.snapshot);
    const snapshot = JSON.parse(snapshotText) as { offers: { position: number; depositCents: number }[] };
    const offer = snapshot.offers.find((o) => o.position === p.chosen_position) ?? snapshot.offers[0];
    const [[{ n }]] = (await conn.query("SELECT COALESCE(MAX(number), 0) + 1 + FLOOR(RAND() * 1000) AS n FROM proposal WHERE company_id = ?", [DEMO_COMPANY_ID])) as unknown as [[{ n: number }]];

    await conn.query(
      "INSERT INTO household (id, company_id, name, contact_name, email, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, ?, ?, '402 Saltbox Way', 'High Point', 'NC', '27262', 35.9821, -80.0103)",
      [householdId, DEMO_COMPANY_ID, householdName, `Dana ${tag}`, email],
    );
    await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source, contract_cents) VALUES (?, ?, ?, ?, 'signed', 'Referral', 1972000)", [
      dealId,
      DEMO_COMPANY_ID,
      householdId,
      REP_ID,
    ]);
    await conn.query(
      `INSERT INTO proposal (id, company_id, deal_id, number, version, status, snapshot, pdf_storage_key, pdf_sha256, token_hash, expires_at, sent_to_email,
         in_home_sale, chosen_position, signed_at, signer_name, signer_email, signed_storage_key, signed_sha256, cancel_deadline)
       VALUES (?, ?, ?, ?, 1, 'signed', ?, ?, ?, ?, DATE_ADD(NOW(3), INTERVAL 30 DAY), ?, ?, ?, NOW(3), ?, ?, ?, ?, ?)`,
      [
        proposalId,
        DEMO_COMPANY_ID,
        dealId,
        n,
        snapshotText,
        p.pdf_storage_key,
        p.pdf_sha256,
        tokenHash,
        email,
        p.in_home_sale,
        p.chosen_position,
        `Dana ${tag}`,
        email,
        p.signed_storage_key,
        randomBytes(32).toString("hex"),
        p.cancel_deadline,
      ],
    );
    return offer.depositCents;
  });
  return { token, dealId, email, householdName, depositText: money(depositCents) };
}

/** Fills the dev payments server's hosted checkout page and presses Pay. */
async function payOnCheckout(page: Page, card: string, depositText: string): Promise<void> {
  await expect(page).toHaveURL(/\/pay\/cs_/, SLOW);
  await expect(page.getByTestId("amount")).toHaveText(depositText);
  await page.getByLabel("Card number").fill(card);
  await page.getByLabel("Expiry (MM / YY)").fill(EXPIRY);
  await page.getByLabel("Security code (CVC)").fill("123");
  await page.getByLabel("ZIP / postal code").fill("27262");
  await page.getByRole("button", { name: `Pay ${depositText}` }).click();
}

async function expectDepositReceived(page: Page, d: SignedDeal): Promise<void> {
  await expect(page).toHaveURL(new RegExp(`/p/${d.token}\\?deposit=returned$`), SLOW);
  const status = page.getByTestId("deposit-status");
  // Never the redirect's word: "confirming" until the webhook has booked it.
  await expect(status).toHaveAttribute("data-status", /^(loading|confirming|paid)$/);
  await expect(status).toHaveAttribute("data-status", "paid", SLOW);
  await expect(status).toContainText("Deposit received");
  await expect(status).toContainText(d.depositText);
  // The rest of the page follows without a reload: the stage and the next step move on.
  const next = page.getByTestId("project-next");
  await expect(next).toContainText("Site survey", SLOW);
  await expect(page.getByTestId("project-panel").locator("[aria-current='step']")).toContainText("Deposit paid");
  expect(await page.evaluate(() => (window as unknown as { __kwBoth?: boolean }).__kwBoth ?? false), "the page said Deposit received beside Next: Pay your deposit").toBe(false);
}

/**
 * Watches every page of the context for the contradiction of a paid deposit beside the
 * "Pay your deposit" next step (window.__kwBoth), checked at expectDepositReceived.
 */
async function watchContradiction(context: BrowserContext): Promise<void> {
  await context.addInitScript(() => {
    const w = window as unknown as { __kwBoth?: boolean };
    setInterval(() => {
      const text = document.body?.innerText ?? "";
      if (text.includes("Deposit received") && text.includes("Pay your deposit")) w.__kwBoth = true;
    }, 50);
  });
}

async function expectOfficeSeesPaid(page: Page, d: SignedDeal): Promise<void> {
  await apiSignIn(page.context().request, "office@tallgrass.example");
  await page.goto(`/deals/${d.dealId}/money`);
  await expect(page.getByTestId("deal-stage")).toHaveText("Deposit paid");
  await expect(page.getByTestId("payment-status")).toHaveText("Paid");
  await expect(page.getByTestId("payment-paid")).toContainText(d.depositText);
  await expect(page.getByText(/^pi_/)).toBeVisible();
  await page.goto(`/deals/${d.dealId}/timeline`);
  await expect(page.getByText(/Deposit of .* paid by card/)).toBeVisible();
}

test("the customer pays the deposit with 4242…; the deal shows Deposit paid and the receipt is in the outbox", async ({ browser }) => {
  test.setTimeout(180_000);
  const d = await signedDeal("paid");
  const customer = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
  await watchContradiction(customer);
  const page = await customer.newPage();
  await page.goto(`/p/${d.token}`);
  const panel = page.getByTestId("deposit-panel");
  await expect(panel).toContainText(d.depositText);
  const pay = panel.getByRole("button", { name: `Pay the deposit: ${d.depositText}` });
  await pay.click();
  await payOnCheckout(page, GOOD_CARD, d.depositText);
  await expectDepositReceived(page, d);
  await customer.close();

  const receipt = await waitForMail(d.email, /^Deposit received/);
  expect(receipt.subject).toContain(d.depositText);

  const office = await browser.newContext();
  await expectOfficeSeesPaid(await office.newPage(), d);
  await office.close();
});

test("a declined card shows a clear message, and a second try with 4242… goes through", async ({ browser }) => {
  test.setTimeout(240_000);
  const d = await signedDeal("declined");
  const customer = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
  await watchContradiction(customer);
  const page = await customer.newPage();
  await page.goto(`/p/${d.token}`);
  await page.getByRole("button", { name: `Pay the deposit: ${d.depositText}` }).click();
  await payOnCheckout(page, DECLINED_CARD, d.depositText);
  // The hosted page says why, and keeps the customer there to try another card.
  await expect(page.getByRole("alert")).toHaveText("Your card was declined.");
  await expect(page).toHaveURL(/\/pay\/cs_/, SLOW);

  // Back on the proposal page: the webhook has recorded the failure, said plainly, with a retry.
  await page.getByRole("link", { name: "Cancel and go back" }).click();
  await expect(page).toHaveURL(new RegExp(`/p/${d.token}\\?deposit=cancelled$`), SLOW);
  const status = page.getByTestId("deposit-status");
  await expect(status).toHaveAttribute("data-status", "failed", SLOW);
  await expect(status).toContainText("Your payment did not go through.");
  await expect(status).toContainText("Your card was declined.");
  await expect(status).toContainText("No money was taken.");

  const retry = page.getByRole("button", { name: `Try again: pay ${d.depositText}` });
  await retry.click();
  await payOnCheckout(page, GOOD_CARD, d.depositText);
  await expectDepositReceived(page, d);
  await customer.close();

  await waitForMail(d.email, /^Deposit received/);
  const office = await browser.newContext();
  const officePage = await office.newPage();
  await expectOfficeSeesPaid(officePage, d);
  // One checkout session served both tries.
  await officePage.goto(`/deals/${d.dealId}/money`);
  await expect(officePage.locator("[data-testid^='payment-']").filter({ has: officePage.getByTestId("payment-status") })).toHaveCount(1);
  await office.close();
});
