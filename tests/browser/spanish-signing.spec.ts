// A household that reads Spanish signs in Spanish (issue #18 item 6), on a phone: the rep marks
// the household Español, the link e-mail and the page are in Spanish, the homeowner switches to
// English and back without losing what they typed, confirms the code, consents (the disclosure
// says it is a translation and keeps the English text), types the name, draws, signs; the signed
// copy e-mail is Spanish, and so are the deposit panel and, after paying, its receipt.
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { apiSignIn, linkIn, unique, waitForMail, watchBrowserProblems } from "./support";

test.use({ viewport: { width: 390, height: 844 } });

/** Demo catalog and rate plan (scripts/lib/seed/catalog.ts, pricing.ts). */
const MODULE_ID = "7a11a55e-0000-4000-8000-000000001001";
const INVERTER_ID = "7a11a55e-0000-4000-8000-000000001011";
const RATE_PLAN_ID = "7a11a55e-0000-4000-8000-000000002011";
const EXPIRY = `12 / ${String((new Date().getUTCFullYear() + 5) % 100).padStart(2, "0")}`;

async function ok<T>(res: Awaited<ReturnType<APIRequestContext["post"]>>): Promise<T> {
  expect(res.ok(), `${res.url()} → ${res.status()} ${await res.text()}`).toBe(true);
  return ((await res.json()) as { data: T }).data;
}

/** A deal of the demo rep for a household that reads Spanish, with bills, a design and one cash offer, and its proposal sent. */
async function spanishProposal(request: APIRequestContext): Promise<{ dealId: string; email: string }> {
  await apiSignIn(request, "rep@tallgrass.example");
  const email = `${unique("firma")}@homeowner.example`;
  const lead = { name: "Quintero household", contactName: "Lucía Quintero", email, street: "7 Magnolia Court", city: "Greensboro", region: "NC", postalCode: "27408" };
  const { dealId } = await ok<{ dealId: string }>(
    await request.post("/api/deals", { data: { ...lead, latitude: 36.09, longitude: -79.82, source: "Referral", ratePlanId: RATE_PLAN_ID, language: "es" } }),
  );
  const kwh = [1150, 990, 870, 730, 800, 1110, 1320, 1280, 1020, 770, 830, 1070];
  const bills = kwh.map((k, m) => ({ periodStart: new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10), periodEnd: new Date(Date.UTC(2025, m + 1, 0)).toISOString().slice(0, 10), kwh: k }));
  await ok(await request.put(`/api/deals/${dealId}/bills`, { data: { bills } }));
  // The service panel's ratings: without them the electrical checks keep the design a draft.
  await ok(await request.put(`/api/deals/${dealId}/service-panel`, { data: { serviceBusbarA: 200, serviceMainBreakerA: 200, serviceVoltageV: 240 } }));
  const faces = [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 20, solarAccessPct: 95, moduleCount: 18 }];
  const stringPlan = { stringSizes: [9, 9], lowestTempC: -10, highestTempC: 35 };
  await ok(await request.put("/api/designs", { data: { dealId, document: { moduleId: MODULE_ID, inverterId: INVERTER_ID, faces, weather: { kind: "nearest" }, stringPlan } } }));
  await ok(await request.post("/api/offers", { data: { dealId, inputs: { name: "Techo completo, contado", payment: { kind: "cash" } } } }));
  await ok(await request.post("/api/proposals", { data: { dealId, toEmail: email, inHomeSale: true } }));
  return { dealId, email };
}

async function drawSignature(page: Page): Promise<void> {
  const pad = page.getByTestId("signature-pad");
  await pad.scrollIntoViewIfNeeded();
  const box = await pad.boundingBox();
  if (!box) throw new Error("the signature pad has no size");
  const y = box.y + box.height * 0.6;
  await page.mouse.move(box.x + 20, y);
  await page.mouse.down();
  for (let i = 1; i <= 24; i++) await page.mouse.move(box.x + 20 + i * ((box.width - 40) / 24), y - Math.sin(i / 2.5) * box.height * 0.3, { steps: 2 });
  await page.mouse.up();
}

