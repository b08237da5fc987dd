import "server-only";
import { APIError } from "better-auth/api";
import { eq } from "drizzle-orm";
import type { z } from "zod";
import { user } from "@/db/schema";
import type { signUpSchema } from "@/lib/schemas/people";
import { auth } from "@/server/auth";
import { clientAddress } from "@/server/client-address";
import { db } from "@/server/db";
import { HttpError } from "@/server/errors";
import { takeTurn } from "@/server/limits";
import { sendingForNewCompany } from "@/server/mail-company";
import { createCompanyForOwner, deleteUnattachedUser } from "@/server/people";

/**
 * The only way to sign up (better-auth's own endpoint is disabled): the person and their company
 * together. An address that already has an account gets the same answer and about the same
 * work (better-auth hashes the password either way); its owner is told by e-mail instead.
 */
export async function signUp(input: z.output<typeof signUpSchema>, headers: Headers): Promise<{ email: string }> {
  await takeTurn("signUpAddress", clientAddress(headers), (wait) => `Too many sign-ups from this address. Try again in ${wait}.`);
  let userId: string;
  // The verification e-mail goes out during sign-up: it belongs to the company made just after.
  const companyId = crypto.randomUUID();
  try {
    const created = await sendingForNewCompany(companyId, () =>
      auth().api.signUpEmail({
        body: { name: input.name, email: input.email, password: input.password, callbackURL: "/today" },
        headers,
      }),
    );
    userId = created.user.id;
  } catch (err) {
    if (err instanceof APIError) throw new HttpError(err.statusCode, "sign_up_refused", err.message);
    throw err;
  }
  // For a known address better-auth answers with a made-up user that was never stored.
  const [stored] = await db().select({ id: user.id }).from(user).where(eq(user.id, userId)).limit(1);
  if (stored) {
    try {
      await createCompanyForOwner(userId, input.companyName, companyId);
    } catch (err) {
      await deleteUnattachedUser(userId);
      throw err;
    }
  }
  return { email: input.email };
}
