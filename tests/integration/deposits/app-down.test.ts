// The app is down while the dev payments server sends: nothing listens at the webhook URL, so
// every attempt fails; once the app is back the fake's next retry lands and books the payment
// exactly once, and a later redelivery changes nothing.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, expect, it } from "vitest";
import { payment } from "@/db/schema";
import type { Delivery } from "@/fakes/payments-server";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { freePort, ledgerOf, payWithCard, signedProposal, startHarness, startReceiver, waitFor, webhookEventCount, type Harness, type Receiver } from "./support";

let h: Harness;
let owner: Member;
let port: number;
let receiver: Receiver | null = null;

beforeAll(async () => {
  port = await freePort();
  h = await startHarness(`http://127.0.0.1:${port}/api/webhooks/stripe`);
  owner = await newCompany("Retry Test Solar");
});

afterAll(async () => {
  await receiver?.close();
  await h?.stop();
});

async function deliveries(): Promise<Delivery[]> {
  const res = await fetch(`${h.fake.url}/_dev/deliveries`);
  return ((await res.json()) as { data: Delivery[] }).data;
}

it("books the payment once when the app comes back and the provider retries", async () => {
  const payments = await import("@/server/payments");
  const { db } = await import("@/server/db");
  const p = await signedProposal(owner);
  const { paymentId } = await payments.startDepositCheckout(p.token);
  const [row] = await db().select().from(payment).where(eq(payment.id, paymentId));
  expect((await payWithCard(h.fake, row.checkoutSessionId)).status).toBe(200);

  // App down: the deliveries fail and stay pending for another attempt.
  const failing = await waitFor("failed attempts", async () => {
    const d = (await deliveries()).filter((x) => x.type === "checkout.session.completed");
    return d.length && d[0].attempts.length >= 2 ? d : null;
  });
  expect(failing[0].status).toBe("pending");
  expect((await ledgerOf(owner.companyId, p.dealId)).payments[0].status).toBe("open");

  // App back on the same address: the retries land.
  receiver = await startReceiver(port);
  await waitFor(
    "every delivery answered 2xx",
    async () => {
      const all = await deliveries();
      return all.length > 0 && all.every((d) => d.status === "delivered") ? all : null;
    },
    20_000,
  );
  const l = await ledgerOf(owner.companyId, p.dealId);
  expect(l.payments).toHaveLength(1);
  expect(l.payments[0].status).toBe("paid");
  expect(l.stage).toBe("deposit_paid");
  expect(l.paidEvents).toBe(1);
  expect(l.jobs).toBe(1);
  const completed = (await deliveries()).find((d) => d.type === "checkout.session.completed") as Delivery;
  expect(await webhookEventCount(completed.eventId)).toBe(1);

  // The provider sends the same event once more: still one booking.
  const again = await fetch(`${h.fake.url}/_dev/events/${completed.eventId}/redeliver`, { method: "POST" });
  expect(again.status).toBe(200);
  await waitFor("the redelivery", async () => {
    const all = await deliveries();
    return all.filter((d) => d.eventId === completed.eventId).every((d) => d.status === "delivered") ? all : null;
  });
  const after = await ledgerOf(owner.companyId, p.dealId);
  expect(after.paidEvents).toBe(1);
  expect(after.stageMoves).toBe(1);
  expect(after.payments[0].paidAt?.getTime()).toBe(l.payments[0].paidAt?.getTime());
  expect(receiver.statuses.every((s) => s === 200)).toBe(true);
});
