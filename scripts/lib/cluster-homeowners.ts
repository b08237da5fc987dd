// The homeowners of the cluster fault test (scripts/test-cluster.ts): each takes a sent
// proposal and does what the proposal page does in a browser, through the balancer — ask for a
// code, read it from the dev outbox, confirm it, consent and sign, press Pay, pay on the dev
// payments server's hosted page, then watch the page's deposit state until the webhook (sent
// and retried by the payments fake) has booked it. A step that fails is tried again the way a
// person would (press again), so retries of every kind reach the app while nodes die.
import { createHash, randomBytes } from "node:crypto";
import mysql from "mysql2/promise";
import sharp from "sharp";
import { DEMO_COMPANY_ID } from "./seed-demo";

export type Outcome = { at: number; ok: boolean; what: string; status: number | string };

export type Homeowner = {
  proposalId: string;
  dealId: string;
  token: string;
  email: string;
  /** A documentation address (RFC 5737) per homeowner, sent as X-Forwarded-For: every home has its own. */
  address: string;
  taken: boolean;
  /** From taking the proposal to the page showing the deposit paid, in ms. */
  paidAfterMs?: number;
  signed: "201" | "409" | null;
  paid: boolean;
  /** A code waiting to be typed, the last one typed (good once), the signing confirmation's cookie. */
  code?: string;
  usedCode?: string;
  cookie?: string;
};

type Env = { appUrl: string; mailUrl: string; mailKey: string; record: (o: Omit<Outcome, "at">) => void };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const CARD = { number: "4242424242424242", exp: `12/${String((new Date().getUTCFullYear() + 5) % 100).padStart(2, "0")}`, cvc: "123", postal: "27401" };

/**
 * `count` proposals sent and waiting for a signature, each on its own deal and household: copies
 * of the demo's sent proposal (its snapshot and stored PDF) with a link token we keep, written
 * through the balancer. Only the seeding is done in SQL; everything the homeowners do goes
 * through the app.
 */
export async function seedSentProposals(databaseUrl: string, count: number): Promise<Homeowner[]> {
  const conn = await mysql.createConnection({ uri: databaseUrl });
  try {
    const [rows] = await conn.query(
      `SELECT p.snapshot, p.pdf_storage_key, p.pdf_sha256, p.in_home_sale, d.owner_user_id
         FROM proposal p JOIN deal d ON d.id = p.deal_id AND d.company_id = p.company_id
        WHERE p.company_id = ? AND p.status = 'sent' ORDER BY p.created_at LIMIT 1`,
      [DEMO_COMPANY_ID],
    );
    const [t] = rows as { snapshot: unknown; pdf_storage_key: string; pdf_sha256: string; in_home_sale: number; owner_user_id: string }[];
    if (!t) throw new Error("The demo seed has no sent proposal to copy");
    const snapshot = typeof t.snapshot === "string" ? t.snapshot : JSON.stringify(t.snapshot);
    const offers = (JSON.parse(snapshot) as { offers: { position: number; depositCents?: number }[] }).offers;
    if (!offers.some((o) => (o.depositCents ?? 0) > 0)) throw new Error("The demo's sent proposal asks no deposit; the fault test needs one");
    const [[{ n }]] = (await conn.query("SELECT COALESCE(MAX(number), 0) AS n FROM proposal WHERE company_id = ?", [DEMO_COMPANY_ID])) as unknown as [[{ n: number }]];
    const out: Homeowner[] = [];
    for (let i = 0; i < count; i++) {
      const [householdId, dealId, proposalId] = [crypto.randomUUID(), crypto.randomUUID(), crypto.randomUUID()];
      const token = randomBytes(32).toString("base64url");
      const email = `faultline-signer-${i + 1}@homeowner.example`;
      await conn.query(
        "INSERT INTO household (id, company_id, name, contact_name, email, street, city, region, postal_code, latitude, longitude) VALUES (?, ?, ?, ?, ?, ?, 'Greensboro', 'NC', '27401', 36.07, -79.79)",
        [householdId, DEMO_COMPANY_ID, `Faultline signer ${i + 1} household`, `Sam Signer ${i + 1}`, email, `${i + 1} Quorum Court`],
      );
      await conn.query("INSERT INTO deal (id, company_id, household_id, owner_user_id, stage, source) VALUES (?, ?, ?, ?, 'proposal_out', 'Referral')", [dealId, DEMO_COMPANY_ID, householdId, t.owner_user_id]);
      await conn.query(
        `INSERT INTO proposal (id, company_id, deal_id, number, version, status, snapshot, pdf_storage_key, pdf_sha256, token_hash, expires_at, sent_to_email, in_home_sale)
         VALUES (?, ?, ?, ?, 1, 'sent', ?, ?, ?, ?, DATE_ADD(NOW(3), INTERVAL 30 DAY), ?, ?)`,
        [proposalId, DEMO_COMPANY_ID, dealId, Number(n) + 1 + i, snapshot, t.pdf_storage_key, t.pdf_sha256, createHash("sha256").update(token).digest("hex"), email, t.in_home_sale],
      );
      out.push({ proposalId, dealId, token, email, address: `203.0.113.${(i % 250) + 1}`, taken: false, signed: null, paid: false });
    }
    return out;
  } finally {
    await conn.end();
  }
}

