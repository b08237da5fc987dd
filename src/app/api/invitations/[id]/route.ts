import { NextResponse } from "next/server";
import { notFound } from "@/server/errors";
import { getInvitationOrThrow, revokeInvitation } from "@/server/people";
import { idSchema, withMember } from "@/server/route";

type Params = { id: string };

export const GET = withMember<Params>("people:read", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Invitation");
  return NextResponse.json({ data: await getInvitationOrThrow(member.companyId, params.id) });
});

/** Withdraws an open invitation; its link stops working. */
export const DELETE = withMember<Params>("people:manage", async ({ member, params }) => {
  if (!idSchema.safeParse(params.id).success) throw notFound("Invitation");
  await revokeInvitation(member, params.id);
  return new NextResponse(null, { status: 204 });
});
