// The deposit's receipt and a refund notice reach a homeowner who reads Spanish in Spanish
// (issue #18 item 6): the proposal's language, money and dates as es-US writes them. Against a
// real MariaDB, the dev payments server and the dev outbox.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { payment } from "@/db/schema";
import type { Member } from "@/server/session";
import { newCompany } from "../support/fixtures";
import { deliver, eventFor, outboxTo, payload, payWithCard, signedProposal, startHarness, waitFor, type Harness } from "./support";

let h: Harness;
let owner: Member;
let payments: typeof import("@/server/payments");
let dbm: typeof import("@/server/db");

beforeAll(async () => {
  h = await startHarness(null);
  payments = await import("@/server/payments");
  dbm = await import("@/server/db");
  owner = await newCompany("Recibos Solar");
});

afterAll(async () => {
  await h?.stop();
});

describe("deposit mail in Spanish", () => {
  it("sends the receipt and the refund notice in the proposal's language", async () => {
    const p = await signedProposal(owner, { depositCents: 100_000, locale: "es" });
    const { paymentId } = await payments.startDepositCheckout(p.token);
    const [row] = await dbm.db().select().from(payment).where(eq(payment.id, paymentId));
    await payWithCard(h.fake, row.checkoutSessionId);
    expect((await deliver(payload(await eventFor(h.sdk, "checkout.session.completed", row.checkoutSessionId)))).status).toBe(200);

    const receipt = await waitFor("the receipt", async () => (await outboxTo(h.mailUrl, p.email)).find((m) => /^Depósito recibido/.test(m.subject)));
    expect(receipt.subject).toBe("Depósito recibido: $1,000.00 — Recibos Solar");
    expect(receipt.text).toContain("Hola, Wren Testfield: Recibos Solar recibió su depósito de");
    expect(receipt.text).toContain("Guarde este correo como recibo.");
    expect(receipt.text).not.toContain("Deposit received");

    await payments.refundPayment(owner, paymentId, { amountCents: 25_000, reason: "Sistema más pequeño" });
    const notice = await waitFor("the refund notice", async () => (await outboxTo(h.mailUrl, p.email)).find((m) => /^Reembolso/.test(m.subject)));
    expect(notice.subject).toBe("Reembolso de $250.00 — Recibos Solar");
    expect(notice.text).toContain("SE LE REEMBOLSÓ PARTE DE SU DEPÓSITO: $250.00"); // the plain-text part prints the heading in capitals
    expect(notice.text).toContain("Siguen pagados $750.00 del depósito.");
    expect(notice.text).toContain("Motivo: Sistema más pequeño");
  });
});