/** One request of the homeowner's browser, recorded; network errors become a status name. */
async function call(e: Env, what: string, url: string, init: RequestInit, okStatuses: number[]): Promise<Response | null> {
  try {
    const res = await fetch(url, { ...init, redirect: "manual", signal: AbortSignal.timeout(15_000) });
    e.record({ ok: okStatuses.includes(res.status), what, status: res.status });
    return res;
  } catch (err) {
    e.record({ ok: false, what, status: err instanceof Error ? err.name : "error" });
    return null;
  }
}

/** The newest signing code e-mailed to the homeowner (the dev outbox lists newest first), or null. */
async function newestCode(e: Env, email: string, waitMs: number): Promise<string | null> {
  const deadline = Date.now() + waitMs;
  while (Date.now() < deadline) {
    const res = await fetch(`${e.mailUrl}/dev/messages?to=${encodeURIComponent(email)}&limit=20`, { headers: { authorization: `Bearer ${e.mailKey}` } }).catch(() => null);
    if (res?.ok) {
      const { data } = (await res.json()) as { data: { subject: string }[] };
      const code = data.map((m) => /(\d{6})/.exec(m.subject)?.[1]).find(Boolean);
      if (code) return code;
    }
    await sleep(300);
  }
  return null;
}

let signaturePng: string | null = null;
async function signature(): Promise<string> {
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="300" height="100"><path d="M12 70 C 50 12, 84 88, 132 40 S 214 82, 288 28" stroke="#1F2933" stroke-width="3" fill="none"/></svg>`;
  signaturePng ??= `data:image/png;base64,${(await sharp(Buffer.from(svg)).png().toBuffer()).toString("base64")}`;
  return signaturePng;
}

/**
 * One press of the page's next button, as far as the homeowner got: ask for a code (when no
 * code waits), confirm it (the same code again after a failed answer), then sign with the
 * confirmation the browser keeps (the same again after a failed answer). True once the app said
 * signed (201, or 409 already signed after a lost answer).
 */
async function signStep(e: Env, h: Homeowner): Promise<boolean> {
  const api = `${e.appUrl}/api/public/proposals/${h.token}`;
  const headers = { origin: e.appUrl, "x-forwarded-for": h.address };
  if (!h.cookie && !h.code) {
    const asked = await call(e, "code", `${api}/code`, { method: "POST", headers }, [201]);
    if (asked?.status === 409) return alreadySigned(e, h);
    // A lost answer may still have sent a code (a second ask then waits its turn: 429): look in the mailbox either way.
    const code = await newestCode(e, h.email, asked?.status === 201 ? 10_000 : 1_000);
    if (!code || code === h.usedCode) return false;
    h.code = code;
  }
  if (!h.cookie && h.code) {
    const verified = await call(e, "verify", `${api}/verify-code`, { method: "POST", headers: { ...headers, "content-type": "application/json" }, body: JSON.stringify({ code: h.code }) }, [200]);
    if (!verified || verified.status >= 500) return false; // the same code again
    h.usedCode = h.code;
    h.code = undefined;
    if (verified.status !== 200) return false; // refused (e.g. a code already confirmed by a lost answer): a new code
    h.cookie = verified.headers.getSetCookie().map((v) => v.split(";")[0]).join("; ");
  }
  const body = JSON.stringify({ position: 1, signerName: "Sam Signer", consent: true, signaturePng: await signature() });
  const signed = await call(e, "sign", `${api}/sign`, { method: "POST", headers: { ...headers, cookie: h.cookie ?? "", "content-type": "application/json" }, body }, [201]);
  if (signed?.status === 201) h.signed = "201";
  else if (signed?.status === 409) return alreadySigned(e, h);
  else if (signed && signed.status < 500) h.cookie = undefined; // the confirmation is not accepted: start again with a code
  return h.signed !== null;
}

/** A 409 from the code or sign route: signed already when the page's own state says so. */
async function alreadySigned(e: Env, h: Homeowner): Promise<boolean> {
  const res = await call(e, "deposit state", `${e.appUrl}/api/public/proposals/${h.token}/deposit`, { headers: { "x-forwarded-for": h.address } }, [200]);
  if (res?.status === 200) h.signed ??= "409";
  return res?.status === 200;
}

/** Pay: the Checkout Session (reused when open), the hosted page's form, then the page's deposit state until paid. */
async function payOnce(e: Env, h: Homeowner, until: number): Promise<boolean> {
  const api = `${e.appUrl}/api/public/proposals/${h.token}/deposit`;
  const headers = { origin: e.appUrl, "x-forwarded-for": h.address };
  const started = await call(e, "checkout", api, { method: "POST", headers }, [200]);
  if (started?.status === 200) {
    const { url } = ((await started.json()) as { data: { url: string } }).data;
    const form = new URLSearchParams({ number: CARD.number, exp: CARD.exp, cvc: CARD.cvc, postal: CARD.postal });
    const paid = await call(e, "card", url, { method: "POST", headers: { "content-type": "application/x-www-form-urlencoded" }, body: form.toString() }, [303, 302, 200]);
    if (!paid || paid.status >= 400) return false;
  } else if (started?.status !== 409) return false;
  // The page polls its deposit state; only the webhook sets it to paid.
  while (Date.now() < until) {
    const res = await call(e, "deposit state", api, { headers: { "x-forwarded-for": h.address } }, [200]);
    if (res?.status === 200 && ((await res.json()) as { data: { status: string } }).data.status === "paid") return (h.paid = true);
    await sleep(500);
  }
  return false;
}

/**
 * One homeowner at a time per writer, taken from `queue` until `stop()`: sign (again and again
 * on failure, for up to 60 s), then pay (up to 120 s, enough for the payments fake's retries).
 */
export async function homeownerWriter(e: Env, queue: Homeowner[], stop: () => boolean): Promise<void> {
  while (!stop()) {
    const h = queue.shift();
    if (!h) return;
    h.taken = true;
    const takenAt = Date.now();
    const signBy = Date.now() + 60_000;
    while (!(await signStep(e, h)) && Date.now() < signBy) await sleep(1_000);
    if (h.signed === null) continue;
    const payBy = Date.now() + 120_000;
    while (!(await payOnce(e, h, Math.min(payBy, Date.now() + 30_000))) && Date.now() < payBy) await sleep(1_000);
    if (h.paid) h.paidAfterMs = Date.now() - takenAt;
  }
}

/** The Checkout Sessions the payments fake took money for: { paymentId, proposalId } from their metadata. */
export async function providerPaidSessions(paymentsUrl: string, apiKey: string): Promise<{ sessionId: string; paymentId: string; proposalId: string }[]> {
  const out: { sessionId: string; paymentId: string; proposalId: string }[] = [];
  let after: string | null = null;
  for (;;) {
    const res = await fetch(`${paymentsUrl}/v1/checkout/sessions?limit=100&status=complete${after ? `&starting_after=${after}` : ""}`, { headers: { authorization: `Bearer ${apiKey}` } });
    if (!res.ok) throw new Error(`listing the payments fake's sessions failed: HTTP ${res.status}`);
    const page = (await res.json()) as { data: { id: string; payment_status: string; metadata: Record<string, string> }[]; has_more: boolean };
    for (const s of page.data) if (s.payment_status === "paid") out.push({ sessionId: s.id, paymentId: s.metadata.paymentId, proposalId: s.metadata.proposalId });
    if (!page.has_more || page.data.length === 0) return out;
    after = page.data[page.data.length - 1].id;
  }
}

