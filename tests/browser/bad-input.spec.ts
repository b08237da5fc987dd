import { expect, test } from "@playwright/test";
import { APP_URL, apiSignIn, signIn, unique, alertOf } from "./support";

test("a wrong password gets a clear message", async ({ page }) => {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill("rep2@tallgrass.example");
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(alertOf(page)).toHaveText("Wrong e-mail or password. Check both and try again.");
  await expect(page).toHaveURL(/\/sign-in$/);
});

test("the sixth quick wrong attempt is refused with 429, and the limit is kept in the database", async ({ request }) => {
  const email = `${unique("guess")}@nowhere.example`;
  const statuses: number[] = [];
  for (let i = 0; i < 6; i++) {
    const res = await request.post("/api/auth/sign-in/email", { data: { email, password: `wrong-${i}-password` }, headers: { Origin: APP_URL } });
    statuses.push(res.status());
    if (i === 5) {
      const body = await res.json();
      expect(body.message).toContain("Too many wrong passwords");
    }
  }
  expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
});

test("a signed-in form with bad input shows field errors", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/settings/people");
  await page.getByLabel("E-mail").fill("not an address");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.locator("#invite-email-error")).toContainText("Enter a valid e-mail address");
});

test("a malformed JSON body gets 400 with { error: { code, message } }; an invalid one gets 422 naming the field", async ({ request }) => {
  await apiSignIn(request, "admin@tallgrass.example");
  const malformed = await request.post("/api/people", { data: Buffer.from("{ not json"), headers: { "Content-Type": "application/json" } });
  expect(malformed.status()).toBe(400);
  expect(await malformed.json()).toEqual({ error: { code: "invalid_json", message: "The request body is not valid JSON." } });

  const invalid = await request.post("/api/people", { data: { email: "nope", role: "wizard" } });
  expect(invalid.status()).toBe(422);
  const body = await invalid.json();
  expect(body.error.code).toBe("validation_failed");
  expect(Object.keys(body.error.fields).sort()).toEqual(["email", "role"]);
});

// Validation messages name the field by its label and say what is wrong in words: no dotted
// paths ("energy.periods.1.centsPerKwh"), no zod wording ("Too small", "received NaN").
const RAW = /energy\.periods|plan\.|Too small|Invalid input|received NaN|expected number/;

test("a rate plan's bad figures are named by their labels, on the screen and in the API's answer", async ({ page, request }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/rate-plans/new");
  await page.getByLabel("Utility").selectOption({ label: "Piedmont Electric Cooperative" });
  await page.getByLabel("Plan name").fill(unique("Bad figures"));
  await page.getByLabel("Fixed charge ($ / month)").fill("");
  await page.getByRole("radio", { name: "Time-of-use" }).check();
  await page.locator("#period-1-price").fill("-2");
  await page.getByRole("button", { name: "Create rate plan" }).click();
  const problems = page.getByRole("list", { name: "Problems" });
  await expect(problems).toContainText("Period 2 — Price (¢/kWh) must be at least 0");
  await expect(problems).toContainText("Fixed charge ($ / month) is required");
  await expect(page.locator("main")).not.toContainText(RAW);

  await apiSignIn(request, "admin@tallgrass.example");
  const plans = (await (await request.get("/api/rate-plans")).json()).data as { utilityId: string; plan: { energy: { kind: string; periods?: { centsPerKwh: number }[] } } }[];
  const tou = plans.find((p) => p.plan.energy.kind === "tou")!;
  const plan = structuredClone(tou.plan);
  plan.energy.periods![1].centsPerKwh = -2;
  const res = await request.post("/api/rate-plans", { data: { utilityId: tou.utilityId, active: true, plan } });
  expect(res.status()).toBe(422);
  const { error } = await res.json();
  expect(error.fields["plan.energy.periods.1.centsPerKwh"]).toEqual(["Period 2 — cents per kWh must be at least 0"]);
  expect(error.message).toBe("Period 2 — cents per kWh must be at least 0");
});

