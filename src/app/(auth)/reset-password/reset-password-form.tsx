"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Field, FormMessage } from "@/components/ui/field";
import { authClient } from "@/lib/auth-client";
import { PASSWORD_MIN, resetPasswordSchema } from "@/lib/schemas/people";

export function ResetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof resetPasswordSchema>>({ resolver: zodResolver(resetPasswordSchema) });

  const onSubmit = handleSubmit(async ({ password }) => {
    setError(null);
    const { error: failure } = await authClient.resetPassword({ newPassword: password, token });
    if (failure) {
      setError(failure.code === "INVALID_TOKEN" ? "This link has expired or was used. Ask for a new one." : (failure.message ?? "The password was not changed."));
      return;
    }
    router.push("/sign-in?notice=password-reset");
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <Field
        id="password"
        label="New password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        error={errors.password?.message}
        {...register("password")}
      />
      <Field id="confirm" label="The same again" type="password" autoComplete="new-password" error={errors.confirm?.message} {...register("confirm")} />
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? "Saving…" : "Save the new password"}
      </button>
    </form>
  );
}
