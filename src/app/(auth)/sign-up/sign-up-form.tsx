"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import { PASSWORD_MIN, signUpSchema, type SignUpInput } from "@/lib/schemas/people";
import { signUpAction } from "./actions";

export function SignUpForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<SignUpInput>({ resolver: zodResolver(signUpSchema) });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const result = await signUpAction(values);
    if (!result.ok) {
      if (!applyFieldErrors(result.fieldErrors, setFieldError)) setError(result.message);
      return;
    }
    router.push(`/check-email?email=${encodeURIComponent(result.data.email)}`);
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <Field id="companyName" label="Company name" autoComplete="organization" error={errors.companyName?.message} {...register("companyName")} />
      <Field id="name" label="Your name" autoComplete="name" error={errors.name?.message} {...register("name")} />
      <Field id="email" label="Work e-mail" type="email" autoComplete="email" error={errors.email?.message} {...register("email")} />
      <Field
        id="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        error={errors.password?.message}
        {...register("password")}
      />
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? "Creating…" : "Create company"}
      </button>
    </form>
  );
}
