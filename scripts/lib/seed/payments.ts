// Demo rows of the deposits ledger: a paid deposit for each demo deal at Deposit paid or later,
// taken from that deal's signed proposal (seeded by ./proposals.ts, order 60), and one partial
// refund. The provider ids are made up and look it (cs_test_demo…, pi_demo…): the demo's dev
// payments server has never seen them, so the reconciliation page lists them apart.
import { and, desc, eq, inArray } from "drizzle-orm";
import { deal, payment, paymentAlert, proposal, refund, timelineEvent, webhookEvent, type Stage } from "../../../src/db/schema";
import type { ProposalSnapshot } from "../../../src/lib/schemas/proposal";
import type { SeedContext } from "../seed-demo";

export const order = 70;

const uid = (n: number) => `7a11a55e-0000-4000-8000-${String(n).padStart(12, "0")}`;
const PAID_STAGES: Stage[] = ["deposit_paid", "survey", "permitting", "install_booked", "installed", "inspected", "live"];
const HOUR_MS = 3_600_000;
/** The deal whose deposit was partly refunded (the inspected one: a permit fee the city waived). */
const REFUNDED_STAGE: Stage = "inspected";
const REFUND_CENTS = 15_000;

function depositOf(raw: unknown, chosenPosition: number | null): number | null {
  const snapshot = (typeof raw === "string" ? JSON.parse(raw) : raw) as ProposalSnapshot;
  const offers = Array.isArray(snapshot?.offers) ? snapshot.offers : [];
  const offer = offers.find((o) => o.position === chosenPosition) ?? offers[0];
  const cents = offer?.depositCents;
  return typeof cents === "number" && Number.isInteger(cents) && cents > 0 ? cents : null;
}

const money = (cents: number) => `$${(cents / 100).toLocaleString("en-US", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;

export async function seed(ctx: SeedContext): Promise<void> {
  await seedUnknownRefund(ctx);
  const deals = await ctx.tx
    .select({ id: deal.id, stage: deal.stage, stageChangedAt: deal.stageChangedAt })
    .from(deal)
    .where(and(eq(deal.companyId, ctx.companyId), inArray(deal.id, ctx.dealIds), inArray(deal.stage, PAID_STAGES)));
  if (deals.length === 0) return;
  const signed = await ctx.tx
    .select()
    .from(proposal)
    .where(and(eq(proposal.companyId, ctx.companyId), inArray(proposal.dealId, deals.map((d) => d.id)), eq(proposal.status, "signed")))
    .orderBy(desc(proposal.version));
  if (signed.length === 0) {
    console.warn("seed payments: no signed demo proposals (the proposals seed has not run), so no demo deposits were written");
    return;
  }

  const office = ctx.people.find((p) => p.role === "office_manager");
  let n = 0;
  // In the order of the demo households, so the ids stay the same from run to run.
  for (const dealId of ctx.dealIds) {
    const d = deals.find((x) => x.id === dealId);
    const p = signed.find((x) => x.dealId === dealId);
    if (!d || !p) continue;
    const amountCents = depositOf(p.snapshot, p.chosenPosition);
    if (!amountCents) continue;
    n += 1;
    const id = uid(700 + n);
    const tag = String(n).padStart(4, "0");
    const paidAt = new Date((p.signedAt ?? d.stageChangedAt).getTime() + 2 * HOUR_MS);
    const refunded = d.stage === REFUNDED_STAGE ? Math.min(REFUND_CENTS, amountCents) : 0;
    await ctx.tx.insert(payment).values({
      id,
      companyId: ctx.companyId,
      dealId,
      proposalId: p.id,
      checkoutSessionId: `cs_test_demo_${tag}`,
      paymentIntentId: `pi_demo_${tag}`,
      chargeId: `ch_demo_${tag}`,
      amountCents,
      currency: "usd",
      paidCents: amountCents,
      refundedCents: refunded,
      status: refunded > 0 ? "partially_refunded" : "paid",
      paidAt,
      createdAt: new Date(paidAt.getTime() - 10 * 60_000),
    });
    await ctx.tx.insert(timelineEvent).values({
      id: uid(740 + n),
      companyId: ctx.companyId,
      dealId,
      kind: "deposit.paid",
      summary: `Deposit of ${money(amountCents)} paid by card (pi_demo_${tag})`,
      actorUserId: null,
      data: { paymentId: id },
      createdAt: paidAt,
    });
    if (refunded > 0) {
      const reason = "The city waived the permit fee; that part of the deposit is returned";
      const at = new Date(paidAt.getTime() + 5 * 24 * HOUR_MS);
      await ctx.tx.insert(refund).values({
        id: uid(780 + n),
        companyId: ctx.companyId,
        paymentId: id,
        dealId,
        stripeRefundId: `re_demo_${tag}`,
        amountCents: refunded,
        status: "succeeded",
        reason,
        requestedByUserId: office?.id ?? null,
        createdAt: at,
      });
      await ctx.tx.insert(timelineEvent).values({
        id: uid(790 + n),
        companyId: ctx.companyId,
        dealId,
        kind: "deposit.refunded",
        summary: `${office?.name ?? "The office"} refunded ${money(refunded)} of the deposit: ${reason}`,
        actorUserId: office?.id ?? null,
        data: { paymentId: id, stripeRefundId: `re_demo_${tag}` },
        createdAt: at,
      });
    }
  }
}

/** A refund the provider reported for a payment the ledger does not know (Money → Reconciliation lists it). */
async function seedUnknownRefund(ctx: SeedContext): Promise<void> {
  const eventId = `evt_demo_unknown_refund_${ctx.companyId.slice(-4)}`;
  const detail = "The provider reports a refund of $250.00 on charge ch_demo_unknown_1, a payment the ledger does not know.";
  await ctx.tx.insert(webhookEvent).values({ id: eventId, type: "charge.refunded", outcome: "flagged", note: detail.slice(21) });
  await ctx.tx.insert(paymentAlert).values({
    id: uid(850),
    companyId: ctx.companyId,
    kind: "unknown_refund",
    webhookEventId: eventId,
    chargeId: "ch_demo_unknown_1",
    paymentIntentId: null,
    amountCents: 25_000,
    detail,
  });
}
