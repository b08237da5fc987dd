import type { Metadata } from "next";
import { BackToSignIn } from "../auth-page";
import { ForgotPasswordForm } from "./forgot-password-form";

export const metadata: Metadata = { title: "Reset your password" };

export default function ForgotPasswordPage() {
  return (
    <>
      <h1 className="text-xl font-semibold">Reset your password</h1>
      <p className="mt-1 text-sm text-graphite-soft">We will e-mail you a link to choose a new one.</p>
      <ForgotPasswordForm />
      <BackToSignIn />
    </>
  );
}
