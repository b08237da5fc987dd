import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { getMember } from "@/server/session";
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
        <Link href="/forgot-password" className="text-copper underline-offset-2 hover:underline">
          Forgot your password?
        </Link>
        <Link href="/sign-up" className="text-copper underline-offset-2 hover:underline">
          New company? Create an account
        </Link>
      </div>
    </>
  );
}
