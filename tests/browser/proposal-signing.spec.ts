import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { expect, test, type APIRequestContext, type Page } from "@playwright/test";
import { PDFDocument } from "pdf-lib";
import { extractText, getDocumentProxy } from "unpdf";
import { APP_URL, apiSignIn, linkIn, signIn, unique, waitForMail, watchBrowserProblems, withDb } from "./support";

// The customer reads and signs on a phone.
test.use({ viewport: { width: 390, height: 844 } });

/** Demo catalog and rate plan (scripts/lib/seed/catalog.ts, pricing.ts): Prairieline PL-410T, Ridgewater RW-7600S, the co-op's residential plan. */
const MODULE_ID = "7a11a55e-0000-4000-8000-000000001001";
const INVERTER_ID = "7a11a55e-0000-4000-8000-000000001011";
const RATE_PLAN_ID = "7a11a55e-0000-4000-8000-000000002011";

const usd = (cents: number) => new Intl.NumberFormat("en-US", { style: "currency", currency: "USD", maximumFractionDigits: 0 }).format(Math.round(cents) / 100);

async function ok<T>(res: Awaited<ReturnType<APIRequestContext["post"]>>): Promise<T> {
  expect(res.ok(), `${res.url()} → ${res.status()} ${await res.text()}`).toBe(true);
  return ((await res.json()) as { data: T }).data;
}

/**
 * A fresh deal of the demo rep with its own household e-mail (so the outbox holds only this
 * test's messages for it): a year of bills, a design near the Greensboro station, two offers.
 */
async function prepareDeal(request: APIRequestContext): Promise<{ dealId: string; email: string; contactName: string; loanOfferId: string }> {
  await apiSignIn(request, "rep@tallgrass.example");
  const email = `${unique("signer")}@homeowner.example`;
  const contactName = "Marisol Fennimore";
  const { dealId } = await ok<{ dealId: string }>(
    await request.post("/api/deals", {
      data: {
        name: "Fennimore household",
        contactName,
        email,
        street: "12 Larkspur Bend",
        city: "Greensboro",
        region: "NC",
        postalCode: "27408",
        latitude: 36.09,
        longitude: -79.82,
        source: "Door to door",
        ratePlanId: RATE_PLAN_ID,
      },
    }),
  );
  const kwh = [1150, 990, 870, 730, 800, 1110, 1320, 1280, 1020, 770, 830, 1070];
  const bills = kwh.map((k, m) => ({
    periodStart: new Date(Date.UTC(2025, m, 1)).toISOString().slice(0, 10),
    periodEnd: new Date(Date.UTC(2025, m + 1, 0)).toISOString().slice(0, 10),
    kwh: k,
  }));
  await ok(await request.put(`/api/deals/${dealId}/bills`, { data: { bills } }));
  // The service panel's ratings: without them the electrical checks keep the design a draft.
  await ok(await request.put(`/api/deals/${dealId}/service-panel`, { data: { serviceBusbarA: 200, serviceMainBreakerA: 200, serviceVoltageV: 240 } }));
  await ok(
    await request.put("/api/designs", {
      data: {
        dealId,
        document: {
          moduleId: MODULE_ID,
          inverterId: INVERTER_ID,
          faces: [{ id: "south", name: "South", tiltDeg: 25, azimuthDeg: 180, usableSlots: 20, solarAccessPct: 95, moduleCount: 18 }],
          weather: { kind: "nearest" },
          stringPlan: { stringSizes: [9, 9], lowestTempC: -10, highestTempC: 35 },
        },
      },
    }),
  );
  await ok(await request.post("/api/offers", { data: { dealId, inputs: { name: "Whole roof, cash", payment: { kind: "cash" } } } }));
  const loan = await ok<{ id: string }>(
    await request.post("/api/offers", { data: { dealId, inputs: { name: "Whole roof, loan", payment: { kind: "loan", aprPct: 4.25, termMonths: 240, dealerFeePct: 0 } } } }),
  );
  return { dealId, email, contactName, loanOfferId: loan.id };
}

