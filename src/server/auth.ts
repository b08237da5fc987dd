import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { APIError, createAuthMiddleware } from "better-auth/api";
import { nextCookies } from "better-auth/next-js";
import { and, eq } from "drizzle-orm";
import { createElement } from "react";
import { account, membership, session, user, verification } from "@/db/schema";
import { env } from "@/env";
import { db } from "@/server/db";
import { sendEmail } from "@/server/mail";
import { mailCompanyOfUser } from "@/server/mail-company";
import { forgetCookie } from "@/server/session-reuse";
import { clearSignInFailures, recordSignInFailure, signInBlocked } from "@/server/sign-in-limit";
import { ResetPasswordEmail } from "@emails/reset-password";
import { VerifyEmail } from "@emails/verify-email";

export const PASSWORD_MIN_LENGTH = 10;
const RESET_TOKEN_MINUTES = 60;
const SESSION_DAYS = 14;

async function isDeactivated(userId: string): Promise<boolean> {
  const [row] = await db()
    .select({ status: membership.status })
    .from(membership)
    .where(eq(membership.userId, userId))
    .limit(1);
  return row?.status === "deactivated";
}

function emailOf(body: unknown): string | null {
  if (typeof body !== "object" || body === null || !("email" in body)) return null;
  const email = (body as { email: unknown }).email;
  return typeof email === "string" ? email.trim().toLowerCase() : null;
}

function createAuth() {
  const config = env();
  return betterAuth({
    appName: "Kilowright",
    baseURL: config.APP_URL,
    secret: config.BETTER_AUTH_SECRET,
    database: drizzleAdapter(db(), { provider: "mysql", schema: { user, session, account, verification } }),
    telemetry: { enabled: false },
    // better-auth's own limiter keeps its counters per IP; sign-in is limited per account by
    // sign-in-limit.ts in the database instead, so every app node shares the same count.
    rateLimit: { enabled: false },
    advanced: { database: { generateId: () => crypto.randomUUID() } },
    session: { expiresIn: SESSION_DAYS * 24 * 3600, updateAge: 24 * 3600 },
    emailAndPassword: {
      enabled: true,
      requireEmailVerification: true,
      minPasswordLength: PASSWORD_MIN_LENGTH,
      maxPasswordLength: 128,
      resetPasswordTokenExpiresIn: RESET_TOKEN_MINUTES * 60,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user: u, url }) => {
        const companyId = await mailCompanyOfUser(u.id);
        // Every message belongs to a company; an account without one has nothing to sign in to.
        if (!companyId) return console.error("password reset not sent: the account belongs to no company", u.id);
        await sendEmail({
          companyId,
          to: u.email,
          subject: "Reset your Kilowright password",
          react: createElement(ResetPasswordEmail, { name: u.name, resetUrl: url, expiresInMinutes: RESET_TOKEN_MINUTES }),
        });
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      sendVerificationEmail: async ({ user: u, url }) => {
        const companyId = await mailCompanyOfUser(u.id);
        if (!companyId) return console.error("verification e-mail not sent: the account belongs to no company", u.id);
        await sendEmail({
          companyId,
          to: u.email,
          subject: "Confirm your e-mail for Kilowright",
          react: createElement(VerifyEmail, { name: u.name, verifyUrl: url }),
        });
      },
    },
    databaseHooks: {
      session: {
        create: {
          // A deactivated person gets no new session by any path (sign-in, verification link).
          before: async (s) => ((await isDeactivated(s.userId)) ? false : undefined),
        },
      },
    },
    hooks: {
      before: createAuthMiddleware(async (ctx) => {
        if (ctx.path !== "/sign-in/email") return;
        const email = emailOf(ctx.body);
        if (!email) return;
        if (await signInBlocked(email)) {
          throw new APIError("TOO_MANY_REQUESTS", {
            message: "Too many wrong passwords for this e-mail. Wait 15 minutes, or reset your password.",
            code: "TOO_MANY_ATTEMPTS",
          });
        }
        const [found] = await db()
          .select({ status: membership.status })
          .from(user)
          .innerJoin(membership, eq(membership.userId, user.id))
          .where(and(eq(user.email, email), eq(membership.status, "deactivated")))
          .limit(1);
        if (found) {
          throw new APIError("FORBIDDEN", {
            message: "This account has been deactivated. Ask your company's admin to reactivate it.",
            code: "ACCOUNT_DEACTIVATED",
          });
        }
      }),
      after: createAuthMiddleware(async (ctx) => {
        if (ctx.path === "/sign-out") forgetCookie(ctx.headers?.get("cookie"));
        if (ctx.path !== "/sign-in/email") return;
        const email = emailOf(ctx.body);
        if (!email) return;
        const returned = ctx.context.returned;
        if (returned instanceof APIError) {
          if (returned.statusCode === 401) await recordSignInFailure(email);
        } else {
          await clearSignInFailures(email);
        }
      }),
    },
    plugins: [nextCookies()],
  });
}

export type Auth = ReturnType<typeof createAuth>;

const globalForAuth = globalThis as unknown as { kilowrightAuth?: Auth };

/** The better-auth instance, built on first use (so `next build` needs no configuration). */
export function auth(): Auth {
  globalForAuth.kilowrightAuth ??= createAuth();
  return globalForAuth.kilowrightAuth;
}
