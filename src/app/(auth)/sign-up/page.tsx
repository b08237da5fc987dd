import type { Metadata } from "next";
import { AuthLink } from "../auth-page";
import { SignUpForm } from "./sign-up-form";

export const metadata: Metadata = { title: "Create your company" };

export default function SignUpPage() {
  return (
    <>
      <h1 className="text-xl font-semibold">Create your company on Kilowright</h1>
      <p className="mt-1 text-sm text-graphite-soft">You become its owner and can invite your office, reps and crews.</p>
      <SignUpForm />
      <p className="mt-6 text-sm">
        Already have an account?{" "}
        <AuthLink href="/sign-in">Sign in</AuthLink>
      </p>
    </>
  );
}
