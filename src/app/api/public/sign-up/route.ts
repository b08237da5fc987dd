import { NextResponse } from "next/server";
import { signUpSchema } from "@/lib/schemas/people";
import { publicRoute, readJson } from "@/server/route";
import { signUp } from "@/server/sign-up";

/**
 * The one way to sign up: { companyName, name, email, password } makes the company and its
 * owner (src/server/sign-up.ts: limited per address, a known address answered like a new one).
 */
export const POST = publicRoute(async ({ req }) => {
  const input = await readJson(req, signUpSchema);
  return NextResponse.json({ data: await signUp(input, req.headers) }, { status: 201 });
});