test("an emptied latitude says the field is required, by its label, beside the Save button", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto("/deals");
  await page.getByRole("link", { name: "Esposito household" }).click();
  await page.getByLabel("Latitude (°N)").fill("");
  await page.getByRole("button", { name: "Save household" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Latitude (°N)");
  await expect(page.locator("main")).not.toContainText(RAW);
});

test("company settings out of range are named by their labels in the message beside Save", async ({ page }) => {
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/settings/company");
  await page.getByLabel("Years the savings run").fill("5");
  await page.getByRole("button", { name: "Save company settings" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Years the savings run");
  await expect(page.locator("main")).not.toContainText(RAW);
});

test("the price book names a bad figure by its row's label", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/price-book");
  await page.locator("#band-0-price").fill("");
  await page.getByRole("button", { name: "Save changes" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Band 1 price, $ per watt is required");
  await expect(page.locator("main")).not.toContainText(RAW);
});

test("the crew forms name a bad name by its label beside their button, and the message goes at the next edit", async ({ page }) => {
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/jobs/crews");
  // A new crew: refused before sending.
  const form = page.getByRole("form", { name: "New crew" });
  await form.getByLabel("New crew").fill("A");
  await form.getByRole("button", { name: "Add crew" }).click();
  const besideAdd = form.locator("div", { has: page.getByRole("button", { name: "Add crew" }) }).last();
  await expect(besideAdd.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("New crew");
  await form.getByLabel("New crew").pressSequentially("B");
  await expect(form.getByRole("alert").filter({ hasText: "Not saved" })).toHaveCount(0);
  // An existing crew renamed to one letter: the server refuses, named by the field's label beside Save crew.
  const card = page.getByTestId("crew-Crew North");
  await card.getByLabel("Name").fill("N");
  await card.getByRole("button", { name: "Save crew" }).click();
  const besideSave = card.locator("div", { has: page.getByRole("button", { name: "Save crew" }) }).last();
  await expect(besideSave.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Name");
  await expect(card).not.toContainText(RAW);
  await card.getByLabel("Name").pressSequentially("o");
  await expect(card.getByRole("alert").filter({ hasText: "Not saved" })).toHaveCount(0);
});

test("the refund form names a missing amount by its label beside Refund, and the message goes at the next edit", async ({ page }) => {
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/deals/7a11a55e-0000-4000-8000-000000000306/money"); // Fairweather: its deposit paid (scripts/lib/seed-demo.ts)
  await page.getByRole("button", { name: "Refund…" }).first().click();
  const form = page.getByRole("form", { name: "Refund this deposit" });
  await form.getByLabel("Reason (the customer sees it)").fill("Roof needs work first");
  await form.getByRole("button", { name: "Refund", exact: true }).click();
  const besideRefund = form.locator("div", { has: page.getByRole("button", { name: "Refund", exact: true }) }).last();
  await expect(besideRefund.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Amount (USD)");
  await expect(form).not.toContainText(RAW);
  await form.getByLabel("Amount (USD)").pressSequentially("1");
  await expect(form.getByRole("alert").filter({ hasText: "Not saved" })).toHaveCount(0);
});

test("the checklist form names a missing item by its label beside its button, and the message goes at the next edit", async ({ page }) => {
  await signIn(page, "owner@tallgrass.example");
  await page.goto("/settings/checklists");
  await page.getByRole("button", { name: "New checklist" }).click();
  const form = page.getByRole("form", { name: "New checklist" });
  await form.getByLabel("Checklist name").fill("Battery install");
  await form.getByRole("button", { name: "Create checklist" }).click();
  const besideCreate = form.locator("div", { has: page.getByRole("button", { name: "Create checklist" }) }).last();
  await expect(besideCreate.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Item 1");
  await expect(form).not.toContainText(/items\.0|Too small/);
  await form.getByLabel("Item 1", { exact: true }).pressSequentially("Torque the lugs");
  await expect(form.getByRole("alert").filter({ hasText: "Not saved" })).toHaveCount(0);
});

test("the station upload names a bad latitude by its label beside its button, and the message goes at the next edit", async ({ page }) => {
  await signIn(page, "admin@tallgrass.example");
  await page.goto("/weather");
  const form = page.locator("form", { has: page.getByRole("button", { name: "Check and add station" }) });
  await form.getByLabel("Latitude (° N)").fill("123");
  await form.getByRole("button", { name: "Check and add station" }).click();
  const besideAdd = form.locator("div", { has: page.getByRole("button", { name: "Check and add station" }) }).last();
  await expect(besideAdd.getByRole("alert").filter({ hasText: "Not saved" })).toContainText("Latitude (° N)");
  await expect(form).not.toContainText(RAW);
  await form.getByLabel("Latitude (° N)").fill("36.1");
  await expect(form.getByRole("alert").filter({ hasText: "Not saved" })).toHaveCount(0);
});
