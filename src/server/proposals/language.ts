import "server-only";
// The homeowner's language for one proposal (issue #18 item 6): the household's when sent, then
// what the homeowner picks on their page. It decides the page and every later e-mail (code,
// signed copy, receipt, refund); the PDF keeps the language it was sent in.
import { and, eq } from "drizzle-orm";
import { z } from "zod";
import { proposal } from "@/db/schema";
import { LOCALES, type Locale } from "@/lib/i18n/locales";
import { translator } from "@/lib/i18n/translator";
import type { ClientMeta } from "@/server/client-address";
import { db } from "@/server/db";
import { takeTurn, TooManyRequests } from "@/server/limits";
import { validationError } from "@/server/route";
import type { ProposalRow } from "./rows";

const proposalLocaleSchema = z.object({ locale: z.enum(LOCALES, { message: "Choose English or Español" }) });

/** A turn of the switch per link and per address (limits.ts), refused in the homeowner's language with the wait. */
async function takeSwitchTurn(p: ProposalRow, client: ClientMeta): Promise<void> {
  try {
    await takeTurn("languageLink", p.id);
    await takeTurn("languageAddress", client.ip);
  } catch (err) {
    if (!(err instanceof TooManyRequests)) throw err;
    const minutes = Math.ceil(err.retryAfterSeconds / 60);
    throw new TooManyRequests(err.code, translator(p.locale, "refusals")("tooManyLanguage", { minutes }), err.retryAfterSeconds);
  }
}

/** Stores the homeowner's choice; any state of the link may switch (the page shows in every state). */
export async function setProposalLocale(p: ProposalRow, input: unknown, client: ClientMeta): Promise<{ locale: Locale }> {
  const parsed = proposalLocaleSchema.safeParse(input);
  if (!parsed.success) throw validationError(parsed.error);
  // Counted before the write, as every limit is.
  await takeSwitchTurn(p, client);
  const { locale } = parsed.data;
  if (locale !== p.locale) await db().update(proposal).set({ locale }).where(and(eq(proposal.id, p.id), eq(proposal.companyId, p.companyId)));
  return { locale };
}
