import { expect, test } from "@playwright/test";
import sharp from "sharp";
import { alertOf, signIn, unique, withDb } from "./support";

// The installer's phone (390 × 844): they see only their crew's jobs, open the packet, tick the
// checklist, upload a photo from the "camera", and mark the job installed. Another crew's job is
// not found by URL (page) nor through the API. The job is made here for this test, so the demo's
// jobs stay as other journeys expect them.
test.use({ viewport: { width: 390, height: 844 }, hasTouch: true });
test.describe.configure({ mode: "serial" });

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const CREW_NORTH_ID = "7a11a55e-0000-4000-8000-000000000801";
/** Crew South's demo job (the Jablonski household). */
const OTHER_CREW_JOB_ID = "7a11a55e-0000-4000-8000-000000000825";

let jobId = "";
let dealId = "";
let household = "";

test.beforeAll(async () => {
  household = `${unique("Test").replace(/[^A-Za-z0-9]/g, "")} household`;
  jobId = crypto.randomUUID();
  dealId = crypto.randomUUID();
  const householdId = crypto.randomUUID();
  // Job days are calendar days in the company's time zone (the demo's: America/New_York).
  const today = new Intl.DateTimeFormat("en-CA", { timeZone: "America/New_York", year: "numeric", month: "2-digit", day: "2-digit" }).format(new Date());
  await withDb(async (conn) => {
    const [templates] = await conn.query("SELECT items FROM checklist_template WHERE company_id = ? AND active = 1 ORDER BY name LIMIT 1", [DEMO_COMPANY_ID]);
    const raw = (templates as { items: unknown }[])[0]?.items;
    const items = (typeof raw === "string" ? JSON.parse(raw) : raw) as { id: string; label: string }[];
    expect(items.length).toBeGreaterThan(2);
    const checklist = items.map((i) => ({ id: i.id, label: i.label, doneAt: null, doneByUserId: null }));
    await conn.query(
      "INSERT INTO household (id, company_id, name, contact_name, phone, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, 'Wren Tester', '336-555-0177', '5 Cobble Bend', 'Greensboro', 'NC', '27405', 36.0901, -79.7702)",
      [householdId, DEMO_COMPANY_ID, household],
    );
    // The demo rep's deal: they took the site photos on the visit.
    await conn.query(
      "INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) SELECT ?, ?, ?, id, 'install_booked', 'Referral' FROM user WHERE email = 'rep@tallgrass.example'",
      [dealId, DEMO_COMPANY_ID, householdId],
    );
    await conn.query(
      "INSERT INTO job (id, company_id, deal_id, crew_id, install_date, permit_number, permit_submitted_on, permit_approved_on, notes, checklist) VALUES (?, ?, ?, ?, ?, 'BP-TEST-1', ?, ?, 'Gate code 4417', ?)",
      [jobId, DEMO_COMPANY_ID, dealId, CREW_NORTH_ID, today, today, today, JSON.stringify(checklist)],
    );
  });
});

test("a rep adds a site photo from their phone on the deal's Household tab", async ({ page }) => {
  await signIn(page, "rep@tallgrass.example");
  await page.goto(`/deals/${dealId}`);
  await expect(page.getByRole("heading", { name: "Site photos" })).toBeVisible();
  const input = page.locator("#site-photo-input");
  await expect(input).toHaveAttribute("capture", "environment");
  await expect(input).toHaveAttribute("accept", "image/*");

  // A text file named like a photo is refused with the reason; nothing is shown or stored.
  await input.setInputFiles({ name: "panel.jpg", mimeType: "image/jpeg", buffer: Buffer.from("this is not a photo") });
  await expect(page.getByText("This file is not an image. Upload a photo as JPEG, PNG or WebP.")).toBeVisible();
  await expect(page.getByTestId("site-photos").locator("img")).toHaveCount(0);

  const jpeg = await sharp({ create: { width: 3000, height: 2000, channels: 3, background: { r: 96, g: 110, b: 124 } } }).jpeg({ quality: 85 }).toBuffer();
  await input.setInputFiles({ name: "IMG_0107.jpeg", mimeType: "image/jpeg", buffer: jpeg });
  await expect(page.getByText("Site photo saved as “IMG_0107.jpg”.", { exact: false })).toBeVisible();
  await expect(page.getByRole("img", { name: "Site photo IMG_0107.jpg" })).toBeVisible();
  const listed = await page.request.get(`/api/deals/${dealId}/site-photos`);
  expect(listed.status()).toBe(200);
  expect(((await listed.json()).data as { fileName: string }[]).map((p) => p.fileName)).toEqual(["IMG_0107.jpg"]);
  // Kept after a reload.
  await page.reload();
  await expect(page.getByRole("img", { name: "Site photo IMG_0107.jpg" })).toBeVisible();
});

