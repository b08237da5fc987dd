import "server-only";
import { notFound } from "next/navigation";
import { can } from "@/lib/permissions";
import { openDeal, type DealScope } from "@/server/deal-scope";
import { HttpError } from "@/server/errors";
import { idSchema } from "@/server/route";
import { getMember } from "@/server/session";

/**
 * The deal scope of a deal-room page (the layout and every tab): the signed-in member's view
 * of the deal in the path, read once per render (openDeal is cached). A malformed id, a deal
 * of another company or another rep's deal is the 404 page; null when nobody is signed in
 * (the office layout sends them to sign in).
 */
export async function dealPageScope(params: Promise<{ id: string }>): Promise<DealScope | null> {
  const { id } = await params;
  const member = await getMember();
  if (!member) return null;
  if (!can(member.role, "deals:read-own") || !idSchema.safeParse(id).success) notFound();
  return openDeal(member, id).catch((err: unknown) => {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  });
}
