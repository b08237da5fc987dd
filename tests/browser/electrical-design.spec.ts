import { expect, test, type APIRequestContext, type APIResponse } from "@playwright/test";
import { apiSignIn, noSidewaysScroll, signIn, unique } from "./support";

// Issue #20: the crew lead opens the single-line diagram on a phone (zoomed wider, scrolled
// sideways inside its own region, the page itself never), and a rep cannot put a design whose
// service panel is unknown into a proposal until the panel's ratings are entered.

/** Crew North's demo job (the Galloway household: microinverters, 225 A busbar, 200 A main). */
const GALLOWAY_JOB_ID = "7a11a55e-0000-4000-8000-000000000822";
const MODULE_ID = "7a11a55e-0000-4000-8000-000000001001";
const INVERTER_ID = "7a11a55e-0000-4000-8000-000000001011";
const RATE_PLAN_ID = "7a11a55e-0000-4000-8000-000000002011";

async function ok<T = unknown>(res: APIResponse): Promise<T> {
  expect(res.status(), await res.text()).toBeLessThan(300);
  return ((await res.json()) as { data: T }).data;
}

test.describe("on a phone", () => {
  test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });

  test("a crew lead opens the job's single-line diagram, zooms it and reads it in words", async ({ page }) => {
    await signIn(page, "crew@tallgrass.example");
    await page.goto(`/jobs/${GALLOWAY_JOB_ID}`);
    const section = page.getByTestId("electrical-design");
    await section.scrollIntoViewIfNeeded();
    await expect(section.getByRole("heading", { name: "Electrical design and single-line diagram" })).toBeVisible();
    await expect(section.getByTestId("electrical-status")).toHaveText("Checks pass");
    const drawing = section.getByRole("img", { name: /Single-line diagram: Galloway household, NEC 2020/ });
    await expect(drawing).toBeVisible();

    // Full size: the drawing is 1600 px wide inside its own scroll region; the page does not scroll sideways.
    await section.getByRole("button", { name: "Full size" }).click();
    await expect(section.getByRole("button", { name: "Full size" })).toHaveAttribute("aria-pressed", "true");
    expect((await drawing.boundingBox())!.width).toBeGreaterThan(1500);
    const region = section.getByRole("region", { name: "Single-line diagram" });
    const widths = await region.evaluate((el) => ({ scroll: el.scrollWidth, client: el.clientWidth }));
    expect(widths.scroll).toBeGreaterThan(widths.client);
    await region.evaluate((el) => el.scrollTo({ left: el.scrollWidth }));
    await expect(region.getByText("utility meter", { exact: true })).toBeInViewport();
    await noSidewaysScroll(page, "job page with the diagram at full size");

    // The text alternative lists the chain from the array to the utility.
    await section.getByText("The diagram in words").click();
    const words = section.getByTestId("single-line-words");
    await expect(words).toContainText("microinverter at each module");
    await expect(words).toContainText("Service panel: busbar 225 A, main breaker 200 A, 240 V");
    await expect(words).toContainText("Utility meter");
  });
});

async function dealWithoutPanel(request: APIRequestContext): Promise<{ dealId: string; email: string }> {
  await apiSignIn(request, "rep@tallgrass.example");
  const email = `${unique("panel")}@homeowner.example`;
  const { dealId } = await ok<{ dealId: string }>(
    await request.post("/api/deals", {
      data: { name: "Vantongeren household", contactName: "Ines Vantongeren", email, street: "3 Ember Row", city: "Greensboro", region: "NC", postalCode: "27408", latitude: 36.09, longitude: -79.82, source: "Website", ratePlanId: RATE_PLAN_ID },
    }),
  );
  const kwh = [1150, 990, 870, 730, 800, 1110, 1320, 1280, 1020, 770, 830, 1070];
  const bills = kwh.map((k, m) => ({ periodStart: new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10), periodEnd: new Date(Date.UTC(2025, m + 1, 0)).toISOString().slice(0, 10), kwh: k }));
  await ok(await request.put(`/api/deals/${dealId}/bills`, { data: { bills } }));
  const faces = [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 20, solarAccessPct: 95, moduleCount: 18 }];
  await ok(await request.put("/api/designs", { data: { dealId, document: { moduleId: MODULE_ID, inverterId: INVERTER_ID, faces, weather: { kind: "nearest" }, stringPlan: { stringSizes: [9, 9], lowestTempC: -10, highestTempC: 35 } } } }));
  await ok(await request.post("/api/offers", { data: { dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } } }));
  return { dealId, email };
}

test("a rep is stopped from putting an incomplete design in a proposal, enters the service panel, then may send", async ({ page, request }) => {
  test.setTimeout(120_000);
  const { dealId, email } = await dealWithoutPanel(request);
  await signIn(page, "rep@tallgrass.example");

  // The design is saved (a draft); the Design tab says what is missing.
  await page.goto(`/deals/${dealId}/design`);
  await expect(page.getByTestId("electrical-status")).toHaveText("Incomplete");
  await expect(page.getByTestId("electrical-missing")).toContainText("the service panel's busbar rating");

  // The Proposal tab names the reason beside the offer and leaves it unticked and disabled.
  await page.goto(`/deals/${dealId}/proposal`);
  const offer = page.getByRole("checkbox", { name: /Whole roof, cash/ });
  await expect(offer).toBeDisabled();
  await expect(page.getByText(/The electrical design is incomplete: the service panel's busbar rating, the service panel's main breaker rating are missing/)).toBeVisible();
  // The route refuses it too, with the same words.
  const refused = await page.request.post("/api/proposals", { data: { dealId, toEmail: email } });
  expect(refused.status()).toBe(422);
  expect(JSON.stringify(await refused.json())).toContain("The electrical design is incomplete");

  // The rep enters the panel on the Household tab.
  await page.goto(`/deals/${dealId}`);
  const panel = page.getByRole("form", { name: "Service panel" });
  await panel.getByLabel("Busbar rating").selectOption("200");
  await panel.getByLabel("Main breaker").selectOption("200");
  await panel.getByLabel("Service voltage").selectOption("240");
  await panel.getByRole("button", { name: "Save service panel" }).click();
  await expect(panel.getByText("Saved.")).toBeVisible();

  await page.goto(`/deals/${dealId}/proposal`);
  await expect(page.getByRole("checkbox", { name: /Whole roof, cash/ })).toBeEnabled();
  await expect(page.getByText(/The electrical design is incomplete/)).toHaveCount(0);
  await page.goto(`/deals/${dealId}/design`);
  await expect(page.getByTestId("electrical-status")).toHaveText("Checks pass");
});
