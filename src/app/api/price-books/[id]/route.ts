import { getPriceBookOrThrow } from "@/server/price-book";
import { readById } from "@/server/route";

export const GET = readById("pricebook:read", "Price book", (member, id) => getPriceBookOrThrow(member.companyId, id));