type Delivery = { status: "pending" | "delivered" | "failed"; attempts: { status: number | null }[] };

/**
 * Lets the payments fake finish its webhook deliveries (its retries made due at once, as
 * Stripe's would come later) and says how they went: deliveries, attempts the app did not
 * answer 2xx, and any still not delivered after `waitMs`.
 */
export async function settleDeliveries(paymentsUrl: string, waitMs: number): Promise<{ deliveries: number; failedAttempts: number; notDelivered: number }> {
  const deadline = Date.now() + waitMs;
  let list: Delivery[] = [];
  for (;;) {
    await fetch(`${paymentsUrl}/_dev/deliveries/flush`, { method: "POST" });
    await sleep(1_000);
    list = ((await (await fetch(`${paymentsUrl}/_dev/deliveries`)).json()) as { data: Delivery[] }).data;
    if (!list.some((d) => d.status === "pending") || Date.now() > deadline) break;
  }
  const failedAttempts = list.reduce((n, d) => n + d.attempts.filter((a) => a.status === null || a.status < 200 || a.status >= 300).length, 0);
  return { deliveries: list.length, failedAttempts, notDelivered: list.filter((d) => d.status !== "delivered").length };
}

export type MoneyCheck = {
  signingsLost: number;
  paymentsLost: number;
  providerPaymentsNotBooked: number;
  duplicateSignings: number;
  duplicatePayments: number;
  duplicateLedgerRows: number;
  duplicateDepositBookings: number;
  duplicateJobs: number;
  jobsMissing: number;
};

