// The transactional mail outbox against a real MariaDB and the dev outbox: a message exists exactly
// when its transaction commits, a refused send is retried until accepted, two workers never send
// one message twice; and files written before a rolled-back transaction are removed.
import { mkdtemp } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { eq, inArray, sql } from "drizzle-orm";
import { createElement } from "react";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import InvitationEmail from "@emails/invitation";
import { company, outboundMail } from "@/db/schema";
import { startMailFake, type MailFake, type StoredMessage } from "@/fakes/mail-server";
import type { Member } from "@/server/session";
import { newCompany, uniqueEmail } from "../support/fixtures";

let fake: MailFake | null = null;
let owner: Member;
let om: typeof import("@/server/outbound-mail");
let dbm: typeof import("@/server/db");
let mail: typeof import("@/server/mail");
let files: typeof import("@/server/storage");

const mailUrl = () => process.env.KW_TEST_MAIL_URL ?? "";
const auth = () => ({ Authorization: `Bearer ${process.env.RESEND_API_KEY}` });

async function sentTo(to: string): Promise<StoredMessage[]> {
  const res = await fetch(`${mailUrl()}/dev/messages?to=${encodeURIComponent(to)}&limit=200`, { headers: auth() });
  return ((await res.json()) as { data: StoredMessage[] }).data;
}

async function refuseNext(n: number): Promise<void> {
  const res = await fetch(`${mailUrl()}/dev/faults`, { method: n > 0 ? "POST" : "DELETE", headers: { ...auth(), "Content-Type": "application/json" }, body: n > 0 ? JSON.stringify({ refuseNext: n }) : undefined });
  expect(res.status).toBe(200);
}

const element = () =>
  createElement(InvitationEmail, { companyName: "Outbox Solar", inviterName: "Olive", roleLabel: "Crew", acceptUrl: "http://localhost/invite/x", validUntil: "Dec 31, 2030, 7:00 PM EST" });

function queued(to: string, key: string) {
  return { companyId: owner.companyId, kind: "test", to, subject: `Outbox test ${key}`, react: element(), idempotencyKey: key };
}

/** Makes the given rows due now (instead of waiting out the back-off). */
async function makeDue(ids: string[]): Promise<void> {
  await dbm.db().update(outboundMail).set({ nextAttemptAt: sql`CURRENT_TIMESTAMP(3) - INTERVAL 1 SECOND` }).where(inArray(outboundMail.id, ids));
}

async function rowOf(id: string) {
  const [row] = await dbm.db().select().from(outboundMail).where(eq(outboundMail.id, id));
  return row;
}

beforeAll(async () => {
  if (!process.env.KW_TEST_MAIL_URL) {
    fake = await startMailFake({ port: 0, dataDir: await mkdtemp(path.join(tmpdir(), "kw-outbox-mail-")), apiKey: process.env.RESEND_API_KEY ?? "re_test123" });
    process.env.KW_TEST_MAIL_URL = fake.url;
    process.env.RESEND_BASE_URL = fake.url;
  }
  om = await import("@/server/outbound-mail");
  dbm = await import("@/server/db");
  mail = await import("@/server/mail");
  files = await import("@/server/storage");
  owner = await newCompany("Outbox Solar");
});

afterAll(async () => {
  await refuseNext(0);
  await fake?.close();
});

