// Shared helpers for the browser tests: the dev outbox, direct database access for set-up,
// and signing in. The app under test is the production build started by `npm test`.
import { expect, type APIRequestContext, type BrowserContext, type Page } from "@playwright/test";
import { hashPassword } from "better-auth/crypto";
import mysql from "mysql2/promise";
import { z } from "zod";

export const DEMO_PASSWORD = "tallgrass-demo-2026";
export const APP_URL = process.env.APP_URL ?? "";

const messageSchema = z.object({
  id: z.string(),
  to: z.array(z.string()),
  subject: z.string(),
  html: z.string().nullable().optional(),
  createdAt: z.string(),
});
export type OutboxMessage = z.infer<typeof messageSchema>;

/** Waits for the newest message to `to` (optionally matching the subject) in the dev outbox. */
export async function waitForMail(to: string, subject?: RegExp, timeoutMs = 15_000): Promise<OutboxMessage> {
  const url = `${process.env.KW_TEST_MAIL_URL}/dev/messages?to=${encodeURIComponent(to)}&limit=20`;
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await fetch(url, { headers: { Authorization: `Bearer ${process.env.RESEND_API_KEY}` } });
    if (res.ok) {
      const { data } = z.object({ data: z.array(messageSchema) }).parse(await res.json());
      const found = data.find((m) => !subject || subject.test(m.subject));
      if (found) return found;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`No e-mail to ${to}${subject ? ` matching ${subject}` : ""} reached the dev outbox`);
}

/** The first link in a message whose address contains `part`. */
export function linkIn(message: OutboxMessage, part: string): string {
  const hrefs = [...(message.html ?? "").matchAll(/href="([^"]+)"/g)].map((m) => m[1].replaceAll("&amp;", "&"));
  const link = hrefs.find((h) => h.includes(part));
  if (!link) throw new Error(`No link containing ${part} in "${message.subject}": ${hrefs.join(", ")}`);
  return link;
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/today$/);
}

/** Signs an API client in through better-auth's endpoint (its cookie stays in the context). */
export async function apiSignIn(request: APIRequestContext, email: string, password = DEMO_PASSWORD): Promise<void> {
  const res = await request.post("/api/auth/sign-in/email", {
    data: { email, password },
    headers: { Origin: APP_URL },
  });
  expect(res.status(), await res.text()).toBe(200);
}

export async function withDb<T>(fn: (conn: mysql.Connection) => Promise<T>): Promise<T> {
  const conn = await mysql.createConnection({ uri: process.env.DATABASE_URL, timezone: "Z" });
  try {
    return await fn(conn);
  } finally {
    await conn.end();
  }
}

export const unique = (prefix: string) => `${prefix}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}`;

/** A second company with a verified owner, written straight to the database for set-up. */
export async function createCompany(name: string): Promise<{ companyId: string; email: string; password: string }> {
  const companyId = crypto.randomUUID();
  const userId = crypto.randomUUID();
  const email = `${unique("owner")}@othercompany.example`;
  const password = "other-company-pass-1";
  const hash = await hashPassword(password);
  await withDb(async (conn) => {
    await conn.query("INSERT INTO company (id, name) VALUES (?, ?)", [companyId, name]);
    await conn.query("INSERT INTO user (id, name, email, email_verified) VALUES (?, ?, ?, 1)", [userId, "Other Owner", email]);
    await conn.query("INSERT INTO account (id, account_id, provider_id, user_id, password) VALUES (?, ?, 'credential', ?, ?)", [crypto.randomUUID(), userId, userId, hash]);
    await conn.query("INSERT INTO membership (id, company_id, user_id, role) VALUES (?, ?, ?, 'owner')", [crypto.randomUUID(), companyId, userId]);
  });
  return { companyId, email, password };
}

/** The page's own alerts (Next.js adds an empty route announcer with role="alert"). */
export const alertOf = (page: Page) => page.locator('[role="alert"]:not(#__next-route-announcer__)');

/**
 * Collects what the Content-Security-Policy blocked (securitypolicyviolation events, and the
 * console's "Refused to …" errors) and uncaught page errors, in every page of a context, so a
 * journey can fail on them: a policy that breaks charts, the signature pad or drag and drop
 * shows up here even when the screen still looks right.
 */
export async function watchBrowserProblems(context: BrowserContext): Promise<{ problems: string[]; expectNone: () => void }> {
  const problems: string[] = [];
  await context.exposeBinding("__kwReportViolation", (_source, text: string) => {
    problems.push(`CSP violation: ${text}`);
  });
  await context.addInitScript(() => {
    const report = (window as unknown as { __kwReportViolation: (text: string) => void }).__kwReportViolation;
    document.addEventListener("securitypolicyviolation", (e) => {
      report(`${e.effectiveDirective} blocked ${e.blockedURI || "inline"} (${e.sourceFile}:${e.lineNumber}) on ${location.pathname}`);
    });
  });
  context.on("console", (msg) => {
    if (msg.type() === "error" && /Content Security Policy|Refused to/i.test(msg.text())) problems.push(`console: ${msg.text()}`);
  });
  context.on("weberror", (err) => problems.push(`page error: ${err.error().message}`));
  return { problems, expectNone: () => expect(problems, problems.join("\n")).toEqual([]) };
}

/**
 * What scrolls sideways on the page as it is now: the page itself (naming, down from <body>, the
 * element whose hiding narrows the page most) and any element inside that scrolls sideways
 * without being a marked scroll region (`data-scroll-region`) whose cue (`data-scroll-cue`) shows.
 * Form controls scroll their own text and are left out.
 */
export async function sidewaysScroll(page: Page): Promise<string[]> {
  return page.evaluate(async () => {
    await new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)));
    const describe = (e: Element) => {
      const cls = (e.getAttribute("class") ?? "").split(/\s+/).slice(0, 6).join(" ");
      const id = e.getAttribute("data-testid") ?? e.getAttribute("aria-label") ?? "";
      return `<${e.tagName.toLowerCase()}${id ? ` "${id}"` : ""} class="${cls}">`;
    };
    const problems: string[] = [];
    const client = document.documentElement.clientWidth;
    const width = () => document.documentElement.scrollWidth;
    if (width() > client) {
      const whole = width();
      let culprit = "";
      let el: Element | null = document.body;
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
        culprit = describe(best[0]);
        el = best[0];
      }
      problems.push(`page is ${whole}px wide in a ${client}px window (${culprit})`);
    }
    for (const el of document.body.querySelectorAll("*")) {
      if (el.scrollWidth <= el.clientWidth + 1 || el.closest("input, textarea, select")) continue;
      const style = getComputedStyle(el);
      if (style.overflowX !== "auto" && style.overflowX !== "scroll") continue;
      if (!(el as HTMLElement).checkVisibility()) continue;
      const region = el.closest("[data-scroll-region]");
      const cue = region ? [...region.querySelectorAll("[data-scroll-cue]")].some((c) => (c as HTMLElement).checkVisibility()) : false;
      if (!cue) problems.push(`${describe(el)} scrolls sideways (${el.scrollWidth}px in ${el.clientWidth}px)${region ? " without a visible cue" : ""}`);
    }
    return problems;
  });
}

/** The page fits its window (see sidewaysScroll). */
export async function noSidewaysScroll(page: Page, what: string): Promise<void> {
  const problems = await sidewaysScroll(page);
  expect(problems, `${what}: ${problems.join("; ")}`).toEqual([]);
}