/** Draws a signature stroke with the mouse, which the browser delivers as pointer events. */
async function drawSignature(page: Page): Promise<void> {
  const pad = page.getByTestId("signature-pad");
  await pad.scrollIntoViewIfNeeded();
  const box = await pad.boundingBox();
  if (!box) throw new Error("the signature pad has no size");
  const y = box.y + box.height * 0.6;
  await page.mouse.move(box.x + 20, y);
  await page.mouse.down();
  for (let i = 1; i <= 24; i++) {
    const x = box.x + 20 + i * ((box.width - 40) / 24);
    await page.mouse.move(x, y - Math.sin(i / 2.5) * box.height * 0.3, { steps: 2 });
  }
  await page.mouse.up();
}

test("the customer opens the e-mailed link, confirms a code, draws a signature and signs; the rep sees Signed and the signed PDF holds", async ({ page, browser, request }) => {
  test.setTimeout(180_000);
  const deal = await prepareDeal(request);
  // Charts, the signature pad and every page on the way run under the app's CSP without a violation.
  const staffProblems = await watchBrowserProblems(page.context());

  // The rep sends the proposal from the deal's Proposal tab.
  await signIn(page, "rep@tallgrass.example");
  await page.goto(`/deals/${deal.dealId}/proposal`);
  await expect(page.getByRole("heading", { name: "Send a proposal" })).toBeVisible();
  await expect(page.getByLabel("Send to (e-mail)")).toHaveValue(deal.email);
  await expect(page.getByRole("checkbox", { name: /Whole roof, cash/ })).toBeChecked();
  await expect(page.getByRole("checkbox", { name: /Whole roof, loan/ })).toBeChecked();
  await page.getByRole("button", { name: "Send proposal" }).click();
  await expect(page.getByText(/Proposal P-\d+ v1 sent to/)).toBeVisible({ timeout: 30_000 });
  const version = page.getByRole("article", { name: /^Proposal P-\d+ v1$/ });
  await expect(version.getByTestId("proposal-status")).toHaveText("Sent");

  // The customer, on their own phone, opens the link from the e-mail.
  const sent = await waitForMail(deal.email, /solar proposal/);
  const link = linkIn(sent, "/p/");
  // Their browser (or anything between) writes a made-up address: the certificate must not believe it.
  const forgedHeaders = { "X-Forwarded-For": "198.51.100.66", "X-Kilowright-Client": "203.0.113.66" };
  const customer = await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, extraHTTPHeaders: forgedHeaders });
  const customerProblems = await watchBrowserProblems(customer);
  const phone = await customer.newPage();
  await phone.goto(link);
  await expect(phone.getByRole("heading", { name: "Solar proposal for the Fennimore household" })).toBeVisible();
  await expect(phone.getByRole("group", { name: "Choose one of 2 offers" })).toBeVisible();
  await expect(phone.getByRole("heading", { name: "How we estimated this" })).toBeVisible();
  await expect(phone.getByTestId("usage-production-chart")).toBeVisible();
  await expect(phone.getByTestId("cashflow-chart")).toBeVisible();

  // Reads the loan option and chooses it.
  await phone.getByRole("radio", { name: /Whole roof, loan/ }).check();
  await expect(phone.getByRole("heading", { name: "Whole roof, loan", level: 2 })).toBeVisible();
  const loanPrice = (await phone.getByTestId("price-2").textContent())?.trim() ?? "";
  expect(loanPrice).toMatch(/^\$[\d,]+$/);
  // Beside payback and ROI, what each is; the loan's ROI counts its payments.
  const meanings = phone.getByTestId("figure-definitions-2");
  await expect(meanings).toContainText("Payback is the year in which the running total of bill savings");
  await expect(meanings).toContainText(/What you pay: \$[\d,]+, the \$[\d,]+ down payment plus all the loan's payments/);
  await expect(phone.getByRole("region", { name: "How we estimated this" })).toContainText(/Whole roof, loan: Simple payback \(net cost ÷ first-year savings/);

  // Confirms the e-mail with the code from a second e-mail.
  await phone.getByRole("button", { name: "E-mail me a code" }).click();
  await expect(phone.getByText(/We e-mailed a 6-digit code/)).toBeVisible();
  const codeMail = await waitForMail(deal.email, /signing code/);
  const code = codeMail.subject.match(/(\d{6})/)?.[1] ?? "";
  expect(code).toMatch(/^\d{6}$/);
  await phone.getByLabel("6-digit code").fill(code);
  await phone.getByRole("button", { name: "Confirm code" }).click();
  await expect(phone.getByText("E-mail confirmed. You have 30 minutes to sign.")).toBeVisible();

  // Consents, types the name, draws, signs.
  await expect(phone.getByTestId("esign-disclosure")).toContainText("paper");
  await phone.getByRole("checkbox", { name: /agree to use electronic records and signatures/ }).check();
  await phone.getByLabel("Your full name").fill(deal.contactName);
  await drawSignature(phone);
  await expect(phone.getByText("Signature drawn.")).toBeVisible();
  await phone.getByRole("button", { name: "Sign", exact: true }).click();
  await expect(phone.getByTestId("state-signed")).toBeVisible({ timeout: 30_000 });
  await expect(phone.getByTestId("state-signed")).toContainText(deal.contactName);
  await expect(phone.getByTestId("right-to-cancel")).toBeVisible();
  await expect(phone.getByRole("button", { name: "Cancel this agreement" })).toBeVisible();

  // The rep sees it signed.
  await page.reload();
  await expect(page.getByRole("article", { name: /^Proposal P-\d+ v1$/ }).getByTestId("proposal-status")).toHaveText("Signed");
  await expect(page.getByTestId("deal-stage")).toHaveText("Signed");

  // The signed PDF: it parses, names the signer, the chosen offer's price and the certificate, and its hash is the record's.
  const [download] = await Promise.all([phone.waitForEvent("download"), phone.getByRole("link", { name: "Download the signed PDF" }).click()]);
  const bytes = new Uint8Array(await readFile((await download.path()) ?? ""));
  const doc = await PDFDocument.load(bytes);
  expect(doc.getPageCount()).toBeGreaterThan(2);
  const { text } = await extractText(await getDocumentProxy(new Uint8Array(bytes)), { mergePages: true });
  const flat = text.replace(/\s+/g, " ");
  const record = await withDb(async (conn) => {
    const [rows] = await conn.query("SELECT signed_sha256, pdf_sha256, signer_name, signer_ip, chosen_position, snapshot FROM proposal WHERE deal_id = ? AND status = 'signed'", [deal.dealId]);
    return (rows as { signed_sha256: string; pdf_sha256: string; signer_name: string; signer_ip: string; chosen_position: number; snapshot: unknown }[])[0];
  });
  // The address on the record and the certificate is the connection's (the app listens on loopback).
  expect(record.signer_ip).toBe("127.0.0.1");
  expect(flat).toContain("127.0.0.1");
  expect(flat).not.toContain("198.51.100.66");
  expect(flat).not.toContain("203.0.113.66");
  expect(record.chosen_position).toBe(2);
  expect(record.signer_name).toBe(deal.contactName);
  const snapshot = (typeof record.snapshot === "string" ? JSON.parse(record.snapshot) : record.snapshot) as { offers: { position: number; figures: { summary: { contractCents: number } } }[] };
  const chosenPrice = usd(snapshot.offers.find((o) => o.position === 2)?.figures.summary.contractCents ?? -1);
  expect(chosenPrice).toBe(loanPrice);
  expect(flat).toContain(deal.contactName);
  expect(flat).toContain(chosenPrice);
  expect(flat).toContain("Signing certificate");
  expect(flat).toContain(record.pdf_sha256);
  expect(createHash("sha256").update(bytes).digest("hex")).toBe(record.signed_sha256);

  // The copies went out: the customer's points back to their page.
  const copy = await waitForMail(deal.email, /Your signed agreement/);
  expect(linkIn(copy, "/p/")).toBe(link);
  customerProblems.expectNone();
  staffProblems.expectNone();
  await customer.close();
});

