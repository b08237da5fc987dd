import "server-only";
import { betterAuth, type BetterAuthOptions } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { APIError, createAuthMiddleware } from "better-auth/api";
import { textProblem } from "@/lib/schemas/text";
import { nextCookies } from "better-auth/next-js";
import { eq } from "drizzle-orm";
import { render } from "@react-email/render";
import { createElement } from "react";
import { account, membership, session, user, verification } from "@/db/schema";
import { env } from "@/env";
import { CLIENT_HEADER, clientAddress } from "@/server/client-address";
import { db, transaction } from "@/server/db";
import { clearTurns, emailKey, giveBack, isMarked, mark, takeTurn, TooManyRequests, tryTurn } from "@/server/limits";
import { sendEmail } from "@/server/mail";
import { mailCompanyOfUser } from "@/server/mail-company";
import { forgetCookie } from "@/server/session-reuse";
import { AccountExistsEmail } from "@emails/account-exists";
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

/** A refused turn as better-auth answers it: 429, the wait in the message and in Retry-After. */
function tooMany(err: unknown): never {
  if (err instanceof TooManyRequests) {
    throw new APIError("TOO_MANY_REQUESTS", { message: err.message, code: "TOO_MANY_ATTEMPTS" }, { "Retry-After": String(err.retryAfterSeconds) });
  }
  throw err;
}

const signInMessage = (wait: string) => `Too many wrong passwords for this e-mail. Wait ${wait}, or reset your password.`;

/**
 * Turns taken before better-auth checks a password, in this order: the address (so one
 * stranger's guesses use up their own address first), the e-mail from that address (at most 5
 * passwords checked), then the e-mail from every address (short; a password reset lifts it).
 * An address this e-mail signed in from in the last 30 days skips the e-mail-wide turn, so
 * strangers elsewhere never lock the owner out where they usually sign in.
 */
async function takeSignInTurns(address: string, email: string): Promise<void> {
  const pair = `${emailKey(email)}|${address}`;
  await takeTurn("signInAddress", address, (wait) => `Too many sign-in attempts from this address. Wait ${wait}.`);
  await takeTurn("signInPair", pair, signInMessage);
  if (!(await isMarked("knownAddress", pair))) await takeTurn("signInEmail", emailKey(email), signInMessage);
}

/** The right password was given: the e-mail's counts are forgotten, the address is known and gets its turn back. */
async function rightPassword(address: string, email: string): Promise<void> {
  const pair = `${emailKey(email)}|${address}`;
  await Promise.all([clearTurns("signInPair", pair), clearTurns("signInEmail", emailKey(email)), giveBack("signInAddress", address), mark("knownAddress", pair)]);
}

const resetEmail = (name: string, url: string) => createElement(ResetPasswordEmail, { name, resetUrl: url, expiresInMinutes: RESET_TOKEN_MINUTES });

/**
 * A reset asked for an address without an account does the work a real one does before its
 * answer (the e-mail is rendered, then dropped), so the answer takes about as long (measured in
 * tests/integration/auth/no-discovery.test.ts).
 */
async function resetWorkForNobody(email: string): Promise<void> {
  const [found] = await db().select({ id: user.id }).from(user).where(eq(user.email, email)).limit(1);
  if (found) return;
  const message = resetEmail("there", `${env().APP_URL}/reset-password/${"x".repeat(24)}?callbackURL=`);
  await Promise.all([render(message), render(message, { plainText: true })]);
  // A real reset commits a token row; this commits one that is gone again in the same transaction.
  await transaction(async (tx) => {
    const id = crypto.randomUUID();
    await tx.insert(verification).values({ id, identifier: `reset-password:none-${id}`, value: "none", expiresAt: new Date() });
    await tx.delete(verification).where(eq(verification.id, id));
  });
}

const addressOf = (headers: Headers | undefined) => clientAddress(headers ?? new Headers());

/** E-mail and password: the mails better-auth asks us to send (each names its company), and the reset's lock lift. */
function emailAndPasswordOptions(appUrl: string): NonNullable<BetterAuthOptions["emailAndPassword"]> {
  return {
    enabled: true,
    requireEmailVerification: true,
    minPasswordLength: PASSWORD_MIN_LENGTH,
    maxPasswordLength: 128,
    resetPasswordTokenExpiresIn: RESET_TOKEN_MINUTES * 60,
    revokeSessionsOnPasswordReset: true,
    // The reset link proves the mailbox: the e-mail's sign-in lock is lifted.
    onPasswordReset: async ({ user: u }) => {
      await clearTurns("signInEmail", emailKey(u.email));
    },
    // Sign-up with a known address answers as a new one would; the owner gets this instead.
    onExistingUserSignUp: async ({ user: u }) => {
      const companyId = await mailCompanyOfUser(u.id);
      if (!companyId) return console.error("account-exists e-mail not sent: the account belongs to no company", u.id);
      await sendEmail({
        companyId,
        to: u.email,
        subject: "You already have a Kilowright account",
        react: createElement(AccountExistsEmail, { name: u.name, signInUrl: `${appUrl}/sign-in`, resetUrl: `${appUrl}/forgot-password` }),
      });
    },
    sendResetPassword: async ({ user: u, url }) => {
      const companyId = await mailCompanyOfUser(u.id);
      // Every message belongs to a company; an account without one has nothing to sign in to.
      if (!companyId) return console.error("password reset not sent: the account belongs to no company", u.id);
      await sendEmail({
        companyId,
        to: u.email,
        subject: "Reset your Kilowright password",
        react: resetEmail(u.name, url),
      });
    },
  };
}

