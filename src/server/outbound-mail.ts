import "server-only";
// The transactional outbox for e-mail that follows a committed change (signed copies, receipts,
// refund notices, notices to the office). `queueMail(tx, …)` writes the rendered message in the
// caller's own transaction, so it exists exactly when the change does; `deliverQueuedMail` sends
// due rows until the mail service accepts them. Every app process runs the worker
// (src/instrumentation.ts) and callers nudge it right after their commit, so mail still goes out
// at once. Rows are claimed with SELECT … FOR UPDATE SKIP LOCKED plus a lease, so two processes
// never send the same row at the same time, and the service's idempotency key turns a retry of a
// send that did go through (a crash between the send and our update) into no second message.
import { render } from "@react-email/render";
import { and, asc, eq, inArray, lte, sql } from "drizzle-orm";
import type { ReactElement } from "react";
import { outboundMail } from "@/db/schema";
import { db, transaction, type Tx } from "@/server/db";
import { notFound } from "@/server/errors";
import { MailSendError, sendRendered } from "@/server/mail";

export type QueuedMail = {
  companyId: string;
  /** Which message this is, e.g. "signed-copy-customer" (shown to the office, used in logs). */
  kind: string;
  to: string | string[];
  subject: string;
  react: ReactElement;
  replyTo?: string;
  /** One message per key: queuing the same key again (a replayed event) adds nothing. */
  idempotencyKey: string;
};

/** A claimed row is not offered to another worker for this long (longer than any send takes). Our choice. */
export const CLAIM_LEASE_MS = 60_000;
/** Wait after the n-th failed attempt: 5 s doubling, at most an hour (our choice). */
export function retryDelayMs(attempts: number): number {
  return Math.min(3_600_000, 5_000 * 2 ** Math.max(0, attempts - 1));
}
/** The service's answers that no retry can change (a malformed message); anything else is retried. */
const PERMANENT_STATUSES = new Set([400, 409, 422]);
const BATCH = 20;

/** Renders the message and writes it in the caller's transaction; returns its row id (the existing one for a repeated key). */
export async function queueMail(tx: Tx, m: QueuedMail): Promise<string> {
  const [html, text] = await Promise.all([render(m.react), render(m.react, { plainText: true })]);
  const id = crypto.randomUUID();
  await tx
    .insert(outboundMail)
    .ignore()
    .values({
      id,
      companyId: m.companyId,
      kind: m.kind,
      toAddresses: Array.isArray(m.to) ? m.to : [m.to],
      replyTo: m.replyTo ?? null,
      subject: m.subject.slice(0, 500),
      html,
      text,
      idempotencyKey: m.idempotencyKey,
    });
  const [row] = await tx.select({ id: outboundMail.id }).from(outboundMail).where(eq(outboundMail.idempotencyKey, m.idempotencyKey)).limit(1);
  return row?.id ?? id;
}

/** MariaDB's "try restarting transaction" answers (deadlock, lock wait timeout): the claim rolled back whole. */
function isRetryableLockError(err: unknown): boolean {
  const errno = (err as { errno?: unknown; cause?: { errno?: unknown } } | null)?.errno ?? (err as { cause?: { errno?: unknown } } | null)?.cause?.errno;
  return errno === 1213 || errno === 1205;
}

/**
 * Claims up to `limit` due rows (optionally only `ids`) for this worker; the claim commits at
 * once. Claimers racing on the due index can deadlock; the loser's claim rolled back, so it tries again.
 */
async function claimDue(limit: number, ids?: string[]): Promise<string[]> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await claimOnce(limit, ids);
    } catch (err) {
      if (attempt >= 5 || !isRetryableLockError(err)) throw err;
      await new Promise((r) => setTimeout(r, 20 * attempt + Math.floor(Math.random() * 30)));
    }
  }
}

async function claimOnce(limit: number, ids?: string[]): Promise<string[]> {
  return transaction(async (tx) => {
    const due = and(
      eq(outboundMail.status, "pending"),
      lte(outboundMail.nextAttemptAt, sql`CURRENT_TIMESTAMP(3)`),
      ids ? inArray(outboundMail.id, ids) : undefined,
    );
    const rows = await tx
      .select({ id: outboundMail.id })
      .from(outboundMail)
      .where(due)
      .orderBy(asc(outboundMail.nextAttemptAt))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (rows.length === 0) return [];
    const claimed = rows.map((r) => r.id);
    await tx
      .update(outboundMail)
      .set({ attempts: sql`${outboundMail.attempts} + 1`, nextAttemptAt: sql`CURRENT_TIMESTAMP(3) + INTERVAL ${CLAIM_LEASE_MS * 1000} MICROSECOND` })
      .where(inArray(outboundMail.id, claimed));
    return claimed;
  });
}