test("a replaced version says so and offers nothing to sign; the verify page matches a signed PDF and refuses a changed one", async ({ page, browser, request }) => {
  test.setTimeout(120_000);
  const deal = await prepareDeal(request);
  await signIn(page, "rep@tallgrass.example");
  await page.goto(`/deals/${deal.dealId}/proposal`);
  await page.getByRole("button", { name: "Send proposal" }).click();
  await expect(page.getByText(/Proposal P-\d+ v1 sent to/)).toBeVisible({ timeout: 30_000 });
  const first = linkIn(await waitForMail(deal.email, /solar proposal/), "/p/");
  await page.getByRole("checkbox", { name: /Whole roof, cash/ }).uncheck();
  await page.getByRole("button", { name: "Send proposal" }).click();
  await expect(page.getByText(/Proposal P-\d+ v2 sent to/)).toBeVisible({ timeout: 30_000 });
  await expect(page.getByRole("article", { name: /^Proposal P-\d+ v1$/ }).getByTestId("proposal-status")).toHaveText("Replaced");

  const customer = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const phone = await customer.newPage();
  await phone.goto(first);
  await expect(phone.getByTestId("state-replaced")).toContainText(/use the link in the newest e-mail/i);
  await expect(phone.getByRole("button", { name: "E-mail me a code" })).toHaveCount(0);
  await expect(phone.getByRole("link", { name: /Download/ })).toHaveCount(0);
  const refused = await customer.request.post(`${first.replace("/p/", "/api/public/proposals/")}/code`, { headers: { Origin: APP_URL } });
  expect(refused.status()).toBe(409);

  // Revoked: the rep withdraws v2, and its link shows that.
  const second = linkIn(await waitForMail(deal.email, /solar proposal/), "/p/");
  expect(second).not.toBe(first);
  await page.getByRole("article", { name: /^Proposal P-\d+ v2$/ }).getByRole("button", { name: "Revoke link" }).click();
  await page.getByRole("dialog", { name: /^Revoke the link of P-\d+ v2\?$/ }).getByRole("button", { name: "Revoke the link" }).click();
  await expect(page.getByRole("article", { name: /^Proposal P-\d+ v2$/ }).getByTestId("proposal-status")).toHaveText("Revoked");
  await phone.goto(second);
  await expect(phone.getByTestId("state-revoked")).toBeVisible();
  await expect(phone.getByRole("button", { name: "E-mail me a code" })).toHaveCount(0);

  // Verify: a signed demo PDF matches; the same file with one byte changed does not.
  const signed = await withDb(async (conn) => {
    // One of the demo rep's own deals, so the rep may download it.
    const [rows] = await conn.query(
      "SELECT p.id, p.number, p.version FROM proposal p JOIN deal d ON d.id = p.deal_id WHERE p.company_id = '7a11a55e-0000-4000-8000-000000000001' AND p.status = 'signed' AND d.owner_user_id = '7a11a55e-0000-4000-8000-000000000104' ORDER BY p.number LIMIT 1",
    );
    return (rows as { id: string; number: number; version: number }[])[0];
  });
  expect(signed, "the demo seed has a signed proposal").toBeTruthy();
  const pdf = await request.get(`/api/proposals/${signed.id}/signed-pdf`);
  expect(pdf.status()).toBe(200);
  const bytes = Buffer.from(await pdf.body());
  await phone.goto("/verify");
  await phone.getByLabel("Signed PDF").setInputFiles({ name: "signed.pdf", mimeType: "application/pdf", buffer: bytes });
  await phone.getByRole("button", { name: "Check the file" }).click();
  await expect(phone.getByTestId("verify-answer")).toContainText(`matches proposal P-${signed.number} v${signed.version}, signed on`);
  const changed = Buffer.from(bytes);
  changed[Math.floor(changed.length / 2)] ^= 0x01;
  await phone.getByLabel("Signed PDF").setInputFiles({ name: "changed.pdf", mimeType: "application/pdf", buffer: changed });
  await phone.getByRole("button", { name: "Check the file" }).click();
  await expect(phone.getByTestId("verify-answer")).toHaveText("No signed Kilowright record matches this file.");
  await customer.close();
});

