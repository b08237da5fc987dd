"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Field, FormMessage } from "@/components/ui/field";
import { authClient } from "@/lib/auth-client";
import { forgotPasswordSchema } from "@/lib/schemas/people";

export function ForgotPasswordForm() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof forgotPasswordSchema>>({ resolver: zodResolver(forgotPasswordSchema) });

  const onSubmit = handleSubmit(async ({ email }) => {
    setError(null);
    const { error: failure } = await authClient.requestPasswordReset({ email, redirectTo: "/reset-password" });
    if (failure) {
      setError(failure.message ?? "The link could not be sent. Try again in a moment.");
      return;
    }
    setSentTo(email);
  });

  if (sentTo) {
    return (
      <div className="mt-6">
        <FormMessage tone="success">
          If {sentTo} has a Kilowright account, a reset link is on its way. It works for one hour.
        </FormMessage>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <Field id="email" label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...register("email")} />
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? "Sending…" : "Send the link"}
      </button>
    </form>
  );
}