const groupedOver = async (conn: mysql.Connection, sql: string, ids: string[]) => (ids.length ? ((await conn.query(sql, [ids]))[0] as unknown[]).length : 0);

/**
 * On one node: every signing and payment the app acknowledged is there, every payment the
 * provider took is booked, and nothing was recorded twice — a signature, a paid payment, a
 * ledger row (one payment row per proposal: its sessions never expire during the test), a
 * "deposit paid" booking on the Timeline, a job.
 */
export async function checkMoney(conn: mysql.Connection, homeowners: Homeowner[], providerPaid: { paymentId: string }[]): Promise<MoneyCheck> {
  const proposalIds = homeowners.map((h) => h.proposalId);
  const dealIds = homeowners.map((h) => h.dealId);
  const [pRows] = proposalIds.length ? await conn.query("SELECT id, CAST(status AS CHAR) AS status, signed_at FROM proposal WHERE id IN (?)", [proposalIds]) : [[]];
  const proposals = new Map((pRows as { id: string; status: string; signed_at: Date | null }[]).map((r) => [r.id, r]));
  const [payRows] = proposalIds.length ? await conn.query("SELECT id, proposal_id, CAST(status AS CHAR) AS status FROM payment WHERE proposal_id IN (?)", [proposalIds]) : [[]];
  const payments = payRows as { id: string; proposal_id: string; status: string }[];
  const [jobRows] = dealIds.length ? await conn.query("SELECT deal_id FROM job WHERE deal_id IN (?)", [dealIds]) : [[]];
  const jobs = new Set((jobRows as { deal_id: string }[]).map((r) => r.deal_id));
  const paidIds = new Set(payments.filter((p) => p.status === "paid").map((p) => p.id));
  return {
    signingsLost: homeowners.filter((h) => h.signed !== null && !(proposals.get(h.proposalId)?.status === "signed" && proposals.get(h.proposalId)?.signed_at)).length,
    paymentsLost: homeowners.filter((h) => h.paid && !payments.some((p) => p.proposal_id === h.proposalId && p.status === "paid")).length,
    providerPaymentsNotBooked: providerPaid.filter((s) => !paidIds.has(s.paymentId)).length,
    duplicateSignings: await groupedOver(conn, "SELECT proposal_id FROM proposal_event WHERE kind = 'signed' AND proposal_id IN (?) GROUP BY proposal_id HAVING COUNT(*) > 1", proposalIds),
    duplicatePayments: await groupedOver(conn, "SELECT proposal_id FROM payment WHERE status = 'paid' AND proposal_id IN (?) GROUP BY proposal_id HAVING COUNT(*) > 1", proposalIds),
    duplicateLedgerRows: await groupedOver(conn, "SELECT proposal_id FROM payment WHERE proposal_id IN (?) GROUP BY proposal_id HAVING COUNT(*) > 1", proposalIds),
    duplicateDepositBookings: await groupedOver(conn, "SELECT deal_id FROM timeline_event WHERE kind = 'deposit.paid' AND deal_id IN (?) GROUP BY deal_id HAVING COUNT(*) > 1", dealIds),
    duplicateJobs: await groupedOver(conn, "SELECT deal_id FROM job WHERE deal_id IN (?) GROUP BY deal_id HAVING COUNT(*) > 1", dealIds),
    jobsMissing: homeowners.filter((h) => payments.some((p) => p.proposal_id === h.proposalId && p.status === "paid") && !jobs.has(h.dealId)).length,
  };
}