/** Sends the deal's offers as a proposal through the API (the rep's request context) and returns the customer's link. */
async function sendByApi(request: APIRequestContext, deal: { dealId: string; email: string }): Promise<string> {
  await ok(await request.post("/api/proposals", { data: { dealId: deal.dealId, toEmail: deal.email } }));
  return linkIn(await waitForMail(deal.email, /solar proposal/), "/p/");
}

/** Asks for a code, reads it from the outbox and types it in (pointer or keyboard, as `press` does). */
async function codeFromMail(email: string): Promise<string> {
  const codeMail = await waitForMail(email, /signing code/);
  const code = codeMail.subject.match(/(\d{6})/)?.[1] ?? "";
  expect(code).toMatch(/^\d{6}$/);
  return code;
}

/** How many pixels of the signature canvas hold ink (not transparent, not white). */
async function inkPixels(page: Page): Promise<number> {
  return page.getByTestId("signature-pad").evaluate((node) => {
    const canvas = node as HTMLCanvasElement;
    const data = canvas.getContext("2d")?.getImageData(0, 0, canvas.width, canvas.height).data ?? new Uint8ClampedArray();
    let ink = 0;
    for (let i = 0; i < data.length; i += 4) if (data[i + 3] > 0 && data[i] < 200) ink++;
    return ink;
  });
}

