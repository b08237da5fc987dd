import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { getMember } from "@/server/session";
import { AuthLink } from "../auth-page";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

const NOTICES: Record<string, string> = {
  "password-reset": "Your password was changed. Sign in with the new one.",
  "signed-out": "You are signed out.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ notice?: string }> }) {
  if (await getMember()) redirect("/today");
  const { notice } = await searchParams;
  return (
    <>
      <h1 className="text-xl font-semibold">Sign in</h1>
      <SignInForm notice={notice ? NOTICES[notice] : undefined} />
      <div className="mt-6 flex flex-wrap justify-between gap-2 text-sm">
        <AuthLink href="/forgot-password">Forgot your password?</AuthLink>
        <AuthLink href="/sign-up">New company? Create an account</AuthLink>
      </div>
    </>
  );
}