describe("the mail outbox", () => {
  it("writes the message in the change's transaction; the worker sends it with its company and clears the body", async () => {
    const to = uniqueEmail("committed");
    const id = await dbm.db().transaction(async (tx) => {
      await tx.update(company).set({ name: "Outbox Solar" }).where(eq(company.id, owner.companyId));
      return om.queueMail(tx, queued(to, `committed-${to}`));
    });
    expect((await rowOf(id)).status).toBe("pending");
    expect(await sentTo(to)).toHaveLength(0);

    expect(await om.deliverQueuedMail({ ids: [id] })).toEqual({ sent: 1, retry: 0, failed: 0 });
    const [message] = await sentTo(to);
    expect(message.subject).toBe(`Outbox test committed-${to}`);
    expect(message.tags).toContainEqual({ name: "company_id", value: owner.companyId });
    const row = await rowOf(id);
    expect(row).toMatchObject({ status: "sent", html: null, text: null, attempts: 1, providerId: message.id });
    expect((await mail.listOutbox({ companyId: owner.companyId, to })).map((m) => m.id)).toEqual([message.id]);
  });

  it("writes nothing when the transaction rolls back", async () => {
    const to = uniqueEmail("rolled-back");
    const key = `rolled-back-${to}`;
    await expect(
      dbm.db().transaction(async (tx) => {
        await om.queueMail(tx, queued(to, key));
        throw new Error("the change failed after queuing its mail");
      }),
    ).rejects.toThrow(/the change failed/);
    expect(await dbm.db().select().from(outboundMail).where(eq(outboundMail.idempotencyKey, key))).toEqual([]);
    await om.deliverQueuedMail();
    expect(await sentTo(to)).toHaveLength(0);
  });

  it("retries a refused send with back-off until the mail service accepts it, and sends it once", async () => {
    const to = uniqueEmail("refused");
    const id = await dbm.db().transaction((tx) => om.queueMail(tx, queued(to, `refused-${to}`)));
    await refuseNext(2);
    try {
      expect(await om.deliverQueuedMail({ ids: [id] })).toEqual({ sent: 0, retry: 1, failed: 0 });
      const first = await rowOf(id);
      expect(first).toMatchObject({ status: "pending", attempts: 1 });
      expect(first.lastError).toMatch(/refused this send on purpose/);
      // Not due again before its back-off (5 s after the first failure).
      expect(first.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() + 2_000);
      expect(await om.deliverQueuedMail({ ids: [id] })).toEqual({ sent: 0, retry: 0, failed: 0 });

      await makeDue([id]);
      expect(await om.deliverQueuedMail({ ids: [id] })).toEqual({ sent: 0, retry: 1, failed: 0 });
      const second = await rowOf(id);
      expect(second.attempts).toBe(2);
      // The wait doubles: about 10 s now.
      expect(second.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() + 7_000);

      await makeDue([id]);
      expect(await om.deliverQueuedMail({ ids: [id] })).toEqual({ sent: 1, retry: 0, failed: 0 });
    } finally {
      await refuseNext(0);
    }
    expect(await sentTo(to)).toHaveLength(1);
    expect((await rowOf(id)).status).toBe("sent");
    expect(om.retryDelayMs(1)).toBe(5_000);
    expect(om.retryDelayMs(30)).toBe(3_600_000);
  });

  it("a send accepted just before a crash is not sent again on retry (the idempotency key)", async () => {
    const to = uniqueEmail("crash");
    const id = await dbm.db().transaction((tx) => om.queueMail(tx, queued(to, `crash-${to}`)));
    const row = await rowOf(id);
    // The service accepted it, then the process died before recording that.
    await mail.sendRendered({ companyId: row.companyId, to: row.toAddresses, subject: row.subject, html: row.html ?? "", text: row.text ?? "", idempotencyKey: row.idempotencyKey });
    expect(await om.deliverQueuedMail({ ids: [id] })).toEqual({ sent: 1, retry: 0, failed: 0 });
    expect(await sentTo(to)).toHaveLength(1);
  });

  it("two workers draining the same rows at once send each message exactly once", async () => {
    const to = uniqueEmail("two-workers");
    const ids = await dbm.db().transaction(async (tx) => {
      const out: string[] = [];
      for (let i = 0; i < 30; i++) out.push(await om.queueMail(tx, queued(to, `two-workers-${i}-${to}`)));
      return out;
    });
    const [a, b, c] = await Promise.all([om.deliverQueuedMail({ ids }), om.deliverQueuedMail({ ids }), om.deliverQueuedMail({ ids })]);
    expect(a.sent + b.sent + c.sent).toBe(30);
    const messages = await sentTo(to);
    expect(messages).toHaveLength(30);
    expect(new Set(messages.map((m) => m.subject)).size).toBe(30);
    const rows = await dbm.db().select({ status: outboundMail.status, attempts: outboundMail.attempts }).from(outboundMail).where(inArray(outboundMail.id, ids));
    expect(rows.every((r) => r.status === "sent" && r.attempts === 1)).toBe(true);
  });

  it("queuing the same key twice (a replayed event) keeps one message", async () => {
    const to = uniqueEmail("replay");
    const key = `replay-${to}`;
    const first = await dbm.db().transaction((tx) => om.queueMail(tx, queued(to, key)));
    const again = await dbm.db().transaction((tx) => om.queueMail(tx, queued(to, key)));
    expect(again).toBe(first);
    await om.deliverQueuedMail({ ids: [first] });
    expect(await sentTo(to)).toHaveLength(1);
  });

  it("reads one message by id only within its company, without its body", async () => {
    const to = uniqueEmail("by-id");
    const id = await dbm.db().transaction((tx) => om.queueMail(tx, queued(to, `by-id-${to}`)));
    const got = await om.getOutboundMailOrThrow(owner.companyId, id);
    expect(got).toMatchObject({ id, to: [to], status: "pending" });
    expect(got).not.toHaveProperty("html");
    const other = await newCompany("Elsewhere Outbox Solar");
    await expect(om.getOutboundMailOrThrow(other.companyId, id)).rejects.toMatchObject({ status: 404 });
  });
});

describe("files written before a rolled-back transaction", () => {
  it("are removed again; a committed one stays", async () => {
    const bytes = new TextEncoder().encode("%PDF-1.7 test");
    const lost = `${owner.companyId}/signed/${crypto.randomUUID()}.pdf`;
    await expect(
      files.withFilesUndoneOnFailure((put) =>
        dbm.db().transaction(async (tx) => {
          await put(lost, bytes);
          await tx.update(company).set({ name: "Outbox Solar" }).where(eq(company.id, owner.companyId));
          throw new Error("rolled back after the file was written");
        }),
      ),
    ).rejects.toThrow(/rolled back/);
    expect(await files.storage().get(lost)).toBeNull();

    const kept = `${owner.companyId}/signed/${crypto.randomUUID()}.pdf`;
    await files.withFilesUndoneOnFailure((put) => dbm.db().transaction(async () => put(kept, bytes)));
    expect(await files.storage().get(kept)).toEqual(bytes);
    await files.storage().delete(kept);
  });
});
