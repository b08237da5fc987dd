import type { Metadata } from "next";
import Link from "next/link";
import { FormMessage } from "@/components/ui/field";
import { ResetPasswordForm } from "./reset-password-form";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string; error?: string }> }) {
  const { token, error } = await searchParams;
  if (!token || error) {
    return (
      <>
        <h1 className="text-xl font-semibold">This link no longer works</h1>
        <div className="mt-4">
          <FormMessage tone="error">Reset links work once and for one hour. Ask for a new one.</FormMessage>
        </div>
        <Link href="/forgot-password" className="btn-quiet mt-6">
          Send a new link
        </Link>
      </>
    );
  }
  return (
    <>
      <h1 className="text-xl font-semibold">Choose a new password</h1>
      <ResetPasswordForm token={token} />
    </>
  );
}
