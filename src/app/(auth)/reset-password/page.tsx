import type { Metadata } from "next";
import { ClosedLink } from "../auth-page";
import { ResetPasswordForm } from "./reset-password-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string; error?: string }> }) {
  const { token, error } = await searchParams;
  if (!token || error) {
    return <ClosedLink title="This link no longer works" message="Reset links work once and for one hour. Ask for a new one." href="/forgot-password" action="Send a new link" />;
  }
  return (
    <>
      <h1 className="text-xl font-semibold">Choose a new password</h1>
      <ResetPasswordForm token={token} />
    </>
  );
}
