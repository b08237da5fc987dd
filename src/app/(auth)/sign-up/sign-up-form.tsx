"use client";
import { useRouter } from "next/navigation";
import { useSave } from "@/components/ui/use-save";
import { signUpSchema, type SignUpInput } from "@/lib/schemas/people";
import { AuthForm, NEW_PASSWORD, useAuthForm } from "../auth-form";

const FIELDS = [
  { name: "companyName", label: "Company name", autoComplete: "organization" },
  { name: "name", label: "Your name", autoComplete: "name" },
  { name: "email", label: "Work e-mail", type: "email", autoComplete: "email" },
  NEW_PASSWORD,
] as const;

export function SignUpForm() {
  const router = useRouter();
  const form = useAuthForm(signUpSchema);
  const save = useSave<SignUpInput, { email: string }, SignUpInput>({
    request: (json) => ({ url: "/api/public/sign-up", method: "POST", json }),
    setError: form.setError,
    refresh: false,
    onSaved: ({ email }) => router.push(`/check-email?email=${encodeURIComponent(email)}`),
  });
  return <AuthForm form={form} fields={FIELDS} submit={save.saveAndWait} notice={save.notice} submitLabel="Create company" pendingLabel="Creating…" />;
}
