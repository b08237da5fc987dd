"use client";
import { useState } from "react";
import { FormMessage, type Notice } from "@/components/ui/field";
import { authClient } from "@/lib/auth-client";
import { forgotPasswordSchema } from "@/lib/schemas/people";
import { AuthForm, useAuthForm } from "../auth-form";

const FIELDS = [{ name: "email", label: "E-mail", type: "email", autoComplete: "email" }] as const;

/** Through better-auth's own endpoint (its client), which takes the reset turns. */
export function ForgotPasswordForm() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [notice, setNotice] = useState<Notice | null>(null);
  const form = useAuthForm(forgotPasswordSchema);
  async function submit({ email }: { email: string }) {
    setNotice(null);
    const { error } = await authClient.requestPasswordReset({ email, redirectTo: "/reset-password" });
    if (error) return setNotice({ tone: "error", text: error.message ?? "The link could not be sent. Try again in a moment." });
    setSentTo(email);
  }
  if (sentTo) {
    return (
      <div className="mt-6">
        <FormMessage tone="success">If {sentTo} has a Kilowright account, a reset link is on its way. It works for one hour.</FormMessage>
      </div>
    );
  }
  return <AuthForm form={form} fields={FIELDS} submit={submit} notice={notice} submitLabel="Send the link" pendingLabel="Sending…" />;
}
