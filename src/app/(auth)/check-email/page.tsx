import type { Metadata } from "next";
import { BackToSignIn } from "../auth-page";

export const metadata: Metadata = { title: "Check your e-mail" };

export default async function CheckEmailPage({ searchParams }: { searchParams: Promise<{ email?: string }> }) {
  const { email } = await searchParams;
  return (
    <>
      <h1 className="text-xl font-semibold">Check your e-mail</h1>
      <p className="mt-3 text-graphite-soft">
        We sent a confirmation link to <strong className="text-graphite">{email ?? "your address"}</strong>. Open it to
        finish setting up your company; it signs you in.
      </p>
      <BackToSignIn />
    </>
  );
}
