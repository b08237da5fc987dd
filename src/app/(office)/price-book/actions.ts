"use server";
import { revalidatePath } from "next/cache";
import { priceBookSchema } from "@/lib/schemas/price-book";
import { memberAction } from "@/server/action";
import { savePriceBook } from "@/server/price-book";

export const savePriceBookAction = memberAction("pricebook:manage", priceBookSchema, async (doc, member) => {
  const saved = await savePriceBook(member, doc);
  revalidatePath("/price-book");
  return { updatedAt: saved.updatedAt.toISOString(), updatedByName: saved.updatedByName };
});
