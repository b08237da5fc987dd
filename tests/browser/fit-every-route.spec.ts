// Issue #18, item 1: no screen of any role scrolls sideways on a phone, a tablet either way up or
// a laptop, except inside a region made to scroll (data-scroll-region) that shows it scrolls.
// One browser context per role walks every route it has (deal rooms with every tab, a job, forms
// opened) and checks each at every size by resizing the same page (a reload per size would
// double the run time). A household with a long unbroken name is on the way, so names that do
// not wrap show up too.
import { createHash, randomBytes } from "node:crypto";
import { expect, test, type Browser, type Page } from "@playwright/test";
import { sidewaysScroll, signIn, withDb } from "./support";

const SIZES = [
  { width: 820, height: 1180 },
  { width: 1180, height: 820 },
  { width: 390, height: 844 },
  { width: 360, height: 740 },
  { width: 1280, height: 800 },
];

const DEMO_COMPANY_ID = "7a11a55e-0000-4000-8000-000000000001";
const REP_ID = "7a11a55e-0000-4000-8000-000000000104";
const deal = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;
/** Demo deals (scripts/lib/seed-demo.ts): Dunmore has offers and a sent proposal (rep2's),
 *  Esposito is signed (rep's), Fairweather has its deposit paid (rep2's). */
const DUNMORE = deal(304);
const ESPOSITO = deal(305);
const FAIRWEATHER = deal(306);
const TABS = ["", "/energy", "/design", "/offers", "/proposal", "/money", "/timeline"];

/** A place to check: a path, and optionally what to open there (a form, a dialog) first. */
type Stop = { path: string; open?: (page: Page) => Promise<void>; missing?: true };

const click = (name: string | RegExp) => async (page: Page) => {
  const button = page.getByRole("button", { name }).first();
  if (await button.isVisible()) await button.click();
};
const dealRoom = (id: string, opens: Record<string, Stop["open"]> = {}): Stop[] => TABS.map((t) => ({ path: `/deals/${id}${t}`, open: opens[t] }));
/** The first link of a list page, as a stop (rate plans, jobs: their ids are not fixed). */
const firstLink = (list: string, testId: string | null, pattern: RegExp) => ({ list, testId, pattern });

const OFFICE_ROUTES: Stop[] = [
  { path: "/today" },
  { path: "/deals" },
  { path: "/deals/new" },
  { path: "/board" },
  { path: "/jobs" },
  { path: "/jobs/crews" },
  { path: "/catalog", open: click("Add module") },
  { path: "/price-book" },
  { path: "/utilities" },
  { path: "/rate-plans" },
  { path: "/rate-plans/new" },
  { path: "/weather" },
];

const ROLES: { email: string; routes: Stop[]; links: ReturnType<typeof firstLink>[] }[] = [
  {
    email: "owner@tallgrass.example",
    routes: [
      ...OFFICE_ROUTES,
      { path: "/settings/people" },
      { path: "/settings/company" },
      { path: "/settings/checklists", open: click("New checklist") },
      { path: "/money/reconciliation" },
      { path: "/dev/outbox" },
      ...dealRoom(DUNMORE, { "/offers": click("Add an offer") }),
    ],
    links: [firstLink("/jobs", "jobs-table", /\/jobs\/[0-9a-f-]{36}$/), firstLink("/rate-plans", null, /\/rate-plans\/[0-9a-f-]{36}$/)],
  },
  {
    email: "rep@tallgrass.example",
    routes: [
      { path: "/today" },
      { path: "/deals" },
      { path: "/deals/new" },
      { path: "/board" },
      { path: "/catalog" },
      { path: "/price-book" },
      { path: "/utilities" },
      { path: "/rate-plans" },
      { path: "/weather" },
      // The longest monthly kWh expected (five digits and a decimal) must show whole in the bills table.
      ...dealRoom(ESPOSITO, { "/energy": async (page) => page.getByLabel("Bill 1 kWh").fill("12345.6") }),
    ],
    links: [],
  },
  {
    email: "office@tallgrass.example",
    routes: [...OFFICE_ROUTES, ...dealRoom(FAIRWEATHER, { "/money": click("Refund…") })],
    links: [firstLink("/jobs", "jobs-table", /\/jobs\/[0-9a-f-]{36}$/)],
  },
  {
    email: "crew@tallgrass.example",
    routes: [{ path: "/today" }, { path: "/jobs" }],
    links: [firstLink("/jobs", null, /\/jobs\/[0-9a-f-]{36}$/)],
  },
];

