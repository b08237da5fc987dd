"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field, FormMessage } from "@/components/ui/field";
import { applyFieldErrors } from "@/lib/form-errors";
import { acceptInvitationSchema, PASSWORD_MIN, type AcceptInvitationInput } from "@/lib/schemas/people";
import { acceptInvitationAction } from "./actions";

export function AcceptInvitationForm({ token, defaultName }: { token: string; defaultName: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError: setFieldError,
    formState: { errors, isSubmitting },
  } = useForm<AcceptInvitationInput>({
    resolver: zodResolver(acceptInvitationSchema),
    defaultValues: { token, name: defaultName, password: "", confirm: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setError(null);
    const result = await acceptInvitationAction(values);
    if (!result.ok) {
      if (!applyFieldErrors(result.fieldErrors, setFieldError)) setError(result.message);
      return;
    }
    router.replace("/today");
    router.refresh();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {error ? <FormMessage tone="error">{error}</FormMessage> : null}
      <input type="hidden" {...register("token")} />
      <Field id="name" label="Your name" autoComplete="name" error={errors.name?.message} {...register("name")} />
      <Field
        id="password"
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_MIN} characters.`}
        error={errors.password?.message}
        {...register("password")}
      />
      <Field id="confirm" label="The same again" type="password" autoComplete="new-password" error={errors.confirm?.message} {...register("confirm")} />
      <button type="submit" className="btn-primary w-full" disabled={isSubmitting}>
        {isSubmitting ? "Joining…" : "Join and sign in"}
      </button>
    </form>
  );
}
