import { defineConfig, devices } from "@playwright/test";

const baseURL = process.env.APP_URL;
if (!baseURL) throw new Error("Run the browser tests through `npm test` (it starts the app and sets APP_URL).");

// Debian's chromium, never a downloaded browser. The flags keep it off the closed network.
const chromium = {
  executablePath: "/usr/bin/chromium",
  args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
};

export default defineConfig({
  testDir: "./browser",
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  expect: { timeout: 10_000 },
  reporter: [["list"]],
  outputDir: "../test-results",
  use: {
    baseURL,
    // Chromium sends Origin on every fetch that changes something; Playwright's API requests do
    // not, and the app refuses cookie mutations without one (src/server/request-guard.ts).
    extraHTTPHeaders: { Origin: new URL(baseURL).origin },
    headless: true,
    launchOptions: chromium,
    trace: "retain-on-failure",
    screenshot: "only-on-failure",
  },
  projects: [
    { name: "journeys", testIgnore: /resilience/, use: { ...devices["Desktop Chrome"], launchOptions: chromium } },
    // Stops and starts the database under the running app, so it runs after everything else.
    { name: "resilience", testMatch: /resilience/, dependencies: ["journeys"], use: { launchOptions: chromium } },
  ],
});