/** Our limits before better-auth's endpoints run, and what a sign-in or sign-out changes after. */
const authHooks = {
  before: createAuthMiddleware(async (ctx) => {
    const email = emailOf(ctx.body);
    const address = addressOf(ctx.headers);
    if (ctx.path === "/sign-in/email" && email) await takeSignInTurns(address, email).catch(tooMany);
    if (ctx.path === "/request-password-reset" && email) {
      await takeTurn("resetAddress", address).catch(tooMany);
      await takeTurn("resetEmail", emailKey(email), (wait) => `A reset link for this address was asked for several times. Check your e-mail, or try again in ${wait}.`).catch(tooMany);
      await resetWorkForNobody(email);
    }
    if (ctx.path === "/send-verification-email" && email) {
      await takeTurn("verificationEmail", emailKey(email), (wait) => `Several confirmation e-mails went to this address already. Check your e-mail, or ask again in ${wait}.`).catch(tooMany);
    }
  }),
  after: createAuthMiddleware(async (ctx) => {
    if (ctx.path === "/sign-out") forgetCookie(ctx.headers?.get("cookie"));
    if (ctx.path !== "/sign-in/email") return;
    const email = emailOf(ctx.body);
    if (!email) return;
    const returned = ctx.context.returned;
    // Signed in, or refused only after the password check (403: not yet confirmed, deactivated).
    const right = returned instanceof APIError ? returned.statusCode === 403 : !(returned instanceof Error);
    if (right) await rightPassword(addressOf(ctx.headers), email);
  }),
};

function createAuth() {
  const config = env();
  return betterAuth({
    appName: "Kilowright",
    baseURL: config.APP_URL,
    secret: config.BETTER_AUTH_SECRET,
    database: drizzleAdapter(db(), { provider: "mysql", schema: { user, session, account, verification } }),
    telemetry: { enabled: false },
    // better-auth's own limiter counts after reading a non-atomic row; limits.ts (one limiter,
    // atomic, in MariaDB) guards its endpoints in the hooks below instead.
    rateLimit: { enabled: false },
    // Sign-up goes through our own action, which makes the company and its owner together;
    // the bare endpoint would leave a person without a company.
    disabledPaths: ["/sign-up/email"],
    advanced: {
      database: { generateId: () => crypto.randomUUID() },
      // Session records keep the address the app server took from the connection.
      ipAddress: { ipAddressHeaders: [CLIENT_HEADER] },
      // E-mails are sent after the answer, so an address with an account answers as fast as
      // one without (reset, sign-up); a failed send is logged.
      backgroundTasks: {
        handler: (p) => {
          void p.catch((err: unknown) => console.error("background e-mail failed", err));
        },
      },
    },
    session: { expiresIn: SESSION_DAYS * 24 * 3600, updateAge: 24 * 3600 },
    emailAndPassword: emailAndPasswordOptions(config.APP_URL),
    emailVerification: {
      sendOnSignUp: true,
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      sendVerificationEmail: async ({ user: u, url }, request) => {
        // The resend endpoint took its turn (with a 429) in the hook; sign-in and sign-up skip quietly.
        const counted = request?.url.endsWith("/send-verification-email") ?? false;
        if (!counted && !(await tryTurn("verificationEmail", emailKey(u.email)))) return;
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
      user: userNameHooks,
      session: {
        create: {
          // A deactivated person gets no new session by any path (sign-in, verification link).
          // This runs only after the right password, so the state is never told to a guesser.
          before: async (s) => {
            if (await isDeactivated(s.userId)) {
              throw new APIError("FORBIDDEN", {
                message: "This account has been deactivated. Ask your company's admin to reactivate it.",
                code: "ACCOUNT_DEACTIVATED",
              });
            }
          },
        },
      },
    },
    hooks: authHooks,
    plugins: [nextCookies()],
  });
}

/**
 * A name that reaches better-auth's own endpoints (sign-up, update-user) obeys the rule our
 * forms apply (plainText: no control, unpaired-surrogate or bidi-override characters).
 */
function refuseHiddenName(name: unknown): void {
  const problem = typeof name === "string" ? textProblem(name) : null;
  if (problem) throw new APIError("BAD_REQUEST", { message: `The name ${problem}.`, code: "INVALID_NAME" });
}
const userNameHooks = {
  create: { before: async (u: { name?: unknown }) => void refuseHiddenName(u.name) },
  update: { before: async (u: { name?: unknown }) => void refuseHiddenName(u.name) },
};

export type Auth = ReturnType<typeof createAuth>;

const globalForAuth = globalThis as unknown as { kilowrightAuth?: Auth };

/** The better-auth instance, built on first use (so `next build` needs no configuration). */
export function auth(): Auth {
  globalForAuth.kilowrightAuth ??= createAuth();
  return globalForAuth.kilowrightAuth;
}
