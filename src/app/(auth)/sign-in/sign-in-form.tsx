"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { Notice } from "@/components/ui/field";
import { authClient } from "@/lib/auth-client";
import { signInSchema, type SignInInput } from "@/lib/schemas/people";
import { AuthForm, useAuthForm } from "../auth-form";

const FIELDS = [
  { name: "email", label: "E-mail", type: "email", autoComplete: "email" },
  { name: "password", label: "Password", type: "password", autoComplete: "current-password" },
] as const;

function messageFor(status: number, code: string | undefined, message: string | undefined): string {
  if (status === 401) return "Wrong e-mail or password. Check both and try again.";
  if (status === 429) return message ?? "Too many attempts. Wait a few minutes and try again.";
  if (code === "EMAIL_NOT_VERIFIED") return "Confirm your e-mail address first: we have sent you a new link.";
  if (status === 403 && message) return message;
  if (status >= 500 || status === 0) return "Kilowright cannot sign you in right now. Try again in a moment.";
  return message ?? "Sign-in failed.";
}

/** Through better-auth's own endpoint (its client): it sets the session cookie and takes the sign-in turns. */
export function SignInForm({ notice: shownFirst }: { notice?: string }) {
  const router = useRouter();
  const [notice, setNotice] = useState<Notice | null>(shownFirst ? { tone: "success", text: shownFirst } : null);
  const form = useAuthForm(signInSchema);
  async function submit({ email, password }: SignInInput) {
    const { error } = await authClient.signIn.email({ email, password });
    if (error) return setNotice({ tone: "error", text: messageFor(error.status, error.code, error.message) });
    router.replace("/today");
    router.refresh();
  }
  return <AuthForm form={form} fields={FIELDS} submit={submit} notice={notice} submitLabel="Sign in" pendingLabel="Signing in…" />;
}
