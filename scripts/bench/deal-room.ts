/**
 * npm run bench:deal-room — the deal room in a real browser (Debian chromium via Playwright)
 * against a running production build: largest contentful paint (LCP) of the Design tab, and
 * the time from an edit to the recomputed estimate. Start the app first (`npm run demo`, or
 * APP_URL=… for another instance); the figures go to docs/benchmarks.md.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { loadavg } from "node:os";
import { fileURLToPath } from "node:url";
import { chromium } from "@playwright/test";

const APP_URL = (process.env.APP_URL ?? "http://localhost:3000").replace(/\/$/, "");
const DEAL_ID = "7a11a55e-0000-4000-8000-000000000303"; // the demo rep's deal in Designing
const LOADS = 5;
const EDITS = 10;
const GOAL_LCP_MS = 1500;
const GOAL_RECOMPUTE_MS = 100;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

const browser = await chromium.launch({
  executablePath: "/usr/bin/chromium",
  args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
});
const context = await browser.newContext({ viewport: { width: 820, height: 1180 }, baseURL: APP_URL });
const signIn = await context.request.post("/api/auth/sign-in/email", {
  data: { email: "rep@tallgrass.example", password: "tallgrass-demo-2026" },
  headers: { Origin: APP_URL },
});
if (!signIn.ok()) throw new Error(`Sign-in failed (${signIn.status()}): is the demo running at ${APP_URL}?`);

const lcps: number[] = [];
for (let i = 0; i < LOADS; i++) {
  const page = await context.newPage();
  await page.goto(`/deals/${DEAL_ID}/design`, { waitUntil: "load" });
  await page.getByTestId("production-chart").waitFor();
  const lcp = await page.evaluate(
    () =>
      new Promise<number>((resolve) => {
        new PerformanceObserver((list) => {
          const entries = list.getEntries();
          resolve(entries[entries.length - 1]?.startTime ?? Number.NaN);
        }).observe({ type: "largest-contentful-paint", buffered: true });
      }),
  );
  lcps.push(lcp);
  await page.close();
}

const page = await context.newPage();
await page.goto(`/deals/${DEAL_ID}/design`);
await page.getByTestId("production-chart").waitFor();
const tilt = page.getByLabel("Face 1 tilt (°)");
const annual = page.getByTestId("annual-kwh");
const walls: number[] = [];
const engine: number[] = [];
for (let i = 0; i < EDITS; i++) {
  const before = await annual.textContent();
  const current = await tilt.inputValue();
  let value = String(15 + ((i * 7) % 25));
  if (value === current) value = String(Number(value) + 1);
  const t0 = Date.now();
  await tilt.fill(value);
  const changed = await page
    .waitForFunction((prev) => document.querySelector('[data-testid="annual-kwh"]')?.textContent !== prev, before, { timeout: 10_000, polling: "raf" })
    .then(() => true)
    .catch(() => false);
  // An edit whose rounded annual figure happens not to change cannot be timed this way.
  if (changed) walls.push(Date.now() - t0);
  const text = (await page.getByText(/computed in [\d.,]+ ms/).first().textContent()) ?? "";
  const ms = Number(text.match(/computed in ([\d.,]+) ms/)?.[1]?.replaceAll(",", ""));
  if (Number.isFinite(ms)) engine.push(ms);
}
await browser.close();

const row = (name: string, xs: number[], goal: string, goalMs: number) =>
  `| ${name} | ${median(xs).toFixed(0)} | ${Math.min(...xs).toFixed(0)} | ${Math.max(...xs).toFixed(0)} | ${xs.length} | ${goal} | ${median(xs) <= goalMs ? "yes" : "no"} |`;
const section = [
  "<!-- deal-room:start -->",
  "## Deal room in the browser (npm run bench:deal-room)",
  "",
  `Run: ${new Date().toISOString().slice(0, 16).replace("T", " ")} UTC against ${APP_URL} (production build, local), Debian chromium headless at 820×1180, load average ${loadavg()[0].toFixed(2)}.`,
  "",
  "| measure | median ms | best ms | worst ms | samples | goal | met |",
  "|---|---:|---:|---:|---:|---|:-:|",
  row("Design tab: largest contentful paint", lcps, "LCP ≤ 1.5 s", GOAL_LCP_MS),
  row("edit a face's tilt → estimate on screen (wall time, incl. React render)", walls, "≤ 100 ms", GOAL_RECOMPUTE_MS),
  row("the engine's recompute itself (as shown in the tab)", engine, "≤ 100 ms", GOAL_RECOMPUTE_MS),
  "<!-- deal-room:end -->",
].join("\n");
console.log(section);

const docPath = fileURLToPath(new URL("../../docs/benchmarks.md", import.meta.url));
const doc = readFileSync(docPath, "utf8");
const start = doc.indexOf("<!-- deal-room:start -->");
const end = doc.indexOf("<!-- deal-room:end -->");
writeFileSync(docPath, start >= 0 && end > start ? doc.slice(0, start) + section + doc.slice(end + "<!-- deal-room:end -->".length) : `${doc.trimEnd()}\n\n${section}\n`);
