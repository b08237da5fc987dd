// Browser defences (issue #14, item 5): the homeowner's page /p/<token> cannot be framed by
// another site (clickjacking: "sign here" under a decoy), and its responses carry the headers
// that say so, plus the rest of the policy. A page served from another origin (a tiny local
// server on its own port) frames it; Chromium must refuse.
import { createHash, randomBytes } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { expect, test } from "@playwright/test";
import { APP_URL, withDb } from "./support";

/** A fresh link token for a sent demo proposal (only its hash is stored, as in the app). */
async function proposalLink(): Promise<string> {
  const token = randomBytes(32).toString("base64url");
  const hash = createHash("sha256").update(token).digest("hex");
  await withDb(async (conn) => {
    const [rows] = await conn.query("SELECT id FROM proposal WHERE status = 'sent' AND (expires_at IS NULL OR expires_at > NOW()) ORDER BY created_at DESC LIMIT 1");
    const id = (rows as { id: string }[])[0]?.id;
    if (!id) throw new Error("the demo seed has no sent proposal");
    await conn.query("UPDATE proposal SET token_hash = ? WHERE id = ?", [hash, id]);
  });
  return `${APP_URL}/p/${token}`;
}

/** Serves one page on another origin that frames `target`, and beside it a page of its own (the control). */
async function framingSite(target: string): Promise<{ url: string; close: () => Promise<void> }> {
  const server = http.createServer((req, res) => {
    res.setHeader("Content-Type", "text/html; charset=utf-8");
    if (req.url === "/own") return res.end("<!doctype html><p id=own>framed fine</p>");
    res.end(`<!doctype html><h1>Win a prize</h1><iframe id=app name=app src="${target}" width=800 height=600></iframe><iframe id=own name=own src="/own"></iframe>`);
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return { url: `http://127.0.0.1:${port}/`, close: () => new Promise((resolve) => server.close(() => resolve())) };
}

test("another site cannot frame the homeowner's page", async ({ page }) => {
  const link = await proposalLink();
  const site = await framingSite(link);
  try {
    await page.goto(site.url, { waitUntil: "load" }); // the load event waits for both frames
    // The control: a frame of the site's own page loads, so a frame that shows nothing was refused, not slow.
    await expect(page.frameLocator("#own").locator("#own")).toHaveText("framed fine");
    const framed = page.frame({ name: "app" });
    expect(framed).not.toBeNull();
    // Chromium replaces a refused frame with its error page: nothing of the proposal is in it.
    await expect.poll(() => framed!.url(), { timeout: 10_000 }).toMatch(/^chrome-error:/);
    expect(await framed!.locator("h1, h2").filter({ hasText: /proposal/i }).count()).toBe(0);
    // And the page itself, opened directly, is there (the token is good).
    const direct = await page.request.get(link);
    expect(direct.status()).toBe(200);
  } finally {
    await site.close();
  }
});

test("the homeowner's page carries the browser defences, with a nonce its scripts use", async ({ page, request }) => {
  const link = await proposalLink();
  const res = await request.get(link);
  expect(res.status()).toBe(200);
  const h = res.headers();
  const csp = h["content-security-policy"] ?? "";
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toMatch(/script-src [^;]*'nonce-[A-Za-z0-9+/=]{16,}'/);
  expect(csp).not.toContain("unsafe-eval");
  expect(csp).not.toMatch(/script-src [^;]*'unsafe-inline'/);
  expect(csp).toContain("object-src 'none'");
  expect(h["x-frame-options"]).toBe("DENY");
  expect(h["x-content-type-options"]).toBe("nosniff");
  expect(h["referrer-policy"]).toBe("no-referrer");
  expect(h["permissions-policy"]).toContain("camera=(self)");
  expect(h["permissions-policy"]).toContain("microphone=()");
  expect(h["permissions-policy"]).toContain("geolocation=(self)");
  expect(h["x-powered-by"]).toBeUndefined();
  // Served over http here: no HSTS (it is sent only when APP_URL is https).
  expect(h["strict-transport-security"]).toBeUndefined();
  // Every script tag carries this response's nonce, and a second response has another one.
  const nonce = csp.match(/'nonce-([^']+)'/)?.[1] ?? "";
  const html = await res.text();
  const scripts = [...html.matchAll(/<script\b[^>]*>/g)].map((m) => m[0]);
  expect(scripts.length).toBeGreaterThan(0);
  for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`);
  const again = (await request.get(link)).headers()["content-security-policy"] ?? "";
  expect(again.match(/'nonce-([^']+)'/)?.[1]).not.toBe(nonce);

  // The page still works under its policy: it hydrates (the offer picker answers a tap).
  const violations: string[] = [];
  page.on("console", (msg) => {
    if (msg.type() === "error") violations.push(msg.text());
  });
  await page.goto(link);
  await expect(page.getByRole("heading", { name: /Solar proposal for/ })).toBeVisible();
  expect(violations.filter((v) => /Content Security Policy|Refused/.test(v))).toEqual([]);
});

test("staff pages and the API carry their own referrer policy and no framing either", async ({ request }) => {
  const signIn = await request.get("/sign-in");
  expect(signIn.headers()["referrer-policy"]).toBe("strict-origin-when-cross-origin");
  expect(signIn.headers()["content-security-policy"]).toContain("frame-ancestors 'none'");
  expect(signIn.headers()["x-powered-by"]).toBeUndefined();
  const api = await request.get("/api/health");
  expect(api.headers()["content-security-policy"]).toBe("frame-ancestors 'none'");
  expect(api.headers()["x-frame-options"]).toBe("DENY");
  expect(api.headers()["x-content-type-options"]).toBe("nosniff");
});
