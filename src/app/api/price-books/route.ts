import { NextResponse } from "next/server";
import { priceBookSchema } from "@/lib/schemas/price-book";
import { getPriceBook, getPriceBookRecord, savePriceBook } from "@/server/price-book";
import { readJson, withMember } from "@/server/route";

/** The caller's company price book (the empty book, with id null, before the first save). */
export const GET = withMember("pricebook:read", async ({ member }) => {
  const record = await getPriceBookRecord(member.companyId);
  if (record) return NextResponse.json({ data: record });
  return NextResponse.json({ data: { id: null, document: await getPriceBook(member.companyId), updatedAt: null, updatedByName: null } });
});

/** Replaces the company's price book with the posted document (422 names each bad field). */
export const POST = withMember("pricebook:manage", async ({ req, member }) => {
  const doc = await readJson(req, priceBookSchema);
  return NextResponse.json({ data: await savePriceBook(member, doc) });
});
