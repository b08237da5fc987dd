"use client";
// The one shape of the sign-in, sign-up, invitation and password forms: a column of labelled
// fields checked by the form's zod schema, the status message on top, one wide submit button.
import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, type DefaultValues, type FieldValues, type Path, type UseFormReturn } from "react-hook-form";
import type { z } from "zod";
import { Field, StatusMessage, type Notice } from "@/components/ui/field";
import { PASSWORD_MIN } from "@/lib/schemas/people";

export type AuthField = { name: string; label: string; type?: "email" | "password"; autoComplete: string; hint?: string };

/** A new password and the same again (sign-up uses the first only). */
export const NEW_PASSWORD: AuthField = { name: "password", label: "Password", type: "password", autoComplete: "new-password", hint: `At least ${PASSWORD_MIN} characters.` };
export const CONFIRM_PASSWORD: AuthField = { name: "confirm", label: "The same again", type: "password", autoComplete: "new-password" };

/** react-hook-form over the schema the server checks too. */
export function useAuthForm<S extends z.ZodType<FieldValues, FieldValues>>(schema: S, defaultValues?: DefaultValues<z.input<S>>) {
  return useForm<z.input<S>, unknown, z.output<S>>({ resolver: zodResolver(schema), defaultValues });
}

export function AuthForm<T extends FieldValues, O extends FieldValues>(props: {
  form: UseFormReturn<T, unknown, O>;
  fields: readonly AuthField[];
  /** Resolves when the outcome is known (shown through `notice`, or by leaving the page). */
  submit: (values: O) => Promise<unknown>;
  notice: Notice | null;
  submitLabel: string;
  pendingLabel: string;
}) {
  const { register, handleSubmit, formState } = props.form;
  const errors = formState.errors as Record<string, { message?: string } | undefined>;
  return (
    <form onSubmit={handleSubmit(props.submit)} noValidate className="mt-6 space-y-4">
      <StatusMessage notice={props.notice} />
      {props.fields.map((f) => (
        <Field key={f.name} id={f.name} label={f.label} type={f.type} autoComplete={f.autoComplete} hint={f.hint} error={errors[f.name]?.message} {...register(f.name as Path<T>)} />
      ))}
      <button type="submit" className="btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? props.pendingLabel : props.submitLabel}
      </button>
    </form>
  );
}
