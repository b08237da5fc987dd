"use server";
import { headers } from "next/headers";
import { acceptInvitationSchema } from "@/lib/schemas/people";
import { publicAction } from "@/server/action";
import { auth } from "@/server/auth";
import { acceptInvitation } from "@/server/people";

export const acceptInvitationAction = publicAction(acceptInvitationSchema, async (input) => {
  const { email } = await acceptInvitation(input);
  // Signs the new member in (nextCookies() sets the session cookie on this response).
  await auth().api.signInEmail({ body: { email, password: input.password }, headers: await headers() });
  return { email };
});
