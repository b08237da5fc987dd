// Demo timeline: each invented deal starts with its "lead created" event.
import { timelineEvent } from "../../../src/db/schema";
import type { SeedContext } from "../seed-demo";

export const order = 1;

export async function seed(ctx: SeedContext): Promise<void> {
  const reps = ctx.people.filter((p) => p.role === "sales_rep");
  for (const [i, dealId] of ctx.dealIds.entries()) {
    const rep = reps[i % reps.length];
    await ctx.tx.insert(timelineEvent).values({
      id: `7a11a55e-0000-4000-8000-${String(900 + i).padStart(12, "0")}`,
      companyId: ctx.companyId,
      dealId,
      kind: "deal.created",
      summary: `Lead created by ${rep.name}`,
      actorUserId: rep.id,
      createdAt: new Date(Date.now() - (60 - i) * 86_400_000),
    });
  }
}
