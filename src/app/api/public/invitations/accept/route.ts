import { NextResponse } from "next/server";
import { acceptInvitationSchema } from "@/lib/schemas/people";
import { auth } from "@/server/auth";
import { acceptInvitation } from "@/server/people";
import { publicRoute, readJson } from "@/server/route";

/**
 * Accepts an invitation ({ token, name, password, confirm }; the token is the key, so it
 * travels in the body, not the path): creates the member and signs them in.
 */
export const POST = publicRoute(async ({ req }) => {
  const input = await readJson(req, acceptInvitationSchema);
  const { email } = await acceptInvitation(input);
  // nextCookies() (src/server/auth.ts) puts the session cookie on this response.
  await auth().api.signInEmail({ body: { email, password: input.password }, headers: req.headers });
  return NextResponse.json({ data: { email } }, { status: 201 });
});
