import "server-only";
// The homeowner's language for one proposal (issue #18 item 6): the household's when sent, then
// what the homeowner picks on their page. It decides the page and every later e-mail (code,
// signed copy, receipt, refund); the PDF keeps the language it was sent in.
import { and, eq } from "drizzle-orm";
import { z } from "zod";
import { proposal } from "@/db/schema";
import { LOCALES, type Locale } from "@/lib/i18n/locales";
import { db } from "@/server/db";
import { validationError } from "@/server/route";
import type { ProposalRow } from "./rows";

const proposalLocaleSchema = z.object({ locale: z.enum(LOCALES, { message: "Choose English or Español" }) });

/** Stores the homeowner's choice; any state of the link may switch (the page shows in every state). */
export async function setProposalLocale(p: ProposalRow, input: unknown): Promise<{ locale: Locale }> {
  const parsed = proposalLocaleSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  const { locale } = parsed.data;
  if (locale !== p.locale) await db().update(proposal).set({ locale }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
  return { locale };
}
