"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { authClient } from "@/lib/auth-client";
import { signInSchema, type SignInInput } from "@/lib/schemas/people";

function messageFor(status: number, code: string | undefined, message: string | undefined): string {
  if (status === 401) return "Wrong e-mail or password. Check both and try again.";
  if (status === 429) return message ?? "Too many attempts. Wait a few minutes and try again.";
  if (code === "EMAIL_NOT_VERIFIED") return "Confirm your e-mail address first: we have sent you a new link.";
  if (status === 403 && message) return message;
  if (status >= 500 || status === 0) return "Kilowright cannot sign you in right now. Try again in a moment.";
  return message ?? "Sign-in failed.";
}

export function SignInForm({ notice }: { notice?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const { error: failure } = await authClient.signIn.email({ email: values.email, password: values.password });
    if (failure) {
      setError(messageFor(failure.status, failure.code, failure.message));
      return;
    }
    router.replace("/today");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {notice && !error ? <FormMessage tone="success">{notice}</FormMessage> : null}
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <Field id="email" label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...register("email")} />
      <Field
        id="password"
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register("password")}
      />
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