/** Number fields whose text does not fit them (a kWh field 29 px wide showed "1388" as "1"). */
const clippedFigures = (page: Page) =>
  page.evaluate(() =>
    [...document.querySelectorAll<HTMLInputElement>('input[inputmode="decimal"], input[inputmode="numeric"]')]
      // One figure each (a list of twelve monthly values is a text to scroll through, not a figure).
      .filter((i) => i.checkVisibility() && /^-?[\d.,]+$/.test(i.value) && i.scrollWidth > i.clientWidth + 1)
      .map((i) => `the field "${i.getAttribute("aria-label") ?? i.labels?.[0]?.textContent ?? i.id}" shows "${i.value}" in ${i.clientWidth}px`),
  );

let turn = 0;

/**
 * Checks the page at every size. The order turns by one each stop, so pages also open (render on
 * the server, hydrate) at each size: the last size of one stop is where the next one opens.
 */
async function checkAtEverySize(page: Page, where: string, problems: string[]): Promise<void> {
  turn += 1;
  for (const size of [...SIZES.slice(turn % SIZES.length), ...SIZES.slice(0, turn % SIZES.length)]) {
    await page.setViewportSize(size);
    for (const p of [...(await sidewaysScroll(page)), ...(await clippedFigures(page))]) problems.push(`${size.width}×${size.height} ${where}: ${p}`);
  }
}

async function visit(page: Page, stop: Stop, problems: string[]): Promise<void> {
  const res = await page.goto(stop.path);
  expect(res?.status(), stop.path).toBe(stop.missing ? 404 : 200);
  await expect(page.locator("h1").first()).toBeVisible();
  if (stop.open) await stop.open(page);
  await checkAtEverySize(page, stop.path, problems);
}

/** The household with a name that does not wrap by itself (200 characters, the column's size). */
const LONG_NAME = `Vanderkellenbrookshire${"x".repeat(150)} household of the long name`.slice(0, 200);

async function withLongNamedDeal(): Promise<{ dealId: string; remove: () => Promise<void> }> {
  const householdId = crypto.randomUUID();
  const dealId = crypto.randomUUID();
  await withDb(async (conn) => {
    await conn.query(
      "INSERT INTO household (id, company_id, name, contact_name, email, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, ?, 'long@fit-spec.example', '1 Long Lane', 'Greensboro', 'NC', '27405', 36.1012, -79.7711)",
      [householdId, DEMO_COMPANY_ID, LONG_NAME, LONG_NAME],
    );
    await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) VALUES (?, ?, ?, ?, 'lead', 'Referral')", [dealId, DEMO_COMPANY_ID, householdId, REP_ID]);
  });
  return {
    dealId,
    remove: () =>
      withDb(async (conn) => {
        await conn.query("DELETE FROM deal WHERE id = ?", [dealId]);
        await conn.query("DELETE FROM household WHERE id = ?", [householdId]);
      }),
  };
}

/** Link tokens for the demo's sent and signed proposals (only hashes are stored, as in the app). */
async function proposalLinks(): Promise<string[]> {
  const links: string[] = [];
  await withDb(async (conn) => {
    for (const status of ["sent", "signed"]) {
      const token = randomBytes(32).toString("base64url");
      const [rows] = await conn.query("SELECT id FROM proposal WHERE company_id = ? AND status = ? ORDER BY created_at DESC LIMIT 1", [DEMO_COMPANY_ID, status]);
      const id = (rows as { id: string }[])[0]?.id;
      if (!id) throw new Error(`the demo seed has no ${status} proposal`);
      await conn.query("UPDATE proposal SET token_hash = ? WHERE id = ?", [createHash("sha256").update(token).digest("hex"), id]);
      links.push(`/p/${token}`);
    }
  });
  return links;
}

async function walkRole(browser: Browser, role: (typeof ROLES)[number], longDealId: string): Promise<string[]> {
  const context = await browser.newContext({ viewport: SIZES[0] });
  const page = await context.newPage();
  const problems: string[] = [];
  try {
    await signIn(page, role.email);
    const extra: Stop[] = role.email === "crew@tallgrass.example" ? [] : [{ path: `/deals/${longDealId}` }, { path: `/deals/${longDealId}/timeline` }];
    for (const stop of [...role.routes, ...extra]) await visit(page, stop, problems);
    for (const link of role.links) {
      await page.goto(link.list);
      const scope = link.testId ? page.getByTestId(link.testId) : page.locator("main");
      const find = () => scope.locator("a[href]").evaluateAll((as, source) => as.map((a) => a.getAttribute("href") ?? "").find((h) => new RegExp(source).test(h)) ?? null, link.pattern.source);
      await expect.poll(find, { message: `a link matching ${link.pattern} on ${link.list}` }).not.toBeNull();
      await visit(page, { path: (await find())! }, problems);
    }
  } finally {
    await context.close();
  }
  return problems;
}

