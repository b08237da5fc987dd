// Demo rows of the mail outbox (outbound_mail): the signed copies of the demo's signed proposals,
// recorded as sent when they were signed. Their bodies are not kept (a sent message's body is
// cleared), exactly as the app leaves them.
import { and, eq, isNotNull } from "drizzle-orm";
import { outboundMail, proposal } from "../../../src/db/schema";
import { proposalLabel } from "../../../src/lib/proposal-snapshot";
import type { SeedContext } from "../seed-demo";

export const order = 80;

export async function seed(ctx: SeedContext): Promise<void> {
  const signed = await ctx.tx
    .select({ id: proposal.id, number: proposal.number, version: proposal.version, to: proposal.sentToEmail, signedAt: proposal.signedAt })
    .from(proposal)
    .where(and(eq(proposal.companyId, ctx.companyId), isNotNull(proposal.signedAt)))
    .limit(5);
  for (const p of signed) {
    await ctx.tx.insert(outboundMail).values({
      id: crypto.randomUUID(),
      companyId: ctx.companyId,
      kind: "signed-copy-customer",
      toAddresses: [p.to],
      subject: `Your signed agreement with Tallgrass Bright Energy (${proposalLabel(p.number, p.version)})`,
      idempotencyKey: `signed-copy-customer-${p.id}`,
      status: "sent",
      attempts: 1,
      nextAttemptAt: p.signedAt ?? new Date(),
      sentAt: p.signedAt,
      createdAt: p.signedAt ?? new Date(),
    });
  }
}
