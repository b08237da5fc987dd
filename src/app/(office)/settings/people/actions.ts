"use server";
import { revalidatePath } from "next/cache";
import { z } from "zod";
import { inviteSchema, updatePersonSchema } from "@/lib/schemas/people";
import { memberAction } from "@/server/action";
import { invitePerson, revokeInvitation, updatePerson } from "@/server/people";

export const invitePersonAction = memberAction("people:manage", inviteSchema, async (input, member) => {
  const result = await invitePerson(member, input);
  revalidatePath("/settings/people");
  return result;
});

export const updatePersonAction = memberAction(
  "people:manage",
  z.object({ membershipId: z.uuid(), change: updatePersonSchema }),
  async ({ membershipId, change }, member) => {
    const person = await updatePerson(member, membershipId, change);
    revalidatePath("/settings/people");
    return { id: person.id, role: person.role, status: person.status };
  },
);

export const revokeInvitationAction = memberAction("people:manage", z.object({ invitationId: z.uuid() }), async ({ invitationId }, member) => {
  await revokeInvitation(member, invitationId);
  revalidatePath("/settings/people");
  return { id: invitationId };
});
