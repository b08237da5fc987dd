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
  await expect(page.getByText("Enter a valid e-mail address")).toBeVisible();
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