/** Presses Tab until the element has the focus (keyboard only: never a click). */
async function tabTo(page: Page, target: ReturnType<Page["getByRole"]>, max = 120): Promise<void> {
  for (let i = 0; i < max; i++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press("Tab");
  }
  throw new Error(`Tab never reached ${target.toString()}`);
}

test("on a phone: the drawn signature survives resizes and rotation, a reload keeps the confirmed code, and signing ends on a confirmation with the copy and the deposit next", async ({ browser, request }) => {
  test.setTimeout(180_000);
  const deal = await prepareDeal(request);
  const link = await sendByApi(request, deal);
  const customer = await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true });
  const problems = await watchBrowserProblems(customer);
  const phone = await customer.newPage();
  await phone.goto(link);
  await phone.getByRole("button", { name: "E-mail me a code" }).click();
  await phone.getByLabel("6-digit code").fill(await codeFromMail(deal.email));
  await phone.getByRole("button", { name: "Confirm code" }).click();
  await expect(phone.getByLabel("Your full name")).toBeVisible();

  // A reload within the 30 minutes keeps the confirmation: straight back to the signing form.
  await phone.reload();
  await expect(phone.getByLabel("Your full name")).toBeVisible();
  await expect(phone.getByText(/E-mail confirmed/)).toBeVisible();
  await expect(phone.getByRole("button", { name: "E-mail me a code" })).toHaveCount(0);

  await phone.getByRole("checkbox", { name: /agree to use electronic records and signatures/ }).check();
  await phone.getByLabel("Your full name").fill(deal.contactName);
  await drawSignature(phone);
  await expect(phone.getByText("Signature drawn.")).toBeVisible();
  const drawn = await inkPixels(phone);
  expect(drawn).toBeGreaterThan(50);

  // Rotation to landscape and back, and the browser bars hiding (a taller window): the strokes stay.
  for (const size of [
    { width: 844, height: 390 },
    { width: 390, height: 844 },
    { width: 390, height: 900 },
  ]) {
    await phone.setViewportSize(size);
    await phone.waitForTimeout(300);
    expect(await inkPixels(phone), `ink after resizing to ${size.width}×${size.height}`).toBeGreaterThan(50);
    await expect(phone.getByText("Signature drawn.")).toBeVisible();
  }

  await phone.getByRole("button", { name: "Sign", exact: true }).click();
  // The confirmation: its heading takes the focus, with the signed copy and the deposit as the next step.
  const done = phone.getByTestId("state-signed");
  await expect(done.getByRole("heading", { name: /Signed — here is your copy/ })).toBeFocused({ timeout: 30_000 });
  await expect(done.getByRole("link", { name: "Download the signed PDF" })).toBeVisible();
  await expect(done).toContainText("Next: the deposit");
  await expect(done.getByRole("link", { name: /Pay the deposit/ })).toHaveAttribute("href", "#deposit-panel");
  problems.expectNone();
  await customer.close();
});