test.describe("no screen scrolls sideways", () => {
  let long: Awaited<ReturnType<typeof withLongNamedDeal>>;
  test.beforeAll(async () => {
    long = await withLongNamedDeal();
  });
  test.afterAll(async () => {
    await long.remove();
  });

  for (const role of ROLES) {
    test(`${role.email.split("@")[0]}: every route at every size`, async ({ browser }) => {
      test.setTimeout(240_000);
      const problems = await walkRole(browser, role, long.dealId);
      expect(problems, problems.join("\n")).toEqual([]);
    });
  }

  test("the homeowner's pages, /verify and the sign-in pages at every size", async ({ browser }) => {
    test.setTimeout(120_000);
    const context = await browser.newContext({ viewport: SIZES[2] });
    const page = await context.newPage();
    const problems: string[] = [];
    const stops: Stop[] = [
      ...(await proposalLinks()).map((path) => ({ path })),
      { path: "/verify" },
      { path: "/verify?lang=es" },
      { path: "/sign-in" },
      { path: "/sign-up" },
      { path: "/forgot-password" },
      { path: "/check-email" },
      { path: "/reset-password?token=not-a-real-token" },
      { path: "/invite/not-a-real-token" },
      { path: "/no-such-page", missing: true },
    ];
    for (const stop of stops) await visit(page, stop, problems);
    await context.close();
    expect(problems, problems.join("\n")).toEqual([]);
  });
});

test("on a tablet the sections open in a drawer that Escape closes, and turning the tablet never leaves it stuck", async ({ browser }) => {
  const context = await browser.newContext({ viewport: SIZES[0] });
  const page = await context.newPage();
  await signIn(page, "rep@tallgrass.example");
  await page.goto(`/deals/${ESPOSITO}/energy`);
  const menu = page.getByRole("button", { name: "Menu" });
  const drawer = page.getByRole("dialog", { name: "Menu" });
  // Upright (820 px) the page has the whole width: no side column, a Menu button.
  await expect(page.getByRole("navigation", { name: "Sections" })).toBeHidden();
  await expect(page.locator("main")).toHaveJSProperty("offsetLeft", 0);
  await expect(menu).toHaveAttribute("aria-expanded", "false");

  // Opened by keyboard, focus goes in and stays in; Escape closes it and focus is back on Menu.
  await menu.focus();
  await page.keyboard.press("Enter");
  await expect(drawer).toBeVisible();
  await expect(menu).toHaveAttribute("aria-expanded", "true");
  await expect(drawer.getByRole("navigation", { name: "Sections" }).getByRole("link", { name: "Deals" })).toBeVisible();
  for (let i = 0; i < 12; i++) {
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => document.activeElement?.closest("dialog") !== null || document.activeElement === document.body)).toBe(true);
  }
  await page.keyboard.press("Escape");
  await expect(drawer).toBeHidden();
  await expect(menu).toBeFocused();

  // Open, then turned sideways (1180 px): the side column shows, the drawer is gone and the page works.
  await menu.click();
  await expect(drawer).toBeVisible();
  await page.setViewportSize(SIZES[1]);
  await expect(drawer).toBeHidden();
  await expect(menu).toBeHidden();
  const side = page.getByRole("navigation", { name: "Sections" });
  await expect(side).toBeVisible();
  expect(await sidewaysScroll(page)).toEqual([]);
  // And back upright: closed, nothing stuck; the drawer still opens, and a pick closes it.
  await page.setViewportSize(SIZES[0]);
  await expect(drawer).toBeHidden();
  await expect(menu).toHaveAttribute("aria-expanded", "false");
  expect(await sidewaysScroll(page)).toEqual([]);
  await menu.click();
  await drawer.getByRole("link", { name: "Deals" }).click();
  await expect(page).toHaveURL(/\/deals$/);
  await expect(drawer).toBeHidden();
  // Turned sideways while closed: the side column's links work (no modal left behind them).
  await page.setViewportSize(SIZES[1]);
  await side.getByRole("link", { name: "Board" }).click();
  await expect(page).toHaveURL(/\/board$/);
  await context.close();
});

test("on a phone the deal tabs scroll with a cue, and the current tab is in view", async ({ browser }) => {
  const context = await browser.newContext({ viewport: SIZES[3] });
  const page = await context.newPage();
  await signIn(page, "rep@tallgrass.example");
  await page.goto(`/deals/${ESPOSITO}/timeline`);
  const tabs = page.getByRole("navigation", { name: "Deal" });
  const current = tabs.getByRole("link", { name: "Timeline" });
  await expect(current).toHaveAttribute("aria-current", "page");
  await expect(current).toBeInViewport({ ratio: 1 });
  // Scrolled to its end, the row says more tabs are at its start.
  await expect(tabs.locator('[data-scroll-cue="start"]')).toBeVisible();
  await expect(tabs.locator('[data-scroll-cue="end"]')).toHaveCount(0);
  await page.goto(`/deals/${ESPOSITO}`);
  await expect(tabs.locator('[data-scroll-cue="end"]')).toBeVisible();
  await expect(tabs.locator('[data-scroll-cue="start"]')).toHaveCount(0);
  await context.close();
});