test("a Spanish-speaking homeowner reads, signs and pays in Spanish", async ({ browser, request }) => {
  test.setTimeout(240_000);
  const deal = await spanishProposal(request);
  const sent = await waitForMail(deal.email, /^Su propuesta solar de /);
  const link = linkIn(sent, "/p/");

  const customer = await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true });
  const problems = await watchBrowserProblems(customer);
  const phone = await customer.newPage();
  await phone.goto(link);
  await expect(phone.getByRole("heading", { level: 1, name: "Propuesta solar para Quintero household" })).toBeVisible();
  await expect(phone.locator("[lang='es']").first()).toBeVisible();
  await expect(phone.getByRole("heading", { name: "Cómo lo calculamos" })).toBeVisible();
  // The snapshot's assumptions, cautions and price words in Spanish; only the company's own names stay as typed.
  const estimated = phone.locator("section", { has: phone.getByRole("heading", { name: "Cómo lo calculamos" }) });
  await expect(estimated).toContainText("Pérdidas del sistema:");
  await expect(estimated).toContainText("Estimaciones, no una garantía");
  for (const english of ["System losses", "Estimates, not a guarantee", "Deposits follow", "Utility prices rise", "as your installer entered them"]) await expect(estimated).not.toContainText(english);
  await expect(phone.getByTestId("offer-details-1")).toContainText("Precio del sistema");
  await expect(phone.getByTestId("offer-details-1")).not.toContainText("System price");
  await expect(phone.getByTestId("weather-station")).toHaveText(/^Clima de la estación de .+, a \d+ km de distancia\.$/);

  // The code, in Spanish.
  await phone.getByRole("button", { name: "Enviarme un código por correo" }).click();
  const codeMail = await waitForMail(deal.email, /^Su código para firmar: \d{6}$/);
  const code = codeMail.subject.match(/(\d{6})/)?.[1] ?? "";
  await phone.getByLabel("Código de 6 dígitos").fill(code);
  await phone.getByRole("button", { name: "Confirmar el código" }).click();
  await expect(phone.getByText("Correo electrónico confirmado. Tiene 30 minutos para firmar.")).toBeVisible();

  // The disclosure is a translation and keeps the English text.
  const disclosure = phone.getByTestId("esign-disclosure");
  await expect(disclosure).toContainText("Antes de firmar electrónicamente");
  await expect(disclosure).toContainText("Traducción; el texto en inglés prevalece.");
  await disclosure.getByText("Texto en inglés (prevalece)").click();
  await expect(disclosure).toContainText("What you agree to. This proposal, the agreement you sign");

  // The name typed, then English and back: the page follows, what was typed stays.
  await phone.getByLabel("Su nombre completo").fill("Lucía Quintero");
  const languages = phone.getByRole("group", { name: "Idioma" });
  await languages.getByRole("button", { name: "English" }).click();
  await expect(phone.getByRole("heading", { level: 1, name: "Solar proposal for the Quintero household" })).toBeVisible();
  await expect(phone.getByLabel("Your full name")).toHaveValue("Lucía Quintero");
  await phone.getByRole("group", { name: "Language" }).getByRole("button", { name: "Español" }).click();
  await expect(phone.getByRole("heading", { level: 1, name: "Propuesta solar para Quintero household" })).toBeVisible();
  await expect(phone.getByLabel("Su nombre completo")).toHaveValue("Lucía Quintero");

  await phone.getByRole("checkbox", { name: /acepto usar documentos y firmas electrónicos/ }).check();
  await drawSignature(phone);
  await expect(phone.getByText("Firma dibujada.")).toBeVisible();
  await phone.getByRole("button", { name: "Firmar", exact: true }).click();
  const signed = phone.getByTestId("state-signed");
  await expect(signed).toContainText("Firmado: aquí tiene su copia", { timeout: 30_000 });
  await expect(signed).toContainText("Lucía Quintero firmó el");
  await expect(phone.getByTestId("right-to-cancel")).toContainText("Su derecho a cancelar");
  await expect(phone.getByRole("button", { name: "Cancelar este contrato" })).toBeVisible();

  const copy = await waitForMail(deal.email, /^Su contrato firmado con /);
  expect(copy.html).toContain("Gracias, Lucía Quintero.");
  expect(linkIn(copy, "/p/")).toBe(link);

  // The deposit, in Spanish, paid on the provider's page, then received on ours.
  const panel = phone.getByTestId("deposit-panel");
  await expect(panel.getByRole("heading", { name: "Depósito" })).toBeVisible();
  const pay = panel.getByRole("button", { name: /^Pagar el depósito: \$[\d,]+\.\d{2}$/ });
  const amount = ((await pay.textContent()) ?? "").replace("Pagar el depósito: ", "").trim();
  await pay.click();
  await expect(phone).toHaveURL(/\/pay\/cs_/, { timeout: 45_000 });
  await phone.getByLabel("Card number").fill("4242 4242 4242 4242");
  await phone.getByLabel("Expiry (MM / YY)").fill(EXPIRY);
  await phone.getByLabel("Security code (CVC)").fill("123");
  await phone.getByLabel("ZIP / postal code").fill("27408");
  await phone.getByRole("button", { name: `Pay ${amount}` }).click();
  await expect(phone.getByTestId("deposit-status")).toHaveAttribute("data-status", "paid", { timeout: 45_000 });
  await expect(phone.getByTestId("deposit-status")).toContainText("Depósito recibido");
  await expect(phone.getByTestId("project-next")).toContainText("Visita técnica", { timeout: 45_000 });
  const receipt = await waitForMail(deal.email, /^Depósito recibido: /);
  expect(receipt.subject).toContain(amount);

  // The signed copy checked on /verify: an English visitor's page turns Spanish with the Spanish document's answer; the switch goes back.
  const token = new URL(link).pathname.split("/").pop() ?? "";
  const signedPdf = await phone.request.get(`/api/public/proposals/${token}/signed-pdf`);
  expect(signedPdf.ok()).toBe(true);
  await phone.goto("/verify");
  await expect(phone.getByRole("heading", { level: 1, name: "Check a signed PDF" })).toBeVisible();
  await phone.getByLabel("Signed PDF").setInputFiles({ name: "contrato.pdf", mimeType: "application/pdf", buffer: await signedPdf.body() });
  await phone.getByRole("button", { name: "Check the file" }).click();
  await expect(phone.getByTestId("verify-answer")).toContainText("Este archivo coincide con la propuesta P-", { timeout: 30_000 });
  await expect(phone.getByRole("heading", { level: 1, name: "Verificar un PDF firmado" })).toBeVisible();
  await phone.getByRole("group", { name: "Idioma" }).getByRole("link", { name: "English" }).click();
  await expect(phone.getByRole("heading", { level: 1, name: "Check a signed PDF" })).toBeVisible();
  await expect(phone.getByRole("button", { name: "Check the file" })).toBeVisible();

  problems.expectNone();
  await customer.close();
});