async function sendOne(id: string): Promise<"sent" | "retry" | "failed"> {
  const [row] = await db().select().from(outboundMail).where(and(eq(outboundMail.id, id), eq(outboundMail.status, "pending"))).limit(1);
  if (!row || row.html === null || row.text === null) return "failed";
  try {
    const { id: providerId } = await sendRendered({
      companyId: row.companyId,
      to: row.toAddresses,
      subject: row.subject,
      html: row.html,
      text: row.text,
      ...(row.replyTo ? { replyTo: row.replyTo } : {}),
      idempotencyKey: row.idempotencyKey,
    });
    // Sent: the body (links with tokens) is not kept.
    await db()
      .update(outboundMail)
      .set({ status: "sent", sentAt: sql`CURRENT_TIMESTAMP(3)`, providerId, lastError: null, html: null, text: null })
      .where(eq(outboundMail.id, id));
    return "sent";
  } catch (err) {
    const permanent = err instanceof MailSendError && err.statusCode !== null && PERMANENT_STATUSES.has(err.statusCode);
    const message = (err instanceof Error ? err.message : String(err)).slice(0, 500);
    await db()
      .update(outboundMail)
      .set(
        permanent
          ? { status: "failed", lastError: message }
          : { lastError: message, nextAttemptAt: sql`CURRENT_TIMESTAMP(3) + INTERVAL ${retryDelayMs(row.attempts) * 1000} MICROSECOND` },
      )
      .where(eq(outboundMail.id, id));
    console.error(`outbound mail ${id} (${row.kind}) not accepted (attempt ${row.attempts})${permanent ? ", given up" : ", will retry"}: ${message}`);
    return permanent ? "failed" : "retry";
  }
}

/** Sends due rows (all due ones, or only `ids`); returns what happened. Throws only when the database cannot be reached. */
export async function deliverQueuedMail(opts: { ids?: string[]; limit?: number } = {}): Promise<{ sent: number; retry: number; failed: number }> {
  const tally = { sent: 0, retry: 0, failed: 0 };
  if (opts.ids && opts.ids.length === 0) return tally;
  const limit = opts.limit ?? Number.POSITIVE_INFINITY;
  while (tally.sent + tally.retry + tally.failed < limit) {
    const claimed = await claimDue(Math.min(BATCH, limit - (tally.sent + tally.retry + tally.failed)), opts.ids);
    if (claimed.length === 0) break;
    // A refused row is due again only after its back-off, so this ends.
    for (const outcome of await Promise.all(claimed.map(sendOne))) tally[outcome] += 1;
  }
  return tally;
}

/**
 * After the caller's commit: tries its messages at once (so the customer gets them while still on
 * the page). A failure is left to the worker's retries and never fails the caller.
 */
export async function sendQueuedNow(ids: string[]): Promise<void> {
  try {
    await deliverQueuedMail({ ids });
  } catch (err) {
    console.error("queued mail will be sent by the worker:", err instanceof Error ? err.message : err);
  }
}

/** One message of the company, without its body (links in it carry tokens). */
export async function getOutboundMailOrThrow(companyId: string, id: string) {
  const [row] = await db()
    .select({
      id: outboundMail.id,
      kind: outboundMail.kind,
      to: outboundMail.toAddresses,
      subject: outboundMail.subject,
      status: outboundMail.status,
      attempts: outboundMail.attempts,
      nextAttemptAt: outboundMail.nextAttemptAt,
      sentAt: outboundMail.sentAt,
      lastError: outboundMail.lastError,
      createdAt: outboundMail.createdAt,
    })
    .from(outboundMail)
    .where(and(eq(outboundMail.id, id), eq(outboundMail.companyId, companyId)))
    .limit(1);
  if (!row) throw notFound("E-mail");
  return row;
}

// ── The worker ──────────────────────────────────────────────────────────────────────────────

/** How often each app process looks for due mail (our choice: a few seconds). */
export const WORKER_INTERVAL_MS = 3_000;

type WorkerState = { timer: NodeJS.Timeout; running: boolean };
const globalForWorker = globalThis as unknown as { kilowrightMailWorker?: WorkerState };

async function tick(state: WorkerState): Promise<void> {
  if (state.running) return;
  state.running = true;
  try {
    await deliverQueuedMail({ limit: 200 });
  } catch (err) {
    // The database is away (a restart, an outage): the next tick tries again.
    console.error("mail worker: cannot reach the database:", err instanceof Error ? err.message : err);
  } finally {
    state.running = false;
  }
}

/** Starts this process's mail worker once (src/instrumentation.ts); rows survive restarts, so it picks up what a killed process left. */
export function startMailWorker(intervalMs = WORKER_INTERVAL_MS): void {
  if (globalForWorker.kilowrightMailWorker) return;
  const state: WorkerState = { timer: setInterval(() => void tick(state), intervalMs), running: false };
  state.timer.unref();
  globalForWorker.kilowrightMailWorker = state;
  void tick(state);
}
