import { getOutboundMailOrThrow } from "@/server/outbound-mail";
import { readById } from "@/server/route";

/** One queued or sent e-mail of the member's company: who, what and its delivery state, never its body. */
export const GET = readById("company:manage", "E-mail", (member, id) => getOutboundMailOrThrow(member.companyId, id));
