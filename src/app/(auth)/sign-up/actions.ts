"use server";
import { eq } from "drizzle-orm";
import { APIError } from "better-auth/api";
import { headers } from "next/headers";
import { user } from "@/db/schema";
import { signUpSchema } from "@/lib/schemas/people";
import { publicAction } from "@/server/action";
import { auth } from "@/server/auth";
import { db } from "@/server/db";
import { HttpError } from "@/server/errors";
import { sendingForNewCompany } from "@/server/mail-company";
import { createCompanyForOwner, deleteUnattachedUser } from "@/server/people";

export const signUpAction = publicAction(signUpSchema, async (input) => {
  const [taken] = await db().select({ id: user.id }).from(user).where(eq(user.email, input.email)).limit(1);
  if (taken) {
    throw new HttpError(409, "email_taken", "An account with this e-mail already exists.", {
      email: ["An account with this e-mail exists: sign in, or reset your password"],
    });
  }
  let userId: string;
  // The verification e-mail goes out during sign-up: it belongs to the company made just after.
  const companyId = crypto.randomUUID();
  try {
    const requestHeaders = await headers();
    const created = await sendingForNewCompany(companyId, () =>
      auth().api.signUpEmail({
        body: { name: input.name, email: input.email, password: input.password, callbackURL: "/today" },
        headers: requestHeaders,
      }),
    );
    userId = created.user.id;
  } catch (err) {
    if (err instanceof APIError) throw new HttpError(err.statusCode, "sign_up_refused", err.message);
    throw err;
  }
  try {
    await createCompanyForOwner(userId, input.companyName, companyId);
  } catch (err) {
    await deleteUnattachedUser(userId);
    throw err;
  }
  return { email: input.email };
});