/** Words from inside the office that must never reach the homeowner's page. */
const NOT_FOR_HOMEOWNERS = [/TMY3/, /\b7\d{5}\b/, /Dobos/, /Fels 1986/, /PRISM/, /NPV · IRR/, /table's years/, /Licence/, /programme/, /\$-/, /-\$/];

test("keyboard only: code, consent, typed name adopted as the signature, Sign; the page speaks plainly and the signed copy says the typed name was adopted", async ({ browser, request }) => {
  test.setTimeout(180_000);
  const deal = await prepareDeal(request);
  const link = await sendByApi(request, deal);
  const customer = await browser.newContext({ viewport: { width: 390, height: 844 } });
  const phone = await customer.newPage();
  await phone.goto(link);
  await expect(phone.getByRole("heading", { name: "Solar proposal for the Fennimore household" })).toBeVisible();

  // Plain words: no station ids or method citations, one spelling, the same APR everywhere.
  await phone.getByRole("radio", { name: /Whole roof, loan/ }).check();
  const body = await phone.locator("body").innerText();
  for (const word of NOT_FOR_HOMEOWNERS) expect(body, `the page shows ${word}`).not.toMatch(word);
  const aprs = [...body.matchAll(/([\d.]+) % APR/g)].map((m) => m[1]);
  expect(aprs.length).toBeGreaterThan(1);
  expect(new Set(aprs)).toEqual(new Set(["4.25"]));
  await expect(phone.getByRole("region", { name: "How we estimated this" })).toContainText(/typical year/);
  // Each figure says in one line what it means.
  const loanDetails = phone.getByTestId("offer-details-2");
  await expect(loanDetails).toContainText("What the panels should make in their first year");
  await expect(loanDetails).toContainText("The price less the incentives and tax credits expected");
  await expect(loanDetails).toContainText(/less everything you pay; below zero means you pay more than you save/);

  // Keyboard only from here: Tab to each control, Enter or Space to use it.
  await tabTo(phone, phone.getByRole("button", { name: "E-mail me a code" }));
  await phone.keyboard.press("Enter");
  const code = await codeFromMail(deal.email);
  await tabTo(phone, phone.getByRole("textbox", { name: "6-digit code" }));
  await phone.keyboard.type(code);
  await phone.keyboard.press("Enter");
  await expect(phone.getByText("E-mail confirmed. You have 30 minutes to sign.")).toBeVisible();
  await tabTo(phone, phone.getByRole("checkbox", { name: /agree to use electronic records and signatures/ }));
  await phone.keyboard.press("Space");
  await tabTo(phone, phone.getByRole("textbox", { name: "Your full name" }));
  await phone.keyboard.type(deal.contactName);
  await tabTo(phone, phone.getByRole("checkbox", { name: "Use my typed name as my signature" }));
  await phone.keyboard.press("Space");
  await expect(phone.getByText("Your typed name is your signature.")).toBeVisible();
  expect(await inkPixels(phone)).toBeGreaterThan(50);
  await tabTo(phone, phone.getByRole("button", { name: "Sign", exact: true }));
  await phone.keyboard.press("Enter");
  await expect(phone.getByRole("heading", { name: /Signed — here is your copy/ })).toBeFocused({ timeout: 30_000 });

  // The signed copy's certificate says how the signature was given.
  const signedPdf = await customer.request.get(`${link.replace("/p/", "/api/public/proposals/")}/signed-pdf`);
  expect(signedPdf.status()).toBe(200);
  const { text } = await extractText(await getDocumentProxy(new Uint8Array(await signedPdf.body())), { mergePages: true });
  expect(text.replace(/\s+/g, " ")).toContain("typed name adopted as the signature");
  await customer.close();
});