test("an installer sees only their crew's jobs, works through the packet and marks the job installed", async ({ page }) => {
  await signIn(page, "crew@tallgrass.example");
  await page.goto("/jobs");
  await expect(page.getByRole("heading", { name: "Your jobs" })).toBeVisible();
  await expect(page.getByText("Crew North ·")).toBeVisible();
  const cards = page.getByTestId("crew-job");
  await expect(cards.filter({ hasText: household })).toHaveCount(1);
  // Crew South's jobs are not listed.
  await expect(cards.filter({ hasText: "Jablonski household" })).toHaveCount(0);
  await expect(cards.filter({ hasText: "Lindgren household" })).toHaveCount(0);
  // Big enough for a thumb.
  const box = await cards.filter({ hasText: household }).boundingBox();
  expect(box?.height ?? 0).toBeGreaterThanOrEqual(44);

  await cards.filter({ hasText: household }).click();
  await expect(page).toHaveURL(new RegExp(`/jobs/${jobId}$`));
  await expect(page.getByRole("heading", { name: household })).toBeVisible();
  const packet = page.getByTestId("job-packet");
  await expect(packet.getByText("Wren Tester")).toBeVisible();
  await expect(page.getByTestId("customer-phone")).toHaveAttribute("href", "tel:3365550177");
  await expect(page.getByTestId("map-link")).toHaveAttribute("href", /^geo:36\.0901,-79\.7702\?q=5%20Cobble%20Bend/);
  await expect(packet.getByText("Gate code 4417")).toBeVisible();
  await expect(page.getByTestId("cautions")).toContainText("licensed professional");
  // The rep's site photo from the visit.
  await expect(page.getByRole("img", { name: "IMG_0107.jpg", exact: true })).toBeVisible();

  // Tick the first checklist item; it stays ticked after a reload.
  const firstItem = page.getByRole("checkbox").first();
  const total = await page.getByRole("checkbox").count();
  const saved = page.waitForResponse((r) => r.url().endsWith(`/api/jobs/${jobId}/checklist`) && r.request().method() === "PATCH");
  await firstItem.check();
  await expect(page.getByTestId("checklist-count")).toHaveText(`1/${total}`);
  expect((await saved).status()).toBe(200);
  await page.reload();
  await expect(page.getByRole("checkbox").first()).toBeChecked();

  // A photo from the "camera": a real JPEG larger than the stored size.
  const jpeg = await sharp({ create: { width: 2400, height: 1800, channels: 3, background: { r: 181, g: 84, b: 45 } } }).jpeg({ quality: 85 }).toBuffer();
  const input = page.locator("#job-photo-input");
  await expect(input).toHaveAttribute("capture", "environment");
  await expect(input).toHaveAttribute("accept", "image/*");
  await input.setInputFiles({ name: "IMG_0042.jpg", mimeType: "image/jpeg", buffer: jpeg });
  await expect(page.getByText("Photo saved.")).toBeVisible();
  await expect(page.getByTestId("job-photos").locator("img")).toHaveCount(1);
  const photos = await page.request.get(`/api/jobs/${jobId}/photos`);
  expect(photos.status()).toBe(200);
  const [photo] = (await photos.json()).data as { id: string; widthPx: number; heightPx: number; mimeType: string }[];
  expect([photo.widthPx, photo.heightPx, photo.mimeType]).toEqual([2048, 1536, "image/jpeg"]);
  const image = await page.request.get(`/api/job-photos/${photo.id}/file`);
  expect(image.headers()["content-type"]).toBe("image/jpeg");

  // A text file named like a photo is refused and nothing is stored.
  await input.setInputFiles({ name: "roof.jpg", mimeType: "image/jpeg", buffer: Buffer.from("not a photo at all\n") });
  await expect(alertOf(page)).toContainText("JPEG, PNG or WebP");
  expect(((await (await page.request.get(`/api/jobs/${jobId}/photos`)).json()).data as unknown[]).length).toBe(1);

  // The packet as a PDF.
  const pdf = await page.request.get(`/api/jobs/${jobId}/packet.pdf`);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  expect((await pdf.body()).subarray(0, 5).toString()).toBe("%PDF-");

  // Mark installed (with the open checklist items named in the confirmation).
  await page.getByRole("button", { name: "Mark installed" }).click();
  await expect(page.getByText(/checklist items are still open/)).toBeVisible();
  await page.getByRole("button", { name: "Yes, installed" }).click();
  await expect(page.getByTestId("installed-status")).toBeVisible();
  // Shown on the demo company's clock (Settings → Company: America/New_York), whatever the server's zone.
  const zoneName = new Intl.DateTimeFormat("en-US", { timeZone: "America/New_York", timeZoneName: "short" }).formatToParts(new Date()).find((p) => p.type === "timeZoneName")?.value;
  await expect(page.getByTestId("installed-status")).toContainText(`${zoneName}.`);
  await expect(page.getByTestId("job-stage")).toHaveText("Installed");
  const stage = await withDb(async (conn) => {
    const [rows] = await conn.query("SELECT stage FROM deal WHERE id = ?", [dealId]);
    return (rows as { stage: string }[])[0].stage;
  });
  expect(stage).toBe("installed");
});

test("another crew's job is not found, by URL and through the API", async ({ page }) => {
  await signIn(page, "crew@tallgrass.example");
  const res = await page.goto(`/jobs/${OTHER_CREW_JOB_ID}`);
  await expect(page.getByRole("heading", { name: "Job not found" })).toBeVisible();
  await expect(page.getByText("Jablonski")).toHaveCount(0);
  expect(res?.status()).toBe(404);

  for (const [method, url] of [
    ["GET", `/api/jobs/${OTHER_CREW_JOB_ID}`],
    ["GET", `/api/jobs/${OTHER_CREW_JOB_ID}/packet`],
    ["GET", `/api/jobs/${OTHER_CREW_JOB_ID}/packet.pdf`],
    ["GET", `/api/jobs/${OTHER_CREW_JOB_ID}/photos`],
    ["PATCH", `/api/jobs/${OTHER_CREW_JOB_ID}/checklist`],
    ["POST", `/api/jobs/${OTHER_CREW_JOB_ID}/installed`],
  ] as const) {
    const r = await page.request.fetch(url, { method, data: method === "PATCH" ? { itemId: "plan-match", done: true } : undefined });
    expect([403, 404], `${method} ${url}`).toContain(r.status());
  }
  // The installer cannot schedule (office only).
  const patch = await page.request.patch(`/api/jobs/${jobId}`, { data: { installDate: "2031-01-01" } });
  expect(patch.status()).toBe(403);
});
