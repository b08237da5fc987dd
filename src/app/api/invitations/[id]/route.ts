import { getInvitationOrThrow, revokeInvitation } from "@/server/people";
import { deleteById, readById } from "@/server/route";

export const GET = readById("people:read", "Invitation", (member, id) => getInvitationOrThrow(member.companyId, id));

/** Withdraws an open invitation; its link stops working. */
export const DELETE = deleteById("people:manage", "Invitation", async (member, id) => {
  await revokeInvitation(member, id);
});
