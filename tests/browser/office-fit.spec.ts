import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support";

// The office screens built from src/components/ui fit a phone, a tablet and a laptop: the page
// never scrolls sideways (wide tables scroll inside their own frame), with the forms open.
const WIDTHS = [390, 820, 1280];

async function noSidewaysScroll(page: Page, what: string) {
  const { scroll, client, culprit } = await page.evaluate(() => {
    const client = document.documentElement.clientWidth;
    // Names what to fix: down from <body>, the child whose hiding narrows the page most.
    const width = () => document.documentElement.scrollWidth;
    let culprit = "";
    let el: Element | null = width() > client ? document.body : null;
    while (el) {
      const now = width();
      let best: [Element, number] | null = null;
      for (const c of el.children) {
        const h = c as HTMLElement;
        const before = h.style.display;
        h.style.display = "none";
        const w = width();
        h.style.display = before;
        if (w < now && (!best || w < best[1])) best = [c, w];
      }
      if (!best) break;
      culprit = `<${best[0].tagName.toLowerCase()} class="${best[0].getAttribute("class") ?? ""}">`;
      el = best[0];
    }
    return { scroll: document.documentElement.scrollWidth, client, culprit };
  });
  expect(scroll, `${what}: page is ${scroll}px wide in a ${client}px window (${culprit})`).toBeLessThanOrEqual(client);
}

for (const width of WIDTHS) {
  test(`the office's catalog, price book, rate plan, weather, settings and jobs screens fit ${width} px`, async ({ page }) => {
    await page.setViewportSize({ width, height: 900 });
    await signIn(page, "owner@tallgrass.example");
    const screens: [string, (() => Promise<void>)?][] = [
      ["/catalog", async () => page.getByRole("button", { name: "Add module" }).click()],
      ["/price-book"],
      ["/utilities"],
      ["/rate-plans"],
      ["/rate-plans/new"],
      ["/weather"],
      ["/settings/people"],
      ["/settings/company"],
      ["/settings/checklists", async () => page.getByRole("button", { name: "New checklist" }).click()],
      ["/jobs"],
      ["/jobs/crews"],
    ];
    for (const [path, open] of screens) {
      await page.goto(path);
      await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
      if (open) await open();
      await noSidewaysScroll(page, path);
    }
    await page.goto("/jobs");
    const job = page.getByTestId("jobs-table").getByRole("link").first();
    await job.click();
    await expect(page).toHaveURL(/\/jobs\/[0-9a-f-]{36}$/);
    await noSidewaysScroll(page, "a job");
  });
}
