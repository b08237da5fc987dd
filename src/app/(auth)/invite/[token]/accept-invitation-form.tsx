"use client";
import { useRouter } from "next/navigation";
import { useSave } from "@/components/ui/use-save";
import { acceptInvitationSchema, type AcceptInvitationInput } from "@/lib/schemas/people";
import { AuthForm, CONFIRM_PASSWORD, NEW_PASSWORD, useAuthForm } from "../../auth-form";

const FIELDS = [{ name: "name", label: "Your name", autoComplete: "name" }, NEW_PASSWORD, CONFIRM_PASSWORD] as const;

export function AcceptInvitationForm({ token, defaultName }: { token: string; defaultName: string }) {
  const router = useRouter();
  // The token travels with the values (the schema checks it), not as a field.
  const form = useAuthForm(acceptInvitationSchema, { token, name: defaultName, password: "", confirm: "" });
  const save = useSave<AcceptInvitationInput, { email: string }, AcceptInvitationInput>({
    request: (json) => ({ url: "/api/public/invitations/accept", method: "POST", json }),
    setError: form.setError,
    refresh: false,
    onSaved: () => {
      router.replace("/today");
      router.refresh();
    },
  });
  return <AuthForm form={form} fields={FIELDS} submit={save.saveAndWait} notice={save.notice} submitLabel="Join and sign in" pendingLabel="Joining…" />;
}
