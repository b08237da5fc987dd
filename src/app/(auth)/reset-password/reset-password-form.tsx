"use client";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { Notice } from "@/components/ui/field";
import { authClient } from "@/lib/auth-client";
import { resetPasswordSchema } from "@/lib/schemas/people";
import { AuthForm, CONFIRM_PASSWORD, NEW_PASSWORD, useAuthForm } from "../auth-form";

const FIELDS = [{ ...NEW_PASSWORD, label: "New password" }, CONFIRM_PASSWORD];

/** Through better-auth's own endpoint (its client), like sign-in and the reset link. */
export function ResetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const [notice, setNotice] = useState<Notice | null>(null);
  const form = useAuthForm(resetPasswordSchema);
  async function submit({ password }: { password: string }) {
    setNotice(null);
    const { error } = await authClient.resetPassword({ newPassword: password, token });
    if (!error) return router.push("/sign-in?notice=password-reset");
    setNotice({ tone: "error", text: error.code === "INVALID_TOKEN" ? "This link has expired or was used. Ask for a new one." : (error.message ?? "The password was not changed.") });
  }
  return <AuthForm form={form} fields={FIELDS} submit={submit} notice={notice} submitLabel="Save the new password" pendingLabel="Saving…" />;
}
