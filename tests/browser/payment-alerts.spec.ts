import { expect, test } from "@playwright/test";
import { signIn } from "./support";

test("the office sees a refund of a payment the ledger does not know on Money → Reconciliation", async ({ page }) => {
  await signIn(page, "office@tallgrass.example");
  await page.goto("/money/reconciliation");
  const alerts = page.getByTestId("payment-alerts");
  await expect(alerts.getByRole("heading", { name: /Refunds of payments the ledger does not know/ })).toBeVisible();
  await expect(alerts).toContainText("ch_demo_unknown_1");
  await expect(alerts).toContainText("$250.00");
});
